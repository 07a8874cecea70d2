import { assert } from '../assert';
import type { Decibels, Hertz, SampleRate } from '../units';

/**
 * One second-order section, y[n] = b0·x[n] + b1·x[n−1] + b2·x[n−2] − a1·y[n−1] − a2·y[n−2]
 * (a0 normalised to 1).
 */
export interface Biquad {
  b: readonly [number, number, number];
  a: readonly [1, number, number];
}

/** The two stages of the K-weighting filter, applied in this order. */
export interface KWeightingCoefficients {
  /** Stage 1 of ITU-R BS.1770-4 (its Table 1): the high-frequency shelf modelling the head. */
  shelf: Biquad;
  /** Stage 2 of ITU-R BS.1770-4 (its Table 2): the RLB high-pass. */
  highPass: Biquad;
}

/** Analog prototype of stage 1: pole frequency, high-frequency gain and pole Q (BS.1770-4 at 48 kHz, refitted to 16 digits). */
const SHELF_FREQUENCY_HZ: Hertz = 1681.974450955533;
const SHELF_GAIN_DB: Decibels = 3.999843853973347;
const SHELF_POLE_Q = 0.7071752369554196;
/**
 * Q of the shelf's zero pair. An exact RBJ shelf would have the pole Q here; the published
 * 48 kHz coefficients have slightly less damped zeros. Derived here from BS.1770-4 Table 1 alone:
 * Vb = (b0 − b2)(1 + K/Q + K²)·Q / (2K) at 48 kHz, Q_z = √Vh / (Vb/Q). With it every published
 * stage-1 coefficient is reproduced to about 1e-15.
 */
const SHELF_ZERO_Q = 0.7072837614509134;

/** Analog prototype of stage 2: corner frequency and Q (BS.1770-4 at 48 kHz, refitted to 16 digits). */
const HIGH_PASS_FREQUENCY_HZ: Hertz = 38.13547087602444;
const HIGH_PASS_Q = 0.5003270373238773;
/** The rate at which BS.1770-4 publishes its coefficients. */
const PUBLISHED_RATE_HZ: SampleRate = 48000;

/** K = tan(π·f0/fs): the frequency prewarping of the bilinear transform, so f0 maps exactly. */
function prewarp(frequencyHz: Hertz, sampleRateHz: SampleRate): number {
  return Math.tan((Math.PI * frequencyHz) / sampleRateHz);
}

/**
 * The K-weighting filter of ITU-R BS.1770-4 for any sample rate, derived from its analog prototypes
 * by the bilinear transform prewarped at each stage's f0, s → (1/K)·(1 − z⁻¹)/(1 + z⁻¹),
 * K = tan(π·f0/fs), with s normalised by 2π·f0.
 *
 * Stage 1, a high shelf written as in R. Bristow-Johnson's "Audio EQ Cookbook" with ω0 at the poles,
 * H(s) = (Vh·s² + (√Vh/Q_z)·s + 1) / (s² + s/Q + 1), Vh = 10^(G/20), G = +3.9998 dB, f0 = 1681.97 Hz,
 * Q = 0.70718, zero-pair Q_z = 0.70728: unity gain at DC, Vh at high frequencies.
 *
 * Stage 2, a high-pass H(s) = g·s² / (s² + s/Q + 1), f0 = 38.135 Hz, Q = 0.50033. BS.1770-4 gives its
 * 48 kHz numerator as [1, −2, 1], not divided by a0 = 1 + K/Q + K², so the published filter has a
 * passband gain of that a0 at 48 kHz (≈ 1.004995, +0.0433 dB). The −0.691 dB offset of the loudness
 * formula was set with that gain, so g = a0(48 kHz) at every rate: at 48 kHz b comes out as [1, −2, 1]
 * (to rounding), and every rate has the same response up to the warping of the bilinear transform.
 *
 * At 48 kHz the result equals BS.1770-4 Tables 1 and 2 within 1e-14.
 */
export function kWeightingCoefficients(sampleRateHz: SampleRate): KWeightingCoefficients {
  assert(Number.isFinite(sampleRateHz) && sampleRateHz > 0, `sample rate ${sampleRateHz} Hz must be positive`);
  assert(sampleRateHz > 2 * SHELF_FREQUENCY_HZ, `sample rate ${sampleRateHz} Hz is too low for K-weighting`);

  const k1 = prewarp(SHELF_FREQUENCY_HZ, sampleRateHz);
  const vh = 10 ** (SHELF_GAIN_DB / 20);
  const zeroTerm = (Math.sqrt(vh) / SHELF_ZERO_Q) * k1;
  const poleTerm = k1 / SHELF_POLE_Q;
  const a0Shelf = 1 + poleTerm + k1 * k1;
  const shelf: Biquad = {
    b: [(vh + zeroTerm + k1 * k1) / a0Shelf, (2 * (k1 * k1 - vh)) / a0Shelf, (vh - zeroTerm + k1 * k1) / a0Shelf],
    a: [1, (2 * (k1 * k1 - 1)) / a0Shelf, (1 - poleTerm + k1 * k1) / a0Shelf],
  };

  const k2 = prewarp(HIGH_PASS_FREQUENCY_HZ, sampleRateHz);
  const a0HighPass = 1 + k2 / HIGH_PASS_Q + k2 * k2;
  const k48 = prewarp(HIGH_PASS_FREQUENCY_HZ, PUBLISHED_RATE_HZ);
  const passbandGain = 1 + k48 / HIGH_PASS_Q + k48 * k48;
  const b0 = passbandGain / a0HighPass;
  const highPass: Biquad = {
    b: [b0, -2 * b0, b0],
    a: [1, (2 * (k2 * k2 - 1)) / a0HighPass, (1 - k2 / HIGH_PASS_Q + k2 * k2) / a0HighPass],
  };

  return { shelf, highPass };
}

/**
 * Applies the K-weighting filter (both stages of {@link kWeightingCoefficients}) to one channel,
 * in double precision, transposed direct form II, starting from rest. Returns a new array.
 */
export function kWeight(samples: Float32Array | Float64Array, sampleRateHz: SampleRate): Float64Array {
  const { shelf, highPass } = kWeightingCoefficients(sampleRateHz);
  const [sb0, sb1, sb2] = shelf.b;
  const [, sa1, sa2] = shelf.a;
  const [hb0, hb1, hb2] = highPass.b;
  const [, ha1, ha2] = highPass.a;
  const out = new Float64Array(samples.length);
  let s1 = 0;
  let s2 = 0;
  let h1 = 0;
  let h2 = 0;
  for (let i = 0; i < samples.length; i++) {
    const x = samples[i];
    const y = sb0 * x + s1;
    s1 = sb1 * x - sa1 * y + s2;
    s2 = sb2 * x - sa2 * y;
    const z = hb0 * y + h1;
    h1 = hb1 * y - ha1 * z + h2;
    h2 = hb2 * y - ha2 * z;
    out[i] = z;
  }
  return out;
}
