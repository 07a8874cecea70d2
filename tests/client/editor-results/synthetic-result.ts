import type { FieldIssue } from '../../../shared/patch/field-issue';
import type { ComputeResult } from '../../../src/lib/live-session/session-connection';

export const F0_HZ = 220;
export const SAMPLE_RATE_HZ = 48000;
const LINEAR_DENSITY_KG_PER_M = 6e-4;
const LENGTH_M = 0.65;

/** σ_n = 0.5 + 0.05·n² per second: the b1 + b2·k² shape of the two-coefficient loss model. */
export function decayRatePerS(n: number): number {
  return 0.5 + 0.05 * n * n;
}

/** Two sines (f0 and 2·f0) with exponential envelopes, peak-normalised to ±1. */
export function twoDecayingSines(durationS = 0.5, sampleRateHz = SAMPLE_RATE_HZ): Float32Array {
  const samples = new Float32Array(Math.round(durationS * sampleRateHz));
  let peak = 0;
  for (let i = 0; i < samples.length; i++) {
    const t = i / sampleRateHz;
    samples[i] = Math.sin(2 * Math.PI * F0_HZ * t) * Math.exp(-2 * t) + 0.5 * Math.sin(2 * Math.PI * 2 * F0_HZ * t) * Math.exp(-4 * t);
    peak = Math.max(peak, Math.abs(samples[i]));
  }
  for (let i = 0; i < samples.length; i++) samples[i] /= peak;
  return samples;
}

/**
 * A result of `modeCount` harmonic modes of 220 Hz with a_n = 1 mm / n² and no initial velocity,
 * so E_n = ¼·μ·L·ω_n²·a_n² falls as 1/n² (a level of −20·log10 n dB), and a preview of two decaying
 * sines at 48 kHz.
 */
export function syntheticResult({ modeCount = 20, durationS = 0.5 }: { modeCount?: number; durationS?: number } = {}): ComputeResult {
  const frequencyHz = new Float64Array(modeCount);
  const aM = new Float64Array(modeCount);
  const energyJ = new Float64Array(modeCount);
  const decay = new Float64Array(modeCount);
  let totalEnergyJ = 0;
  for (let m = 0; m < modeCount; m++) {
    const n = m + 1;
    frequencyHz[m] = n * F0_HZ;
    aM[m] = 1e-3 / (n * n);
    const omega = 2 * Math.PI * frequencyHz[m];
    energyJ[m] = 0.25 * LINEAR_DENSITY_KG_PER_M * LENGTH_M * omega * omega * aM[m] * aM[m];
    decay[m] = decayRatePerS(n);
    totalEnergyJ += energyJ[m];
  }
  return {
    type: 'result',
    sessionId: 'session-1',
    sequence: 1,
    f0Hz: F0_HZ,
    waveSpeedMPerS: 2 * LENGTH_M * F0_HZ,
    totalEnergyJ,
    modeCount,
    frequencyHz,
    aM,
    vMPerS: new Float64Array(modeCount),
    energyJ,
    decayRatePerS: decay,
    previewSampleRateHz: SAMPLE_RATE_HZ,
    preview: twoDecayingSines(durationS),
    previewPhysicalPeak: 1e-3,
    computeMs: 12,
  };
}

export const TENSION_ISSUE: FieldIssue = {
  field: 'string.tensionN',
  problem: 'must be > 0',
  got: '-5',
  message: 'string.tensionN must be > 0, got -5',
};
