import { describe, expect, it } from 'vitest';
import { bankSegment } from '../../../shared/engine/bank-segment';
import { buildOscillatorBank } from '../../../shared/engine/oscillator-bank';
import { computeModeTable } from '../../../shared/engine/mode-table';
import { renderBank } from '../../../shared/engine/render-bank';
import { renderBankStereo } from '../../../shared/engine/render-bank-stereo';
import { testPatch, validPatch } from '../../support/patches';
import { peakRelativeDifference } from '../../support/signal-difference';

function bankOf(overrides: object, sampleCount: number) {
  const patch = validPatch(testPatch(overrides));
  return buildOscillatorBank(patch, computeModeTable(patch), sampleCount);
}

function renderWhole(overrides: object, sampleCount: number): Float64Array {
  const out = new Float64Array(sampleCount);
  renderBank(bankOf(overrides, sampleCount), out);
  return out;
}

function renderInSegments(overrides: object, sampleCount: number, cuts: number[]): Float64Array {
  const bank = bankOf(overrides, sampleCount);
  const out = new Float64Array(sampleCount);
  const edges = [0, ...cuts, sampleCount];
  for (let i = 0; i + 1 < edges.length; i++) {
    const segment = new Float64Array(edges[i + 1] - edges[i]);
    renderBank(bankSegment(bank, edges[i], segment.length), segment);
    out.set(segment, edges[i]);
  }
  return out;
}

describe('rendering in time segments', () => {
  it('joins into the same samples as one render (ringing modes, stiffness, both loss terms)', () => {
    const overrides = { string: { lengthM: 0.65, tensionN: 70, linearDensityKgPerM: 6e-4, inharmonicityB: 3e-4 }, render: { sampleRateHz: 48000, durationS: 1.5, maxModes: 200 } };
    const samples = 72_000;
    const whole = renderWhole(overrides, samples);
    // Uneven cuts, one inside the first render block, so no block boundary hides an error.
    expect(peakRelativeDifference(renderInSegments(overrides, samples, [100, 30_001, 65_536]), whole)).toBeLessThan(1e-9);
  });

  it('also for heavily damped (slow-bank) modes, advanced by powers of their transition matrix', () => {
    // Very short decay times at a low pitch make the low modes overdamped: the 2×2 bank.
    const overrides = { string: { lengthM: 0.65, tensionN: 4, linearDensityKgPerM: 6e-3, inharmonicityB: 0 }, damping: { b1PerS: 200, b2M2PerS: 0.02 }, render: { sampleRateHz: 44100, durationS: 1, maxModes: 64 } };
    const bank = bankOf(overrides, 44_100);
    expect(bank.slow.count).toBeGreaterThan(0);
    expect(peakRelativeDifference(renderInSegments(overrides, 44_100, [7, 10_000, 22_050]), renderWhole(overrides, 44_100))).toBeLessThan(1e-9);
  });

  it('leaves the bank it was given untouched, and a segment past every oscillator is silent', () => {
    const bank = bankOf({ render: { sampleRateHz: 48000, durationS: 0.5, maxModes: 32 } }, 24_000);
    const before = Float64Array.from(bank.fast.stateRe);
    const late = bankSegment(bank, 10 ** 12, 512);
    expect(bank.fast.stateRe).toEqual(before);
    const out = new Float64Array(512);
    renderBank(late, out);
    expect(out.every((value) => value === 0)).toBe(true);
  });
});

describe('stereo banks: one recursion read by two pickups', () => {
  it('give each channel the same samples as a mono render at that pickup, in segments too', () => {
    const overrides = { string: { lengthM: 0.65, tensionN: 70, linearDensityKgPerM: 6e-4, inharmonicityB: 2e-4 }, render: { sampleRateHz: 48000, durationS: 0.5, maxModes: 120 } };
    const samples = 24_000;
    const patch = validPatch(testPatch(overrides));
    const table = computeModeTable(patch);
    // The second pickup sits on a node of mode 5 (x = L/5): that mode is silent there, not in A.
    const second = patch.string.lengthM / 5;
    const mono = (positionM: number) => {
      const out = new Float64Array(samples);
      renderBank(buildOscillatorBank({ ...patch, pickup: { ...patch.pickup, positionM } }, table, samples), out);
      return out;
    };
    const stereo = buildOscillatorBank(patch, table, samples, second);
    const a = new Float64Array(samples);
    const b = new Float64Array(samples);
    for (const [start, end] of [[0, 5_000], [5_000, 24_000]]) {
      const segA = new Float64Array(end - start);
      const segB = new Float64Array(end - start);
      renderBankStereo(bankSegment(stereo, start, end - start), segA, segB);
      a.set(segA, start);
      b.set(segB, start);
    }
    expect(peakRelativeDifference(a, mono(patch.pickup.positionM))).toBeLessThan(1e-9);
    expect(peakRelativeDifference(b, mono(second))).toBeLessThan(1e-9);
  });
});
