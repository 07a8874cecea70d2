import type { FastOscillators, SlowOscillators } from './oscillator-bank';

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
