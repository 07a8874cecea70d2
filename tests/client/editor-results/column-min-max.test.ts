import { describe, expect, it } from 'vitest';
import { columnMinMax } from '../../../src/lib/synthesis/column-min-max';
import { logColumnMax } from '../../../src/features/editor/results/log-column-max';

describe('columnMinMax', () => {
  it('gives each column the lowest and highest of its samples', () => {
    const { min, max } = columnMinMax([0, 3, -1, 2, 5, -4, 1, 1], 4);
    expect([...min]).toEqual([0, -1, -4, 1]);
    expect([...max]).toEqual([3, 2, 5, 1]);
  });

  it('keeps a one-sample spike, however many samples share its column', () => {
    const samples = new Float32Array(100000);
    samples[77777] = 0.75;
    samples[12345] = -0.5;
    const { min, max } = columnMinMax(samples, 300);
    expect(Math.max(...max)).toBe(0.75);
    expect(Math.min(...min)).toBe(-0.5);
    expect(max[Math.floor((77777 * 300) / 100000)]).toBe(0.75);
  });

  it('splits uneven lengths without losing or repeating samples', () => {
    const samples = Float32Array.from({ length: 10 }, (_, i) => i);
    const { min, max } = columnMinMax(samples, 3);
    expect([...min]).toEqual([0, 3, 6]);
    expect([...max]).toEqual([2, 5, 9]);
  });

  it('stays continuous when there are more columns than samples, and is empty for no samples', () => {
    const { min, max } = columnMinMax([1, -1], 4);
    expect([...min]).toEqual([1, 1, -1, -1]);
    expect([...max]).toEqual([1, 1, -1, -1]);
    expect(columnMinMax([], 5).min.length).toBe(5);
    expect(columnMinMax([1, 2], 0).max.length).toBe(0);
  });
});

describe('logColumnMax', () => {
  it('takes the largest bin of each log-spaced column, so a narrow peak survives', () => {
    // Bins every 1 Hz from 0 to 20,000 Hz, all at −100 except one at 5,000 Hz.
    const values = new Float32Array(20001).fill(-100);
    values[5000] = -3;
    const columns = logColumnMax(values, 1, 20, 20000, 300);
    expect(columns.length).toBe(300);
    expect(Math.max(...columns)).toBe(-3);
    const column = Math.floor((300 * Math.log(5000 / 20)) / Math.log(20000 / 20));
    expect(columns[column]).toBe(-3);
    expect(columns.filter((value) => value === -3).length).toBe(1);
  });

  it('interpolates between bins where a column is narrower than a bin', () => {
    // Bins 10 Hz apart, level equal to the frequency: the low columns read their centre frequency.
    const values = Float32Array.from({ length: 101 }, (_, k) => k * 10);
    const columns = logColumnMax(values, 10, 21, 42, 50);
    const centreHz = 21 * Math.exp((Math.log(2) / 50) * 0.5);
    expect(columns[0]).toBeCloseTo(centreHz, 3);
    for (let c = 1; c < 50; c++) expect(columns[c]).toBeGreaterThanOrEqual(columns[c - 1]);
  });

  it('gives NaN for a domain it cannot draw', () => {
    expect(Number.isNaN(logColumnMax([1, 2], 1, 0, 10, 3)[0])).toBe(true);
    expect(Number.isNaN(logColumnMax([], 1, 1, 10, 3)[0])).toBe(true);
  });
});
