import type { PickupOutput } from '../patch/patch-schema';
import type { Hertz, Metres } from '../units';
import type { StringProperties } from './mode-frequencies';
import type { ModeTable } from './mode-table';
import { pickupReadsVelocity, pickupWeight } from './pickup-weights';
import { newFastOscillators, newSlowOscillators, type FastOscillators, type OscillatorBank, type SlowOscillators } from './oscillator-storage';

// The storage (OscillatorBank, FastOscillators, SlowOscillators) is in oscillator-storage.ts, re-exported here.
export type { FastOscillators, OscillatorBank, SlowOscillators } from './oscillator-storage';

export const CUT_RATIO = 2 ** -60;

/** What a bank is built from besides the mode table: a patch, or a mode table received from the server. */
export interface BankSource {
  string: StringProperties;
  pickup: { output: PickupOutput; positionM: Metres };
  render: { sampleRateHz: Hertz };
}
export const FAST_GROUP = 4;

interface Prepared {
  sigma: number;
  omega: number;
  q0: number;
  p0: number;
  amplitude: number;
  /** Stereo: the two pickups' weights, and the larger of them (which sizes the mode). */
  gains?: { a: number; b: number; largest: number };
}

/** Samples until an envelope e^(−rate·t)·amplitude falls below `floor`, capped at sampleCount. */
function samplesUntilBelow(amplitude: number, floor: number, ratePerSample: number, sampleCount: number): number {
  if (!(ratePerSample > 0)) return sampleCount;
  const samples = Math.ceil(Math.log(amplitude / floor) / ratePerSample);
  return Math.max(1, Math.min(sampleCount, samples));
}

/**
 * Each kept mode as a ready-to-run oscillator for the renderer.
 *
 * A mode obeys q'' + 2σq' + ω²q = 0 with q(0) = q0, q'(0) = p0. Its exact solution, sampled every
 * Δt = 1/fs, advances by one constant linear map per sample, so a render needs no transcendental
 * function per sample:
 * - Ringing modes (ω_d = √(ω² − σ²) ≥ σ) are written q(t) = Re(G·e^(λt)), λ = −σ + iω_d,
 *   G = q0 − i(p0 + σq0)/ω_d; each sample multiplies the complex state by r = e^(λΔt) (the
 *   "fast" bank: one complex multiply per mode per sample).
 * - Heavily damped, critically damped and overdamped modes (σ > ω_d) use the exact 2×2 transition
 *   matrix of the state (q, q'/ω), which is well conditioned in every regime (the "slow" bank).
 *
 * The pickup's weight is folded into the initial state. A pickup that reads velocity renders q'
 * instead of q: q' obeys the same equation, with q'(0) = p0 and q''(0) = −2σp0 − ω²q0.
 *
 * Oscillators whose amplitude is below CUT_RATIO of the loudest one are left out, and each
 * oscillator stops once its envelope has fallen below that level (`activeSamples`): 2^−60 is
 * 361 dB down, far beneath the rounding of a double-precision sum, so the render stays exact
 * to rounding and never computes with subnormal numbers.
 *
 * Builds the oscillators of a patch's kept modes for a render of `sampleCount` samples.
 */
export function buildOscillatorBank(patch: BankSource, table: ModeTable, sampleCount: number, secondPickupM?: number): OscillatorBank {
  const { string, pickup, render } = patch;
  const stereo = secondPickupM !== undefined;
  const dt = 1 / render.sampleRateHz;
  const readsVelocity = pickupReadsVelocity(pickup.output);

  const prepared: Prepared[] = [];
  let loudest = 0;
  for (let m = 0; m < table.count; m++) {
    const weightA = pickupWeight(string, pickup.output, pickup.positionM, m + 1);
    const gains = stereo ? { a: weightA, b: pickupWeight(string, pickup.output, secondPickupM, m + 1), largest: 0 } : undefined;
    if (gains) gains.largest = Math.max(Math.abs(gains.a), Math.abs(gains.b));
    // Mono folds the pickup's weight into the state; stereo keeps the mode and weighs it per channel.
    const weight = gains ? 1 : weightA;
    const sigma = table.decayRatePerS[m];
    const omega = 2 * Math.PI * table.frequencyHz[m];
    const a = table.aM[m];
    const v = table.vMPerS[m];
    const q0 = weight * (readsVelocity ? v : a);
    const p0 = weight * (readsVelocity ? -2 * sigma * v - omega * omega * a : v);
    // |q(t)| ≤ |q0| + |p0|/ω·(a bounded factor): a cheap bound of the mode's size.
    const amplitude = (Math.abs(q0) + Math.abs(p0) / omega) * (gains ? gains.largest : 1);
    if (amplitude === 0) continue;
    loudest = Math.max(loudest, amplitude);
    prepared.push({ sigma, omega, q0, p0, amplitude, gains });
  }
  const floor = loudest * CUT_RATIO;
  const kept = prepared.filter((mode) => mode.amplitude >= floor);

  const ringing = kept.filter((mode) => mode.sigma * Math.SQRT2 <= mode.omega);
  const damped = kept.filter((mode) => mode.sigma * Math.SQRT2 > mode.omega);
  return { sampleCount, fast: buildFast(ringing, floor, dt, sampleCount), slow: buildSlow(damped, floor, dt, sampleCount) };
}

