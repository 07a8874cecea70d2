import { describe, expect, it } from 'vitest';
import { samplePeak } from '../../../shared/audio/peak';
import { buildOscillatorBank } from '../../../shared/engine/oscillator-bank';
import { computeModeTable, type ModeTable } from '../../../shared/engine/mode-table';
import { renderBank } from '../../../shared/engine/render-bank';
import { prepareRender, renderPatch, renderSampleCount } from '../../../shared/engine/render-patch';
import { splitBank } from '../../../shared/engine/split-bank';
import type { Patch, PickupOutput } from '../../../shared/patch/patch-schema';
import { exactModeSolution } from '../../support/exact-mode-solution';
import { testPatch, validPatch as valid } from '../../support/patches';

/** Σ_n w_n·q_n(t) (or q_n'(t)) from the textbook solution of each mode, evaluated directly. */
function exactPickupSignal(patch: Patch, table: ModeTable, t: number): number {
  const { lengthM, tensionN, inharmonicityB } = patch.string;
  let sum = 0;
  for (let m = 0; m < table.count; m++) {
    const n = m + 1;
    const k = (n * Math.PI) / lengthM;
    const omega = 2 * Math.PI * table.frequencyHz[m];
    const { q, dq } = exactModeSolution(table.decayRatePerS[m], omega, table.aM[m], table.vMPerS[m], t);
    if (patch.pickup.output === 'force') sum += tensionN * k * (1 + inharmonicityB * n * n) * q;
    else sum += Math.sin(k * patch.pickup.positionM) * (patch.pickup.output === 'velocity' ? dq : q);
  }
  return sum;
}

const struck = testPatch({
  string: { lengthM: 0.65, tensionN: 70, linearDensityKgPerM: 6e-4, inharmonicityB: 2e-4 },
  excitation: {
    displacementM: [
      [0, 0],
      [0.2, 0.001],
      [0.25, 0.0015],
      [0.65, 0],
    ],
    velocityMPerS: [
      [0, 0],
      [0.4, 0],
      [0.42, 1.5],
      [0.44, 0],
      [0.65, 0],
    ],
  },
  damping: { b1PerS: 1.5, b2M2PerS: 2.5 },
  render: { sampleRateHz: 48000, durationS: 0.25, maxModes: 4096 },
});

