import type { Patch } from '../patch/patch-schema';
import type { Hertz, Joules, MetresPerSecond } from '../units';
import { fundamentalFrequencyHz, keptModeCount, modeFrequencyHz, modeWavenumber, waveSpeedMPerS } from './mode-frequencies';
import { modeDecayRatePerS, t60FromDecayRate } from './mode-decay';
import { modeEnergyJ } from './mode-energy';
import { sineProjection } from './sine-projection';

/**
 * The modal decomposition of a patch, as parallel arrays (mode n at index n − 1) so it can be sent
 * as binary and read without allocation.
 */
export interface ModeTable {
  f0Hz: Hertz;
  waveSpeedMPerS: MetresPerSecond;
  totalEnergyJ: Joules;
  count: number;
  /** Undamped frequency f_n. */
  frequencyHz: Float64Array;
  /** Initial displacement amplitude a_n, metres. */
  aM: Float64Array;
  /** Initial velocity amplitude v_n, metres per second. */
  vMPerS: Float64Array;
  energyJ: Float64Array;
  /** σ_n, 1/s: the mode's envelope is e^(−σ_n t). */
  decayRatePerS: Float64Array;
}

/** One row of the mode table as the command line and the API print it. */
export interface ModeRow {
  n: number;
  frequencyHz: Hertz;
  aM: number;
  vMPerS: number;
  energyJ: Joules;
  /** Time to fall 60 dB; null when the mode has no loss. */
  t60S: number | null;
}

/**
 * Computes the modes of a validated patch: which modes are kept (n ≤ maxModes, f_n below half the
 * sample rate), their frequencies, the sine projections of the initial displacement and velocity,
 * each mode's energy and decay rate.
 */
export function computeModeTable(patch: Patch): ModeTable {
  const { string, excitation, damping, render } = patch;
  const count = keptModeCount(string, render.maxModes, render.sampleRateHz);
  const aM = sineProjection(excitation.displacementM, string.lengthM, count);
  const vMPerS = excitation.velocityMPerS
    ? sineProjection(excitation.velocityMPerS, string.lengthM, count)
    : new Float64Array(count);
  const frequencyHz = new Float64Array(count);
  const energyJ = new Float64Array(count);
  const decayRatePerS = new Float64Array(count);
  let totalEnergyJ = 0;
  for (let m = 0; m < count; m++) {
    const n = m + 1;
    frequencyHz[m] = modeFrequencyHz(string, n);
    decayRatePerS[m] = modeDecayRatePerS(damping, modeWavenumber(string.lengthM, n));
    energyJ[m] = modeEnergyJ(string.linearDensityKgPerM, string.lengthM, 2 * Math.PI * frequencyHz[m], aM[m], vMPerS[m]);
    totalEnergyJ += energyJ[m];
  }
  return {
    f0Hz: fundamentalFrequencyHz(string),
    waveSpeedMPerS: waveSpeedMPerS(string),
    totalEnergyJ,
    count,
    frequencyHz,
    aM,
    vMPerS,
    energyJ,
    decayRatePerS,
  };
}

/** The mode table as rows of plain numbers (for JSON). */
export function modeTableRows(table: ModeTable): ModeRow[] {
  const rows: ModeRow[] = [];
  for (let m = 0; m < table.count; m++) {
    rows.push({
      n: m + 1,
      frequencyHz: table.frequencyHz[m],
      aM: table.aM[m],
      vMPerS: table.vMPerS[m],
      energyJ: table.energyJ[m],
      t60S: t60FromDecayRate(table.decayRatePerS[m]),
    });
  }
  return rows;
}

/** The mode table as the command line prints it and `GET /api/sessions/:id/modes` returns it. */
export interface ModeTableReport {
  f0Hz: Hertz;
  waveSpeedMPerS: MetresPerSecond;
  totalEnergyJ: Joules;
  modes: ModeRow[];
}

export function modeTableReport(table: ModeTable): ModeTableReport {
  return { f0Hz: table.f0Hz, waveSpeedMPerS: table.waveSpeedMPerS, totalEnergyJ: table.totalEnergyJ, modes: modeTableRows(table) };
}
