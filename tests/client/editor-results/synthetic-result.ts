import type { FieldIssue } from '../../../shared/patch/field-issue';
import { encodeModeTable, type ModeTableWire } from '../../../shared/protocol/mode-table-wire';
import type { ComputeResult } from '../../../src/lib/live-session/session-connection';
import { analysePreview } from '../../../src/lib/synthesis/preview-analysis';
import type { PreviewSound } from '../../../src/lib/synthesis/preview-sound';

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
 * so E_n = ¼·μ·L·ω_n²·a_n² falls as 1/n² (a level of −20·log10 n dB). Its table describes the same
 * string (tension μ(2L·f0)², b2 = 0.05·L²/π² so that σ_n = 0.5 + 0.05·n²) with a preview of
 * `durationS` at 48 kHz; the preview itself is `syntheticSound`.
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
  const wire: ModeTableWire = {
    sequence: 1,
    documentVersion: 1,
    stateVector: new Uint8Array(0),
    string: { lengthM: LENGTH_M, tensionN: LINEAR_DENSITY_KG_PER_M * (2 * LENGTH_M * F0_HZ) ** 2, linearDensityKgPerM: LINEAR_DENSITY_KG_PER_M, inharmonicityB: 0 },
    damping: { b1PerS: 0.5, b2M2PerS: (0.05 * LENGTH_M * LENGTH_M) / (Math.PI * Math.PI) },
    pickup: { output: 'displacement', positionM: 0.1 },
    render: { sampleRateHz: SAMPLE_RATE_HZ, durationS },
    preview: { sampleRateHz: SAMPLE_RATE_HZ, durationS },
    totalEnergyJ,
    computeMs: 12,
    aM: Float32Array.from(aM),
    vMPerS: new Float32Array(modeCount),
  };
  return {
    sessionId: 'session-1',
    sequence: 1,
    documentVersion: 1,
    count: modeCount,
    f0Hz: F0_HZ,
    waveSpeedMPerS: 2 * LENGTH_M * F0_HZ,
    totalEnergyJ,
    modeCount,
    frequencyHz,
    aM,
    vMPerS: new Float64Array(modeCount),
    energyJ,
    decayRatePerS: decay,
    computeMs: 12,
    wire,
    byteLength: encodeModeTable(wire).byteLength,
  };
}

/**
 * A complete preview of two decaying sines (`twoDecayingSines`) as the synthesis worker delivers
 * it, with the charts' data computed as the worker does, the waveform for `columns` pixel columns.
 */
export function syntheticSound({ durationS = 0.5, columns = null, samples = twoDecayingSines(durationS) }: { durationS?: number; columns?: number | null; samples?: Float32Array } = {}): PreviewSound {
  return {
    sequence: 1,
    sampleRateHz: SAMPLE_RATE_HZ,
    samples,
    readySamples: samples.length,
    complete: true,
    physicalPeak: 1e-3,
    kernel: 'typescript',
    analysis: analysePreview(samples, SAMPLE_RATE_HZ, F0_HZ, columns),
  };
}

export const TENSION_ISSUE: FieldIssue = {
  field: 'string.tensionN',
  problem: 'must be > 0',
  got: '-5',
  message: 'string.tensionN must be > 0, got -5',
};