describe('rendering a patch', () => {
  it.each<PickupOutput>(['displacement', 'velocity', 'force'])(
    'matches the exact solution of every mode sample by sample (%s pickup; ringing, heavily damped and overdamped modes)',
    (output) => {
      const patch = valid({ ...struck, pickup: { positionM: 0.137, output } });
      const { table, bank } = prepareRender(patch);
      // b2 = 2.5 m²/s makes the upper modes overdamped (σ_n > ω_n), so all three paths run.
      const overdamped = Array.from(table.decayRatePerS).filter((sigma, m) => sigma > 2 * Math.PI * table.frequencyHz[m]).length;
      expect(overdamped).toBeGreaterThan(10);
      expect(bank.slow.count).toBeGreaterThan(overdamped);
      expect(bank.fast.count).toBeGreaterThan(0);
      const samples = new Float64Array(bank.sampleCount);
      renderBank(bank, samples);
      const peak = samplePeak(samples);
      let worst = 0;
      for (let i = 0; i < samples.length; i += 13) {
        const t = i / patch.render.sampleRateHz;
        worst = Math.max(worst, Math.abs(samples[i] - exactPickupSignal(patch, table, t)));
      }
      expect(peak).toBeGreaterThan(0);
      expect(worst / peak).toBeLessThan(1e-10);
    },
  );

  it('has round(durationS × sampleRate) samples, sample i at t = i / sampleRate', () => {
    const patch = valid(testPatch({ render: { sampleRateHz: 44100, durationS: 0.123457, maxModes: 64 } }));
    expect(renderSampleCount(patch)).toBe(Math.round(0.123457 * 44100));
    const samples = renderPatch(patch);
    expect(samples.length).toBe(5444);
    const table = computeModeTable(patch);
    expect(samples[0]).toBeCloseTo(exactPickupSignal(patch, table, 0), 15);
    expect(samples[5443]).toBeCloseTo(exactPickupSignal(patch, table, 5443 / 44100), 14);
  });

  it('keeps a mode that rings for the whole render exact to rounding over 20 s at 96 kHz', () => {
    const patch = valid(
      testPatch({ damping: { b1PerS: 0.05, b2M2PerS: 0 }, render: { sampleRateHz: 96000, durationS: 20, maxModes: 8 } }),
    );
    const samples = renderPatch(patch);
    const table = computeModeTable(patch);
    const peak = samplePeak(samples);
    for (const i of [0, 1, 1_000_001, 1_919_999]) {
      expect(Math.abs(samples[i] - exactPickupSignal(patch, table, i / 96000)) / peak).toBeLessThan(1e-9);
    }
  });

  it.each([
    ['overdamped', 2],
    ['heavily damped but ringing', 0.9],
    ['barely overdamped', 1 + 1e-7],
  ])('solves a single %s mode (σ = %f·ω) exactly, sample by sample', (_label, ratio) => {
    const patch = valid(testPatch({ render: { sampleRateHz: 48000, durationS: 0.05, maxModes: 1 } }));
    const omega = 2 * Math.PI * 200;
    const table: ModeTable = {
      f0Hz: 200,
      waveSpeedMPerS: 260,
      totalEnergyJ: 0,
      count: 1,
      frequencyHz: Float64Array.of(200),
      aM: Float64Array.of(0.002),
      vMPerS: Float64Array.of(3),
      energyJ: Float64Array.of(0),
      decayRatePerS: Float64Array.of(ratio * omega),
    };
    const bank = buildOscillatorBank(patch, table, 2400);
    expect(bank.slow.count).toBe(1);
    const samples = new Float64Array(2400);
    renderBank(bank, samples);
    const w = Math.sin((Math.PI * 0.1) / 0.65);
    const peak = samplePeak(samples);
    for (let i = 0; i < 2400; i++) {
      const { q } = exactModeSolution(ratio * omega, omega, 0.002, 3, i / 48000);
      expect(Math.abs(samples[i] - w * q)).toBeLessThan(1e-12 * peak);
    }
  });

  it('solves a critically damped mode (σ = ω exactly) as such', () => {
    const patch = valid(testPatch({ render: { sampleRateHz: 48000, durationS: 0.05, maxModes: 1 } }));
    const omega = 2 * Math.PI * 300;
    const table: ModeTable = {
      f0Hz: 300,
      waveSpeedMPerS: 390,
      totalEnergyJ: 0,
      count: 1,
      frequencyHz: Float64Array.of(300),
      aM: Float64Array.of(0.002),
      vMPerS: Float64Array.of(-0.5),
      energyJ: Float64Array.of(0),
      decayRatePerS: Float64Array.of(omega),
    };
    const bank = buildOscillatorBank(patch, table, 2400);
    expect(bank.slow.count).toBe(1);
    const samples = new Float64Array(2400);
    renderBank(bank, samples);
    const w = Math.sin((Math.PI * 0.1) / 0.65);
    for (const i of [0, 10, 100, 999, 2399]) {
      const t = i / 48000;
      const expected = w * Math.exp(-omega * t) * (0.002 + (-0.5 + omega * 0.002) * t);
      expect(samples[i]).toBeCloseTo(expected, 15);
    }
  });

  it('gives the same samples when the bank is split into parts and summed (as the worker pool does)', () => {
    const patch = valid({ ...struck, pickup: { positionM: 0.3, output: 'displacement' } });
    const whole = renderPatch(patch);
    const parts = splitBank(prepareRender(patch).bank, 3);
    const sum = new Float64Array(whole.length);
    for (const part of parts) renderBank(part, sum);
    const peak = samplePeak(whole);
    for (let i = 0; i < whole.length; i++) expect(Math.abs(sum[i] - whole[i])).toBeLessThan(1e-13 * peak);
  });

  it('renders silence for a pickup on a node of the only excited mode', () => {
    const L = 0.65;
    const sine: [number, number][] = Array.from({ length: 201 }, (_, i) => [(L * i) / 200, i === 200 ? 0 : 0.001 * Math.sin((2 * Math.PI * i) / 200)]);
    sine[200] = [L, 0];
    const patch = valid(testPatch({ excitation: { displacementM: sine }, pickup: { positionM: L / 2, output: 'displacement' }, render: { sampleRateHz: 48000, durationS: 0.1, maxModes: 1 } }));
    expect(samplePeak(renderPatch(patch))).toBeLessThan(1e-17);
  });
});
