import type { Patch } from '../patch/patch-schema';
import { buildOscillatorBank, type OscillatorBank } from './oscillator-bank';
import { computeModeTable, type ModeTable } from './mode-table';
import { renderBank } from './render-bank';

/** Number of samples of a render: round(durationS × sampleRateHz); sample i is at t = i / sampleRateHz. */
export function renderSampleCount(patch: Patch): number {
  return Math.round(patch.render.durationS * patch.render.sampleRateHz);
}

/** The mode table and the oscillators of a validated patch, ready to render here or on worker threads. */
export function prepareRender(patch: Patch): { table: ModeTable; bank: OscillatorBank } {
  const table = computeModeTable(patch);
  return { table, bank: buildOscillatorBank(patch, table, renderSampleCount(patch)) };
}

/**
 * Renders the sound at the pickup on this thread: the sum over kept modes of each mode's exact
 * solution times its pickup weight, in the pickup's physical unit (m, m/s or N).
 */
export function renderPatch(patch: Patch): Float64Array {
  const { bank } = prepareRender(patch);
  const out = new Float64Array(bank.sampleCount);
  renderBank(bank, out);
  return out;
}
