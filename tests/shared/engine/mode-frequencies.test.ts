import { describe, expect, it } from 'vitest';
import { fundamentalFrequencyHz, keptModeCount, modeFrequencyHz, waveSpeedMPerS } from '../../../shared/engine/mode-frequencies';
import { modeDecayRatePerS, t60FromDecayRate } from '../../../shared/engine/mode-decay';
import { centsBetween } from '../../../shared/designer/pitch';

const string = { lengthM: 0.65, tensionN: 70, linearDensityKgPerM: 6e-4, inharmonicityB: 0 };

describe('mode frequencies', () => {
  it('follow Mersenne’s laws: f0 = √(T/μ)/(2L) (Fletcher & Rossing ch. 2; Kinsler et al. ch. 2)', () => {
    expect(waveSpeedMPerS(string)).toBeCloseTo(Math.sqrt(70 / 6e-4), 12);
    expect(fundamentalFrequencyHz(string)).toBeCloseTo(341.565025531986 / 1.3, 9);
    // Four times the tension: one octave up; twice the length: one octave down; four times μ: down.
    expect(fundamentalFrequencyHz({ ...string, tensionN: 280 }) / fundamentalFrequencyHz(string)).toBeCloseTo(2, 14);
    expect(fundamentalFrequencyHz({ ...string, lengthM: 1.3 }) / fundamentalFrequencyHz(string)).toBeCloseTo(0.5, 14);
    expect(fundamentalFrequencyHz({ ...string, linearDensityKgPerM: 2.4e-3 }) / fundamentalFrequencyHz(string)).toBeCloseTo(0.5, 14);
  });

  it('are harmonic for a flexible string: f_n = n·f0', () => {
    for (const n of [1, 2, 3, 10, 57]) expect(modeFrequencyHz(string, n)).toBeCloseTo(n * fundamentalFrequencyHz(string), 9);
  });

  it('stretch as f_n = n·f0·√(1 + Bn²) on a stiff string (Fletcher 1964)', () => {
    const stiff = { ...string, inharmonicityB: 4e-4 };
    const f0 = fundamentalFrequencyHz(stiff);
    for (const n of [1, 5, 20]) expect(modeFrequencyHz(stiff, n)).toBeCloseTo(n * f0 * Math.sqrt(1 + 4e-4 * n * n), 9);
  });

  it('put mode 2 of plain piano wire with B = 3.5·10⁻⁴ about 1.2 cents sharp of 2·f0 (R. W. Young, JASA 24(3), 1952, via the team reference sheet)', () => {
    const stiff = { ...string, inharmonicityB: 3.5e-4 };
    const cents = centsBetween(2 * fundamentalFrequencyHz(stiff), modeFrequencyHz(stiff, 2));
    expect(cents).toBeGreaterThan(1.15);
    expect(cents).toBeLessThan(1.25);
  });

  it('keep every mode below half the sample rate, and no more than maxModes', () => {
    expect(keptModeCount(string, 4096, 48000)).toBe(Math.ceil(24000 / fundamentalFrequencyHz(string)) - 1);
    expect(keptModeCount(string, 10, 48000)).toBe(10);
    const stiff = { ...string, inharmonicityB: 1e-3 };
    const count = keptModeCount(stiff, 4096, 48000);
    expect(modeFrequencyHz(stiff, count)).toBeLessThan(24000);
    expect(modeFrequencyHz(stiff, count + 1)).toBeGreaterThanOrEqual(24000);
  });
});

describe('mode decay', () => {
  it('is σ_n = b1 + b2·k_n² and T60 = 3·ln 10/σ (Bensa et al. 2003; 60 dB is a factor 1000)', () => {
    const damping = { b1PerS: 0.5, b2M2PerS: 1e-4 };
    const k = (3 * Math.PI) / 0.65;
    const sigma = modeDecayRatePerS(damping, k);
    expect(sigma).toBeCloseTo(0.5 + 1e-4 * k * k, 14);
    const t60 = t60FromDecayRate(sigma);
    expect(t60).not.toBeNull();
    expect(Math.exp(-sigma * (t60 as number))).toBeCloseTo(1e-3, 15);
    expect(t60FromDecayRate(0)).toBeNull();
  });
});
