import { describe, expect, it } from 'vitest';
import { estimateFrequencyHz } from '../../support/pitch-estimate';

const SAMPLE_RATE_HZ = 48000;

/** Σ_n A_n·e^(−σ_n t)·sin(2π f_n t + φ_n), written out sample by sample with Math.sin. */
function decayingPartials(partials: ReadonlyArray<{ hz: number; amplitude: number; decayPerS: number; phase: number }>, durationS: number): Float64Array {
  const samples = new Float64Array(Math.round(durationS * SAMPLE_RATE_HZ));
  for (const { hz, amplitude, decayPerS, phase } of partials) {
    for (let i = 0; i < samples.length; i++) {
      const t = i / SAMPLE_RATE_HZ;
      samples[i] += amplitude * Math.exp(-decayPerS * t) * Math.sin(2 * Math.PI * hz * t + phase);
    }
  }
  return samples;
}

const cents = (found: number, expected: number) => 1200 * Math.log2(found / expected);

describe('estimateFrequencyHz (Hann window, zero-padded FFT by fft.js, then golden-section search on the directly evaluated DTFT)', () => {
  it.each([
    [41.2, 2, 1.5],
    [41.2, 3, 4],
    [261.63, 2, 3],
    [261.63, 3, 0.5],
    [1046.5, 2, 6],
    [1046.5, 3, 2],
  ])('recovers an exponentially decaying sine at %f Hz (%f s, σ = %f /s) within 0.05 cent', (hz, durationS, decayPerS) => {
    const samples = decayingPartials([{ hz, amplitude: 0.8, decayPerS, phase: 0.7 }], durationS);
    const found = estimateFrequencyHz(samples, SAMPLE_RATE_HZ, hz * 2 ** (20 / 1200));
    expect(Math.abs(cents(found, hz))).toBeLessThan(0.05);
    expect(Math.abs(cents(found, hz))).toBeLessThan(1e-3);
  });

  it('finds the first partial of a stiff harmonic tone (f_n = n·f0·√(1 + Bn²), B = 3·10⁻⁴, amplitudes 1/n²) within 0.05 cent', () => {
    for (const f0 of [65.4, 261.63, 1046.5]) {
      const b = 3e-4;
      const partials = Array.from({ length: 12 }, (_, m) => {
        const n = m + 1;
        return { hz: n * f0 * Math.sqrt(1 + b * n * n), amplitude: 1 / (n * n), decayPerS: 1 + 0.3 * n, phase: 0.3 * n };
      }).filter((partial) => partial.hz < SAMPLE_RATE_HZ / 2);
      const firstHz = partials[0].hz;
      const found = estimateFrequencyHz(decayingPartials(partials, 2), SAMPLE_RATE_HZ, firstHz);
      expect(Math.abs(cents(found, firstHz))).toBeLessThan(0.05);
    }
  });

  it('throws when nothing sounds within ±50 cents of the expected frequency', () => {
    const samples = decayingPartials([{ hz: 261.63, amplitude: 1, decayPerS: 1, phase: 0 }], 1);
    expect(() => estimateFrequencyHz(samples, SAMPLE_RATE_HZ, 261.63 * 2 ** (3 / 12))).toThrow(/no spectral peak/);
  });
});
