import FFT from 'fft.js';
import type { Decibels, Hertz, Seconds } from '../../../shared/units';

/** The longest transform the spectrum runs: 2^16 points, about 1.4 s at 48 kHz. */
export const SPECTRUM_MAX_FFT_SIZE = 2 ** 16;
const SPECTRUM_MIN_FFT_SIZE = 16;
/** Bins more than this far below the loudest one are written as this level. */
export const SPECTRUM_FLOOR_DB: Decibels = -160;

export interface MagnitudeSpectrum {
  fftSize: number;
  /** Width of one bin, sampleRate / fftSize. */
  binHz: Hertz;
  /** Bins 0 … fftSize/2 (DC to Nyquist), in dB relative to the loudest bin (so its maximum is 0). */
  levelDb: Float32Array;
  /** How many samples went into the transform (the start of the signal when it is longer than the transform). */
  analysedSampleCount: number;
  analysedDurationS: Seconds;
  /** True when every analysed sample was zero: `levelDb` is then the floor everywhere. */
  silent: boolean;
}

/** One transform (with its twiddle table) per size, built the first time that size is needed. */
const transforms = new Map<number, FFT>();

function transformOfSize(size: number): FFT {
  let transform = transforms.get(size);
  if (!transform) {
    transform = new FFT(size);
    transforms.set(size, transform);
  }
  return transform;
}

/** The last Hann window built: results of one session keep the same preview length. */
let lastWindow: Float64Array = new Float64Array(0);

/** w[i] = ½ − ½·cos(2πi/(M − 1)), i = 0 … M − 1 (a single point gets weight 1). */
export function hannWindow(length: number): Float64Array {
  if (lastWindow.length === length) return lastWindow;
  const weights = new Float64Array(length);
  const span = length - 1;
  for (let i = 0; i < length; i++) weights[i] = span > 0 ? 0.5 - 0.5 * Math.cos((2 * Math.PI * i) / span) : 1;
  lastWindow = weights;
  return weights;
}

/** The smallest power of two ≥ n, between 16 and `SPECTRUM_MAX_FFT_SIZE`. */
export function spectrumFftSize(sampleCount: number): number {
  let size = SPECTRUM_MIN_FFT_SIZE;
  while (size < sampleCount && size < SPECTRUM_MAX_FFT_SIZE) size *= 2;
  return size;
}

/**
 * The magnitude spectrum of a signal: the first min(length, 2^16) samples under a Hann window
 * w[i] = ½ − ½·cos(2πi/(M − 1)), zero-padded to the next power of two and transformed once with
 * fft.js's real transform. |X_k| is given in dB relative to the largest |X_k|, floored at
 * `SPECTRUM_FLOOR_DB`.
 */
export function magnitudeSpectrum(samples: Float32Array, sampleRateHz: Hertz): MagnitudeSpectrum {
  const fftSize = spectrumFftSize(samples.length);
  const analysedSampleCount = Math.min(samples.length, fftSize);
  const weights = hannWindow(analysedSampleCount);
  const windowed = new Float64Array(fftSize);
  for (let i = 0; i < analysedSampleCount; i++) windowed[i] = samples[i] * weights[i];
  const complex = new Float64Array(2 * fftSize);
  transformOfSize(fftSize).realTransform(complex, windowed);

  const binCount = fftSize / 2 + 1;
  const power = new Float64Array(binCount);
  let maxPower = 0;
  for (let k = 0; k < binCount; k++) {
    const re = complex[2 * k];
    const im = complex[2 * k + 1];
    power[k] = re * re + im * im;
    if (power[k] > maxPower) maxPower = power[k];
  }
  const levelDb = new Float32Array(binCount);
  for (let k = 0; k < binCount; k++) {
    const db = maxPower > 0 && power[k] > 0 ? 10 * Math.log10(power[k] / maxPower) : -Infinity;
    levelDb[k] = db > SPECTRUM_FLOOR_DB ? db : SPECTRUM_FLOOR_DB;
  }
  return {
    fftSize,
    binHz: sampleRateHz / fftSize,
    levelDb,
    analysedSampleCount,
    analysedDurationS: analysedSampleCount / sampleRateHz,
    silent: maxPower === 0,
  };
}

/** The frequency of the loudest bin at or above `fromHz` (0 for a silent spectrum). */
export function spectrumPeakHz(spectrum: MagnitudeSpectrum, fromHz: Hertz = 0): Hertz {
  let loudest = Math.max(0, Math.ceil(fromHz / spectrum.binHz));
  for (let k = loudest; k < spectrum.levelDb.length; k++) if (spectrum.levelDb[k] > spectrum.levelDb[loudest]) loudest = k;
  return spectrum.silent ? 0 : loudest * spectrum.binHz;
}