function buildFast(modes: Prepared[], floor: number, dt: number, sampleCount: number): FastOscillators {
  const rows = modes.map(({ sigma, omega, q0, p0, gains }) => {
    const omegaD = Math.sqrt((omega - sigma) * (omega + sigma));
    const re = q0;
    const im = -(p0 + sigma * q0) / omegaD;
    const decay = Math.exp(-sigma * dt);
    const size = Math.hypot(re, im) * (gains ? gains.largest : 1);
    return {
      re,
      im,
      gains,
      stepRe: decay * Math.cos(omegaD * dt),
      stepIm: decay * Math.sin(omegaD * dt),
      active: samplesUntilBelow(size, floor, sigma * dt, sampleCount),
    };
  });
  rows.sort((x, y) => y.active - x.active);
  const count = Math.ceil(rows.length / FAST_GROUP) * FAST_GROUP;
  const bank = newFastOscillators(count, modes.some((mode) => mode.gains));
  rows.forEach((row, j) => {
    if (row.gains && bank.gainA && bank.gainB) {
      bank.gainA[j] = row.gains.a;
      bank.gainB[j] = row.gains.b;
    }
    bank.stateRe[j] = row.re;
    bank.stateIm[j] = row.im;
    bank.stepRe[j] = row.stepRe;
    bank.stepIm[j] = row.stepIm;
    bank.activeSamples[j] = row.active;
  });
  return bank;
}

function buildSlow(modes: Prepared[], floor: number, dt: number, sampleCount: number): SlowOscillators {
  const count = modes.length;
  const bank = newSlowOscillators(count, modes.some((mode) => mode.gains));
  modes.forEach(({ sigma, omega, q0, p0, amplitude, gains }, j) => {
    if (gains && bank.gainA && bank.gainB) {
      bank.gainA[j] = gains.a;
      bank.gainB[j] = gains.b;
    }
    // One-sample transition of the exact solution:
    //   q(Δt) = e^(−σΔt)[(C + σS)·q + S·q'],  q'(Δt) = e^(−σΔt)[−ω²S·q + (C − σS)·q'],
    // with C = cos(ω_dΔt), S = sin(ω_dΔt)/ω_d when ringing, C = cosh(γΔt), S = sinh(γΔt)/γ,
    // γ = √(σ² − ω²), when overdamped, and C = 1, S = Δt at critical damping.
    const gap = (sigma - omega) * (sigma + omega);
    let c: number;
    let s: number;
    let slowestRate: number;
    if (gap < 0) {
      const omegaD = Math.sqrt(-gap);
      c = Math.cos(omegaD * dt);
      s = Math.sin(omegaD * dt) / omegaD;
      slowestRate = sigma;
    } else if (gap > 0) {
      const gamma = Math.sqrt(gap);
      c = Math.cosh(gamma * dt);
      s = Math.sinh(gamma * dt) / gamma;
      slowestRate = (omega * omega) / (sigma + gamma); // σ − γ without cancellation
    } else {
      c = 1;
      s = dt;
      slowestRate = sigma / 2; // t·e^(−σt) ≤ e^(−σt/2)·2/(eσ)
    }
    const decay = Math.exp(-sigma * dt);
    bank.q[j] = q0;
    bank.u[j] = p0 / omega;
    bank.m11[j] = decay * (c + sigma * s);
    bank.m12[j] = decay * omega * s;
    bank.m21[j] = -decay * omega * s;
    bank.m22[j] = decay * (c - sigma * s);
    // Overdamped coefficients can exceed the initial state by ~σ/γ; keep a wide margin.
    bank.activeSamples[j] = samplesUntilBelow(amplitude * 1e6, floor, slowestRate * dt, sampleCount);
  });
  return bank;
}
