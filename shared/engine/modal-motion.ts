import type { Hertz, Metres, MetresPerSecond, PerSecond, Seconds } from '../units';

/** The per-mode data the string's motion is built from (a subset of the mode table). */
export interface ModalMotionInput {
  /** Undamped frequency f_n of mode n = index + 1. */
  frequencyHz: ArrayLike<Hertz>;
  /** Initial displacement amplitude a_n. */
  aM: ArrayLike<Metres>;
  /** Initial velocity amplitude v_n. */
  vMPerS: ArrayLike<MetresPerSecond>;
  /** Envelope rate σ_n of e^(−σ_n t). */
  decayRatePerS: ArrayLike<PerSecond>;
}

/**
 * Each mode's amplitude q_n(t), metres, for modes 1…count: the exact solution of
 * q'' + 2σq' + ω²q = 0 with q(0) = a_n, q'(0) = v_n (ω = 2πf_n), written for each regime:
 * - ringing (σ < ω): e^(−σt) [a cos ω_d t + (v + σa)/ω_d · sin ω_d t], ω_d = √(ω² − σ²);
 * - critical (σ = ω): e^(−σt) [a + (v + σa) t];
 * - overdamped (σ > ω): e^(−σt) [a cosh s t + (v + σa)/s · sinh s t], s = √(σ² − ω²).
 * Writes into `out` (length ≥ count) and returns it.
 */
export function modeAmplitudesAt(modes: ModalMotionInput, count: number, tS: Seconds, out: Float64Array = new Float64Array(count)): Float64Array {
  for (let m = 0; m < count; m++) {
    const omega = 2 * Math.PI * modes.frequencyHz[m];
    const sigma = modes.decayRatePerS[m];
    const a = modes.aM[m];
    const slope = modes.vMPerS[m] + sigma * a;
    const envelope = Math.exp(-sigma * tS);
    const gap = omega * omega - sigma * sigma;
    let q: number;
    if (gap > 0) {
      const omegaD = Math.sqrt(gap);
      q = a * Math.cos(omegaD * tS) + (slope / omegaD) * Math.sin(omegaD * tS);
    } else if (gap < 0) {
      const s = Math.sqrt(-gap);
      q = a * Math.cosh(s * tS) + (slope / s) * Math.sinh(s * tS);
    } else {
      q = a + slope * tS;
    }
    out[m] = envelope * q;
  }
  return out;
}

/**
 * The mode shapes sin(nπx/L) sampled at `xsM`, one row of `xsM.length` values per mode, so the
 * string's shape at any instant is one matrix–vector product (see `stringShapeM`).
 */
export function modeShapeTable(lengthM: Metres, count: number, xsM: ArrayLike<Metres>): Float64Array {
  const table = new Float64Array(count * xsM.length);
  for (let m = 0; m < count; m++) {
    const k = ((m + 1) * Math.PI) / lengthM;
    for (let j = 0; j < xsM.length; j++) table[m * xsM.length + j] = Math.sin(k * xsM[j]);
  }
  return table;
}

/**
 * The string's displacement y(x, t) = Σ_n q_n(t) sin(nπx/L) at the sample points of a
 * `modeShapeTable`, from the mode amplitudes of `modeAmplitudesAt`. Writes into `out`.
 */
export function stringShapeM(amplitudesM: ArrayLike<Metres>, shapes: Float64Array, pointCount: number, out: Float64Array = new Float64Array(pointCount)): Float64Array {
  out.fill(0, 0, pointCount);
  const count = Math.min(amplitudesM.length, shapes.length / pointCount);
  for (let m = 0; m < count; m++) {
    const q = amplitudesM[m];
    if (q === 0) continue;
    const row = m * pointCount;
    for (let j = 0; j < pointCount; j++) out[j] += q * shapes[row + j];
  }
  return out;
}
