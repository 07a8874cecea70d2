import { describe, expect, it } from 'vitest';
import { frequencyTickLabel, linearScale, linearTicks, logScale, logTicks } from '../../../src/features/editor/results/chart-scales';

describe('chart scales', () => {
  it('maps linearly and back', () => {
    const y = linearScale([-80, 0], [200, 10]);
    expect(y(-80)).toBe(200);
    expect(y(0)).toBe(10);
    expect(y(-40)).toBe(105);
    expect(y.invert(105)).toBe(-40);
  });

  it('maps equal frequency ratios to equal distances on a log scale', () => {
    const x = logScale([20, 20000], [0, 300]);
    expect(x(20)).toBeCloseTo(0, 9);
    expect(x(200)).toBeCloseTo(100, 9);
    expect(x(2000)).toBeCloseTo(200, 9);
    expect(x.invert(150)).toBeCloseTo(Math.sqrt(200 * 2000), 6);
  });

  it('puts log ticks at 1, 2, 5 per decade, thinning when crowded', () => {
    expect(logTicks([20, 24000])).toEqual([20, 50, 100, 200, 500, 1000, 2000, 5000, 10000, 20000]);
    expect(logTicks([20, 24000], 7)).toEqual([50, 100, 500, 1000, 5000, 10000]);
    expect(logTicks([150, 6000], 12)).toEqual([200, 500, 1000, 2000, 5000]);
    expect(logTicks([20, 24000], 3)).toEqual([100, 1000, 10000]);
    expect(logTicks([20, 24000], 2)).toEqual([100, 10000]);
    expect(logTicks([0, 10])).toEqual([]);
  });

  it('puts linear ticks on a 1-2-5 step', () => {
    expect(linearTicks([0, 0.5], 5)).toEqual([0, 0.1, 0.2, 0.3, 0.4, 0.5]);
    expect(linearTicks([0, 4], 4)).toEqual([0, 1, 2, 3, 4]);
    expect(linearTicks([0, 1.37], 3)).toEqual([0, 0.5, 1]);
  });

  it('labels frequencies in Hz with k for thousands', () => {
    expect(frequencyTickLabel(20)).toBe('20');
    expect(frequencyTickLabel(500)).toBe('500');
    expect(frequencyTickLabel(1000)).toBe('1k');
    expect(frequencyTickLabel(20000)).toBe('20k');
  });
});
