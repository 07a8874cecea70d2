import { describe, expect, it } from 'vitest';
import { hannWindow, magnitudeSpectrum, spectrumFftSize, spectrumPeakHz, SPECTRUM_MAX_FFT_SIZE } from '../../../src/lib/synthesis/magnitude-spectrum';
import { twoDecayingSines } from './synthetic-result';

function sine(frequencyHz: number, sampleRateHz: number, count: number): Float32Array {
  return Float32Array.from({ length: count }, (_, i) => Math.sin((2 * Math.PI * frequencyHz * i) / sampleRateHz));
}

describe('magnitudeSpectrum (Hann window, fft.js real transform)', () => {
  it('finds a 220 Hz sine of 0.5 s at 48 kHz within one bin', () => {
    const spectrum = magnitudeSpectrum(sine(220, 48000, 24000), 48000);
    expect(spectrum.fftSize).toBe(32768);
    expect(spectrum.binHz).toBeCloseTo(48000 / 32768, 12);
    expect(spectrum.levelDb.length).toBe(32768 / 2 + 1);
    expect(Math.abs(spectrumPeakHz(spectrum) - 220)).toBeLessThanOrEqual(spectrum.binHz);
    expect(Math.max(...spectrum.levelDb)).toBe(0);
  });

  it('finds a sine between bins (1234.5 Hz at 44.1 kHz) within one bin, and its energy stays near the peak', () => {
    const spectrum = magnitudeSpectrum(sine(1234.5, 44100, 10000), 44100);
    expect(spectrum.fftSize).toBe(16384);
    expect(Math.abs(spectrumPeakHz(spectrum) - 1234.5)).toBeLessThanOrEqual(spectrum.binHz);
    // Hann sidelobes: 50 bins away the level is far below the peak.
    const peakBin = Math.round(1234.5 / spectrum.binHz);
    expect(spectrum.levelDb[peakBin + 50]).toBeLessThan(-60);
  });

  it('finds 220 Hz as the strongest component of the two decaying sines, and 440 Hz at its expected level', () => {
    const spectrum = magnitudeSpectrum(twoDecayingSines(), 48000);
    expect(Math.abs(spectrumPeakHz(spectrum, 20) - 220)).toBeLessThanOrEqual(spectrum.binHz);
    const near = (hz: number) => Math.max(...spectrum.levelDb.slice(Math.round(hz / spectrum.binHz) - 2, Math.round(hz / spectrum.binHz) + 3));
    // A well-separated windowed partial A·e^(−σt) peaks at |X| ≈ (A/2)·Σ w[i]·e^(−σ·i/fs), so the 440 Hz
    // one (A = ½, σ = 4/s) sits 20·log10(½·Σw·e^(−4t) / Σw·e^(−2t)) below the 220 Hz one (σ = 2/s).
    // Neither lies on a bin centre (150.2 and 300.4 bins), so Hann's scalloping loss (up to 1.42 dB
    // at half a bin) allows a few tenths of a dB either way.
    let sum220 = 0;
    let sum440 = 0;
    for (let i = 0; i < 24000; i++) {
      const w = 0.5 - 0.5 * Math.cos((2 * Math.PI * i) / 23999);
      sum220 += w * Math.exp((-2 * i) / 48000);
      sum440 += w * Math.exp((-4 * i) / 48000);
    }
    const expectedDb = 20 * Math.log10((0.5 * sum440) / sum220);
    expect(expectedDb).toBeCloseTo(-9.9, 1);
    expect(Math.abs(near(440) - expectedDb)).toBeLessThan(0.75);
  });

  it('uses the next power of two, capped at 2^16: a longer signal is analysed from its start', () => {
    expect(spectrumFftSize(24000)).toBe(32768);
    expect(spectrumFftSize(32768)).toBe(32768);
    expect(spectrumFftSize(32769)).toBe(65536);
    expect(spectrumFftSize(96000)).toBe(SPECTRUM_MAX_FFT_SIZE);
    expect(spectrumFftSize(3)).toBe(16);
    const long = magnitudeSpectrum(sine(330, 48000, 96000), 48000);
    expect(long.fftSize).toBe(65536);
    expect(long.analysedSampleCount).toBe(65536);
    expect(long.analysedDurationS).toBeCloseTo(65536 / 48000, 12);
    expect(Math.abs(spectrumPeakHz(long) - 330)).toBeLessThanOrEqual(long.binHz);
  });

  it('marks silence and empty signals instead of dividing by zero', () => {
    const silent = magnitudeSpectrum(new Float32Array(1000), 48000);
    expect(silent.silent).toBe(true);
    expect(silent.levelDb.every((level) => Number.isFinite(level))).toBe(true);
    expect(spectrumPeakHz(silent)).toBe(0);
    expect(magnitudeSpectrum(new Float32Array(0), 48000).silent).toBe(true);
  });
});

describe('hannWindow', () => {
  it('is ½ − ½·cos(2πi/(M − 1)): zero at both ends, one in the middle of an odd length', () => {
    const window = hannWindow(5);
    expect([...window].map((w) => Number(w.toFixed(12)))).toEqual([0, 0.5, 1, 0.5, 0]);
    expect(hannWindow(5)).toBe(window);
    expect([...hannWindow(1)]).toEqual([1]);
  });
});
