import { describe, expect, it } from 'vitest';
import { loudestModePerColumn, nearestModeIndex } from '../../../src/features/editor/results/mode-marks';

describe('loudestModePerColumn', () => {
  it('draws every mode that has a pixel of its own', () => {
    expect(loudestModePerColumn([10, 20, 30], [0, -6, -9])).toEqual([0, 1, 2]);
  });

  it('keeps the loudest where modes share a pixel, in order of frequency', () => {
    expect(loudestModePerColumn([10, 10.2, 10.4, 30, 30.1], [-20, -3, -40, -50, -10])).toEqual([1, 4]);
  });

  it('draws at most one mark per pixel column for a dense table', () => {
    const x = Float64Array.from({ length: 4096 }, (_, m) => 50 + 500 * (Math.log(m + 1) / Math.log(4096)));
    const levels = Float64Array.from({ length: 4096 }, (_, m) => -20 * Math.log10(m + 1));
    const drawn = loudestModePerColumn(x, levels);
    expect(drawn.length).toBeLessThanOrEqual(501);
    expect(drawn[0]).toBe(0);
  });

  it('finds the nearest mode to a pixel', () => {
    expect(nearestModeIndex([10, 20, 30], 24)).toBe(1);
    expect(nearestModeIndex([], 24)).toBe(-1);
  });
});
