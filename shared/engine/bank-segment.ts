import type { FastOscillators, OscillatorBank, SlowOscillators } from './oscillator-bank';
import { newFastOscillators, newSlowOscillators } from './oscillator-storage';

/**
 * The oscillators of `bank` as they stand `startSample` samples into the render, for a segment of
 * `sampleCount` samples: rendering consecutive segments and joining them gives the whole render,
 * so a long render can run on several threads in time order, and report progress as it goes.
 * The bank given is left untouched.
 *
 * Exact to rounding: a ringing mode's state is G·r^k, and r^k = |r|^k·e^(ik·arg r) is evaluated
 * directly (one exp, one cos and one sin per mode) rather than by k multiplications; a damped
 * mode's 2×2 transition matrix is raised to the k-th power by repeated squaring. Oscillators that
 * finish before the segment starts are silent in it.
 */
export function bankSegment(bank: OscillatorBank, startSample: number, sampleCount: number): OscillatorBank {
  return { sampleCount, fast: fastSegment(bank.fast, startSample, sampleCount), slow: slowSegment(bank.slow, startSample, sampleCount) };
}

/** A segment reads the same pickups: the per-channel gains are copied as they are. */
function copyGains(from: FastOscillators | SlowOscillators, to: FastOscillators | SlowOscillators): void {
  if (from.gainA && from.gainB && to.gainA && to.gainB) {
    to.gainA.set(from.gainA);
    to.gainB.set(from.gainB);
  }
}

function fastSegment(bank: FastOscillators, start: number, sampleCount: number): FastOscillators {
  const { count } = bank;
  const out = newFastOscillators(count, bank.gainA !== undefined && bank.gainB !== undefined);
  out.stepRe.set(bank.stepRe);
  out.stepIm.set(bank.stepIm);
  copyGains(bank, out);
  for (let j = 0; j < count; j++) {
    const remaining = bank.activeSamples[j] - start;
    // Kept sorted (a constant shift, clamped at zero), as the renderer relies on.
    out.activeSamples[j] = Math.max(0, Math.min(sampleCount, remaining));
    if (remaining <= 0) continue;
    const re = bank.stepRe[j];
    const im = bank.stepIm[j];
    const magnitude = Math.hypot(re, im);
    if (magnitude === 0) continue;
    const scale = Math.exp(start * Math.log(magnitude));
    const angle = start * Math.atan2(im, re);
    const powRe = scale * Math.cos(angle);
    const powIm = scale * Math.sin(angle);
    out.stateRe[j] = bank.stateRe[j] * powRe - bank.stateIm[j] * powIm;
    out.stateIm[j] = bank.stateRe[j] * powIm + bank.stateIm[j] * powRe;
  }
  return out;
}

function slowSegment(bank: SlowOscillators, start: number, sampleCount: number): SlowOscillators {
  const { count } = bank;
  const out = newSlowOscillators(count, bank.gainA !== undefined && bank.gainB !== undefined);
  for (const key of ['m11', 'm12', 'm21', 'm22'] as const) out[key].set(bank[key]);
  copyGains(bank, out);
  for (let j = 0; j < count; j++) {
    const remaining = bank.activeSamples[j] - start;
    out.activeSamples[j] = Math.max(0, Math.min(sampleCount, remaining));
    if (remaining <= 0) continue;
    // M^start by repeated squaring, applied to (q, u).
    let a11 = bank.m11[j], a12 = bank.m12[j], a21 = bank.m21[j], a22 = bank.m22[j];
    let p11 = 1, p12 = 0, p21 = 0, p22 = 1;
    for (let k = start; k > 0; k = Math.floor(k / 2)) {
      if (k % 2 === 1) {
        const t11 = p11 * a11 + p12 * a21, t12 = p11 * a12 + p12 * a22;
        const t21 = p21 * a11 + p22 * a21, t22 = p21 * a12 + p22 * a22;
        p11 = t11; p12 = t12; p21 = t21; p22 = t22;
      }
      const s11 = a11 * a11 + a12 * a21, s12 = a11 * a12 + a12 * a22;
      const s21 = a21 * a11 + a22 * a21, s22 = a21 * a12 + a22 * a22;
      a11 = s11; a12 = s12; a21 = s21; a22 = s22;
    }
    out.q[j] = p11 * bank.q[j] + p12 * bank.u[j];
    out.u[j] = p21 * bank.q[j] + p22 * bank.u[j];
  }
  return out;
}
