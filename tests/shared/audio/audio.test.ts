import { describe, expect, it } from 'vitest';
import { decibelsFromGain, gainFromDecibels } from '../../../shared/audio/decibels';
import { normalizePeak } from '../../../shared/audio/normalize-peak';
import { samplePeak } from '../../../shared/audio/peak';
import { quantizePcm } from '../../../shared/audio/quantize-pcm';
import { seededRandom } from '../../../shared/random/seeded-random';

describe('audio helpers', () => {
  it('converts decibels: −6.0206 dB is half amplitude', () => {
    expect(gainFromDecibels(-6.020599913)).toBeCloseTo(0.5, 9);
    expect(decibelsFromGain(10)).toBeCloseTo(20, 12);
  });

  it('normalises the sample peak to the ceiling and leaves silence alone', () => {
    const samples = Float64Array.of(0.001, -0.004, 0.002);
    normalizePeak(samples, -1);
    expect(samplePeak(samples)).toBeCloseTo(10 ** (-1 / 20), 15);
    expect(samples[0] / samples[1]).toBeCloseTo(-0.25, 15);
    const silence = new Float64Array(4);
    expect(normalizePeak(silence, -1)).toBe(1);
    expect(samplePeak(silence)).toBe(0);
  });

  it('quantises with TPDF dither: error mean 0, variance 1/4 LSB² (1/12 rounding + 1/6 dither; common practice), counts clips', () => {
    const n = 200_000;
    const samples = new Float64Array(n);
    for (let i = 0; i < n; i++) samples[i] = 0.3 * Math.sin(i * 0.01);
    const { samples: ints, clippedCount } = quantizePcm(samples, 16, seededRandom(1));
    let mean = 0;
    let meanSquare = 0;
    for (let i = 0; i < n; i++) {
      const error = ints[i] - samples[i] * 32768;
      mean += error / n;
      meanSquare += (error * error) / n;
    }
    expect(Math.abs(mean)).toBeLessThan(0.01);
    expect(meanSquare).toBeGreaterThan(0.24);
    expect(meanSquare).toBeLessThan(0.26);
    expect(clippedCount).toBe(0);
    const loud = quantizePcm(Float64Array.of(1.5, -2, 0.5), 24, seededRandom(2));
    expect(loud.clippedCount).toBe(2);
    expect(loud.samples[0]).toBe(2 ** 23 - 1);
    expect(loud.samples[1]).toBe(-(2 ** 23));
  });
});
