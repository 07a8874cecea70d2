import { describe, expect, it } from 'vitest';
import { sineProjection } from '../../../shared/engine/sine-projection';
import { validatePatch } from '../../../shared/patch/validate-patch';
import { narrowShape } from '../../../shared/renders/narrow-shape';
import { testPatch, trianglePluck } from '../../support/patches';

const L = 0.65;

/** A pluck with a rounded top around 0.17 m (a finger's contact), sampled at seven points. */
const rounded: [number, number][] = [
  [0, 0],
  [0.14, 0.0024],
  [0.155, 0.0028],
  [0.165, 0.00298],
  [0.17, 0.003],
  [0.175, 0.00298],
  [0.185, 0.0028],
  [0.2, 0.0024],
  [L, 0],
];

describe('narrowShape', () => {
  it('leaves the shape unchanged at factor 1 (a copy, not the same array)', () => {
    const narrowed = narrowShape(rounded, L, 1);
    expect(narrowed).toEqual(rounded);
    expect(narrowed).not.toBe(rounded);
  });

  it('leaves a one-point triangle pluck unchanged at any factor (its only interior point is the peak)', () => {
    const triangle = trianglePluck(L, 0.17, 0.003);
    for (const factor of [0.9, 0.6, 0.1]) expect(narrowShape(triangle, L, factor)).toEqual(triangle);
  });

  it('moves interior points toward the peak, x′ = p + (x − p)·w, keeping values and supports', () => {
    const narrowed = narrowShape(rounded, L, 0.6);
    expect(narrowed[0]).toEqual([0, 0]);
    expect(narrowed[narrowed.length - 1]).toEqual([L, 0]);
    narrowed.forEach(([x, value], i) => {
      expect(value).toBe(rounded[i][1]);
      if (i > 0 && i < narrowed.length - 1) expect(x).toBeCloseTo(0.17 + (rounded[i][0] - 0.17) * 0.6, 15);
    });
    expect(narrowed[4]).toEqual([0.17, 0.003]);
  });

  it('narrows toward the largest |y| (a negative pluck) and the middle of a flat top', () => {
    const negative = rounded.map(([x, y]): [number, number] => [x, -y]);
    expect(narrowShape(negative, L, 0.5)[1][0]).toBeCloseTo(0.17 - 0.03 * 0.5, 15);
    const flat: [number, number][] = [
      [0, 0],
      [0.2, 0.002],
      [0.3, 0.002],
      [L, 0],
    ];
    const narrowed = narrowShape(flat, L, 0.6);
    expect(narrowed[1][0]).toBeCloseTo(0.25 - 0.05 * 0.6, 15);
    expect(narrowed[2][0]).toBeCloseTo(0.25 + 0.05 * 0.6, 15);
  });

  it('leaves a shape that is zero everywhere as it is', () => {
    const silent: [number, number][] = [
      [0, 0],
      [0.3, 0],
      [L, 0],
    ];
    expect(narrowShape(silent, L, 0.6)).toEqual(silent);
  });

  it('keeps x strictly increasing inside (0, L), so validatePatch passes, for factors down to 0.01', () => {
    const velocity: [number, number][] = [
      [0, 0],
      [0.4, 0],
      [0.42, 1.5],
      [0.44, 0],
      [L, 0],
    ];
    for (const factor of [1, 0.8, 0.6, 0.3, 0.01]) {
      const result = validatePatch(testPatch({ excitation: { displacementM: narrowShape(rounded, L, factor), velocityMPerS: narrowShape(velocity, L, factor) } }));
      expect(result.ok).toBe(true);
      const narrowed = narrowShape(rounded, L, factor);
      for (let i = 1; i < narrowed.length; i++) expect(narrowed[i][0]).toBeGreaterThan(narrowed[i - 1][0]);
    }
  });

  it('brightens the pluck: the modes above 20 carry more of the shape once narrowed (sine coefficients, closed form)', () => {
    const highShare = (points: ReadonlyArray<readonly [number, number]>) => {
      const c = sineProjection(points, L, 200);
      let high = 0;
      let all = 0;
      c.forEach((value, m) => {
        all += value * value;
        if (m >= 20) high += value * value;
      });
      return high / all;
    };
    expect(highShare(narrowShape(rounded, L, 0.6))).toBeGreaterThan(highShare(rounded));
  });

  it('refuses a factor outside (0, 1] and a shape that does not run from 0 to L', () => {
    expect(() => narrowShape(rounded, L, 0)).toThrow(/Assertion failed/);
    expect(() => narrowShape(rounded, L, 1.5)).toThrow(/Assertion failed/);
    expect(() => narrowShape(rounded, 0.7, 0.5)).toThrow(/Assertion failed/);
  });
});
