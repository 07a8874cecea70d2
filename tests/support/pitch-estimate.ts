import FFT from 'fft.js';

/** Samples over which the DTFT's rotation runs before it is re-seeded from Math.cos/Math.sin (bounds rounding drift). */
const RESEED_EVERY = 512;
/** The refinement stops when the bracket is this narrow relative to the frequency (about 2·10⁻⁶ cent). */
const RELATIVE_TOLERANCE = 1e-9;
const GOLDEN = (Math.sqrt(5) - 1) / 2;

/** |Σ y[i]·e^(−2πi·ν·i)|², the windowed signal's DTFT power at ν cycles per sample, summed directly. */
function dtftPower(windowed: Float64Array, cyclesPerSample: number): number {
  const theta = 2 * Math.PI * cyclesPerSample;
  const stepCos = Math.cos(theta);
  const stepSin = Math.sin(theta);
  let re = 0;
  let im = 0;
  for (let start = 0; start < windowed.length; start += RESEED_EVERY) {
    let c = Math.cos(theta * start);
    let s = Math.sin(theta * start);
    const end = Math.min(windowed.length, start + RESEED_EVERY);
    for (let i = start; i < end; i++) {
      re += windowed[i] * c;
      im -= windowed[i] * s;
      const nextC = c * stepCos - s * stepSin;
      s = c * stepSin + s * stepCos;
      c = nextC;
    }
  }
  return re * re + im * im;
}

/**
 * The frequency of the spectral peak nearest an expected one, for tests: an estimator that shares
 * nothing with the engine (it sees only samples).
 *
 * 1. The whole signal, under a Hann window w[i] = ½ − ½·cos(2πi/(N − 1)), is zero-padded to a power
 *    of two of at least 2N and transformed with fft.js; the loudest bin within ±searchCents of
 *    expectedHz must be a local maximum of the spectrum, and its refined frequency must stay in that
 *    band, or this throws (no peak there).
 * 2. The peak is then refined by a golden-section search for the maximum of the windowed signal's
 *    DTFT magnitude, evaluated directly at each trial frequency, over that bin ± one bin (inside
 *    the Hann main lobe, ±4 padded bins wide, so the magnitude is unimodal there), until the
 *    bracket is 10⁻⁹ of the frequency wide.
 *
 * Why this is exact for one partial: a partial A·e^(−σt)·cos(2πft + φ) gives, from its
 * positive-frequency half, a DTFT magnitude |G(ν − f)| with G the transform of g = w·e^(−σt) ≥ 0;
 * |G| is even (g is real) and largest at 0 (|∫g·e^(−iνt)| ≤ ∫g), so the peak sits exactly on f, the
 * damped frequency. What moves it is leakage from the negative-frequency image and from the other
 * partials, which falls off with the Hann window's sidelobes (as 1/Δ³ at Δ bins), so it is largest
 * for a low, fast-decaying partial. Measured on sines of 2–3 s at 48 kHz decaying at 0.5–6 /s
 * (tests/shared/renders/pitch-estimate.test.ts and a wider sweep when this was written): at most
 * 1.1·10⁻⁴ cent (41.2 Hz, 6 /s over 2 s), and 3·10⁻⁷ cent at 261.63 and 1046.5 Hz; on stiff
 * harmonic tones (12 partials, B = 3·10⁻⁴) at most 1.2·10⁻⁵ cent. The search itself stops at a
 * bracket of 10⁻⁹ of the frequency, about 2·10⁻⁶ cent. About 60 ms for 2 s of samples.
 */
export function estimateFrequencyHz(samples: ArrayLike<number>, sampleRateHz: number, expectedHz: number, searchCents = 50): number {
  const count = samples.length;
  if (count < 16) throw new Error(`estimateFrequencyHz needs at least 16 samples, got ${count}`);
  const windowed = new Float64Array(count);
  for (let i = 0; i < count; i++) windowed[i] = samples[i] * (0.5 - 0.5 * Math.cos((2 * Math.PI * i) / (count - 1)));

  let size = 16;
  while (size < 2 * count) size *= 2;
  const padded = new Float64Array(size);
  padded.set(windowed);
  const fft = new FFT(size);
  const spectrum = fft.createComplexArray() as number[];
  fft.realTransform(spectrum, padded);
  const binHz = sampleRateHz / size;
  const power = (bin: number) => spectrum[2 * bin] ** 2 + spectrum[2 * bin + 1] ** 2;

  const fromBin = Math.max(1, Math.floor((expectedHz * 2 ** (-searchCents / 1200)) / binHz));
  const toBin = Math.min(size / 2 - 1, Math.ceil((expectedHz * 2 ** (searchCents / 1200)) / binHz));
  let peak = fromBin;
  for (let bin = fromBin; bin <= toBin; bin++) if (power(bin) > power(peak)) peak = bin;
  if (!(power(peak) > 0 && power(peak) >= power(peak - 1) && power(peak) >= power(peak + 1))) {
    throw new Error(`no spectral peak within ±${searchCents} cents of ${expectedHz} Hz (the loudest bin there, ${(peak * binHz).toFixed(3)} Hz, is on a slope)`);
  }

  const trial = (hz: number) => dtftPower(windowed, hz / sampleRateHz);
  let low = (peak - 1) * binHz;
  let high = (peak + 1) * binHz;
  let left = high - GOLDEN * (high - low);
  let right = low + GOLDEN * (high - low);
  let leftPower = trial(left);
  let rightPower = trial(right);
  const toleranceHz = RELATIVE_TOLERANCE * expectedHz;
  while (high - low > toleranceHz) {
    if (leftPower > rightPower) {
      high = right;
      right = left;
      rightPower = leftPower;
      left = high - GOLDEN * (high - low);
      leftPower = trial(left);
    } else {
      low = left;
      left = right;
      leftPower = rightPower;
      right = low + GOLDEN * (high - low);
      rightPower = trial(right);
    }
  }
  const foundHz = (low + high) / 2;
  const offCents = Math.abs(1200 * Math.log2(foundHz / expectedHz));
  // A sidelobe of a partial outside the band can be a local maximum inside it; its refined peak then leaves the band.
  if (offCents > searchCents) throw new Error(`no spectral peak within ±${searchCents} cents of ${expectedHz} Hz (the nearest, ${foundHz} Hz, is outside)`);
  return foundHz;
}
