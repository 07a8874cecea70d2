import { FAST_GROUP, type FastOscillators, type OscillatorBank, type SlowOscillators } from './oscillator-bank';
import { newFastOscillators, newSlowOscillators } from './oscillator-storage';

function pickFast(bank: FastOscillators, groups: number[]): FastOscillators {
  const count = groups.length * FAST_GROUP;
  const part = newFastOscillators(count, bank.gainA !== undefined);
  groups.forEach((group, index) => {
    const from = group * FAST_GROUP;
    const to = index * FAST_GROUP;
    for (const key of ['stateRe', 'stateIm', 'stepRe', 'stepIm', 'activeSamples', 'gainA', 'gainB'] as const) {
      const source = bank[key];
      if (source) (part[key] as Float64Array).set(source.subarray(from, from + FAST_GROUP), to);
    }
  });
  return part;
}

function pickSlow(bank: SlowOscillators, indices: number[]): SlowOscillators {
  const count = indices.length;
  const keys = ['q', 'u', 'm11', 'm12', 'm21', 'm22', 'activeSamples', ...(bank.gainA ? (['gainA', 'gainB'] as const) : [])] as const;
  const part = newSlowOscillators(count, bank.gainA !== undefined);
  indices.forEach((from, to) => {
    for (const key of keys) (part[key] as Float64Array)[to] = (bank[key] as Float64Array)[from];
  });
  return part;
}

/**
 * Deals a bank's oscillators into `parts` banks of about equal work (groups dealt in turn, the
 * bank being sorted by length), so that the parts can render on separate threads and be summed.
 */
export function splitBank(bank: OscillatorBank, parts: number): OscillatorBank[] {
  const fastGroups: number[][] = Array.from({ length: parts }, () => []);
  for (let group = 0; group < bank.fast.count / FAST_GROUP; group++) fastGroups[group % parts].push(group);
  const slowIndices: number[][] = Array.from({ length: parts }, () => []);
  for (let j = 0; j < bank.slow.count; j++) slowIndices[j % parts].push(j);
  return fastGroups.map((groups, part) => ({
    sampleCount: bank.sampleCount,
    fast: pickFast(bank.fast, groups),
    slow: pickSlow(bank.slow, slowIndices[part]),
  }));
}

/** Mode-samples of work in a bank: the sum of its oscillators' active lengths. */
export function bankWork(bank: OscillatorBank): number {
  let work = 0;
  for (let j = 0; j < bank.fast.count; j += FAST_GROUP) work += FAST_GROUP * bank.fast.activeSamples[j];
  for (let j = 0; j < bank.slow.count; j++) work += bank.slow.activeSamples[j];
  return work;
}
