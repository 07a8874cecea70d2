/** A bank of oscillators ready to render (built by `buildOscillatorBank`, which explains the method). */
export interface OscillatorBank {
  sampleCount: number;
  fast: FastOscillators;
  slow: SlowOscillators;
}

/** Ringing modes, sorted by `activeSamples` descending and padded with silent entries to a multiple of 4. */
export interface FastOscillators {
  count: number;
  stateRe: Float64Array;
  stateIm: Float64Array;
  stepRe: Float64Array;
  stepIm: Float64Array;
  activeSamples: Float64Array;
  /** A stereo bank: the state holds the mode itself, and each channel weighs it by its own pickup. */
  gainA?: Float64Array;
  gainB?: Float64Array;
}

/** Heavily damped modes: state (q, u = q'/ω) advanced by [[m11, m12], [m21, m22]] each sample. */
export interface SlowOscillators {
  count: number;
  q: Float64Array;
  u: Float64Array;
  m11: Float64Array;
  m12: Float64Array;
  m21: Float64Array;
  m22: Float64Array;
  activeSamples: Float64Array;
  gainA?: Float64Array;
  gainB?: Float64Array;
}

/**
 * Zeroed storage for `count` ringing oscillators (complex state, complex step, active length),
 * with a pair of per-channel gains when `stereo`. Building a bank, cutting a segment from one and
 * splitting one across threads all start from here.
 */
export function newFastOscillators(count: number, stereo: boolean): FastOscillators {
  return {
    count,
    stateRe: new Float64Array(count),
    stateIm: new Float64Array(count),
    stepRe: new Float64Array(count),
    stepIm: new Float64Array(count),
    activeSamples: new Float64Array(count),
    ...(stereo ? { gainA: new Float64Array(count), gainB: new Float64Array(count) } : {}),
  };
}

/** Zeroed storage for `count` damped oscillators: state (q, u), 2×2 step matrix, active length, and gains when `stereo`. */
export function newSlowOscillators(count: number, stereo: boolean): SlowOscillators {
  return {
    count,
    q: new Float64Array(count),
    u: new Float64Array(count),
    m11: new Float64Array(count),
    m12: new Float64Array(count),
    m21: new Float64Array(count),
    m22: new Float64Array(count),
    activeSamples: new Float64Array(count),
    ...(stereo ? { gainA: new Float64Array(count), gainB: new Float64Array(count) } : {}),
  };
}
