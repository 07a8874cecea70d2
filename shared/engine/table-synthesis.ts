import type { ModeTableWire } from '../protocol/mode-table-wire';
import { bankSegment } from './bank-segment';
import { fundamentalFrequencyHz, keptModeCount, modeFrequencyHz, modeWavenumber, waveSpeedMPerS } from './mode-frequencies';
import { modeDecayRatePerS } from './mode-decay';
import { modeEnergyJ } from './mode-energy';
import type { ModeTable } from './mode-table';
import { buildOscillatorBank, type OscillatorBank } from './oscillator-bank';

/**
 * The full mode table of a received table: frequencies f_n = n·f0·√(1 + Bn²), decay rates
 * σ_n = b1 + b2·k_n² and energies E_n = (μL/4)(ω_n²a_n² + v_n²) follow in closed form from the
 * string, the damping and the amplitudes, with the same functions the server's table uses.
 */
export function modeTableFromWire(wire: ModeTableWire): ModeTable {
  const { string, damping } = wire;
  const count = wire.aM.length;
  const frequencyHz = new Float64Array(count);
  const aM = Float64Array.from(wire.aM);
  const vMPerS = Float64Array.from(wire.vMPerS);
  const energyJ = new Float64Array(count);
  const decayRatePerS = new Float64Array(count);
  for (let m = 0; m < count; m++) {
    const n = m + 1;
    frequencyHz[m] = modeFrequencyHz(string, n);
    decayRatePerS[m] = modeDecayRatePerS(damping, modeWavenumber(string.lengthM, n));
    energyJ[m] = modeEnergyJ(string.linearDensityKgPerM, string.lengthM, 2 * Math.PI * frequencyHz[m], aM[m], vMPerS[m]);
  }
  return { f0Hz: fundamentalFrequencyHz(string), waveSpeedMPerS: waveSpeedMPerS(string), totalEnergyJ: wire.totalEnergyJ, count, frequencyHz, aM, vMPerS, energyJ, decayRatePerS };
}

/** Samples of the preview a table describes: round(duration × rate). */
export function previewSampleCount(wire: ModeTableWire): number {
  return Math.round(wire.preview.durationS * wire.preview.sampleRateHz);
}

/**
 * The oscillators of the preview a table describes: the modes below the preview's Nyquist
 * frequency (the first ones of the table), at the pickup, at the preview's rate: exactly the
 * oscillators the server would build for the same preview patch.
 */
export function previewBankFromWire(wire: ModeTableWire, table: ModeTable = modeTableFromWire(wire)): OscillatorBank {
  const rateHz = wire.preview.sampleRateHz;
  const count = keptModeCount(wire.string, table.count, rateHz);
  const kept: ModeTable =
    count === table.count
      ? table
      : { ...table, count, frequencyHz: table.frequencyHz.subarray(0, count), aM: table.aM.subarray(0, count), vMPerS: table.vMPerS.subarray(0, count), energyJ: table.energyJ.subarray(0, count), decayRatePerS: table.decayRatePerS.subarray(0, count) };
  return buildOscillatorBank({ string: wire.string, pickup: wire.pickup, render: { sampleRateHz: rateHz } }, kept, previewSampleCount(wire));
}

/** Adds a bank into a buffer (the TypeScript kernel `renderBank`, or the WebAssembly one). */
export type MonoBankRenderer = (bank: OscillatorBank, out: Float64Array) => void;

/**
 * Samples [startSample, startSample + sampleCount) of a bank's render, in the pickup's physical
 * unit. The bank is left untouched (each chunk starts from the exact state at its first sample),
 * so chunks can be rendered in any order and joined.
 */
export function renderBankChunk(bank: OscillatorBank, startSample: number, sampleCount: number, render: MonoBankRenderer): Float64Array {
  const length = Math.max(0, Math.min(sampleCount, bank.sampleCount - startSample));
  const out = new Float64Array(length);
  if (length > 0) render(bankSegment(bank, startSample, length), out);
  return out;
}
