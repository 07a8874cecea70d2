import { describe, expect, it } from 'vitest';
import { clampPluckPositionM, pluckShape, type PluckRequest } from '../../../src/features/editor/geometry/pluck-shape';
import { MIN_POINT_GAP_FRACTION } from '../../../shared/collab/point-edits';
import { sineProjection } from '../../../shared/engine/sine-projection';
import type { Polyline } from '../../../shared/patch/patch-schema';
import { validatePatch } from '../../../shared/patch/validate-patch';
import { testPatch } from '../../support/patches';

// testPatch's string: L = 0.65 m (tests/support/patches.ts).
const L = 0.65;
const gap = L * MIN_POINT_GAP_FRACTION;
const base: PluckRequest = { lengthM: L, positionM: 0.17, heightM: 0.003, widthM: 0.012 };

function pluck(request: Partial<PluckRequest> = {}): { points: Array<[number, number]>; contactFromM: number; contactToM: number } {
  const result = pluckShape({ ...base, ...request });
  if (!result.ok) throw new Error(result.reason);
  return result;
}

function withSupports(points: Polyline): Array<[number, number]> {
  return [[0, 0], ...points.map(([x, y]): [number, number] => [x, y]), [L, 0]];
}

/** Triangular pluck, a_n = 2hL² sin(nπp/L) / (n²π² p (L − p)) (Fletcher & Rossing, The Physics of Musical Instruments, ch. 2). */
function triangleCoefficient(n: number, p: number, h: number): number {
  return (2 * h * L * L * Math.sin((n * Math.PI * p) / L)) / (n * n * Math.PI * Math.PI * p * (L - p));
}

describe('pluckShape', () => {
  it('peaks at exactly heightM at exactly positionM, and nowhere higher', () => {
    for (const [p, h] of [[0.17, 0.003], [0.325, 0.004], [0.6, -0.002]]) {
      const { points } = pluck({ positionM: p, heightM: h });
      expect(points).toContainEqual([p, h]);
      for (const [, y] of points) expect(Math.abs(y)).toBeLessThanOrEqual(Math.abs(h));
    }
  });

  it('samples the rounded top at 13 points by default, the asked number otherwise, from p − w/2 to p + w/2', () => {
    const shape = pluck();
    expect(shape.points).toHaveLength(13);
    expect(shape.contactFromM).toBe(0.17 - 0.006);
    expect(shape.contactToM).toBe(0.17 + 0.006);
    expect(shape.points[0][0]).toBe(shape.contactFromM);
    expect(shape.points[12][0]).toBe(shape.contactToM);
    expect(pluck({ points: 3 }).points.map(([x]) => x)).toEqual([0.17 - 0.006, 0.17, 0.17 + 0.006]);
    expect(pluck({ points: 8 }).points).toHaveLength(8);
  });

  it.each([
    ['the default pluck', {}],
    ['a centre pluck', { positionM: L / 2 }],
    ['a downward pluck near the bridge', { positionM: 0.05, heightM: -0.002, widthM: 0.02 }],
    ['the widest contact at the clamp limit', { positionM: clampPluckPositionM(L, 0, 0.1) as number, widthM: 0.1 }],
    ['the far clamp limit', { positionM: clampPluckPositionM(L, L, 0.1) as number, widthM: 0.1 }],
    ['a very narrow contact', { widthM: 1e-5 }],
    ['many points', { points: 401 }],
  ])('passes validatePatch as a patch with supports: %s', (_label, request) => {
    const validation = validatePatch(testPatch({ excitation: { displacementM: withSupports(pluck(request).points) } }));
    expect(validation.ok ? [] : validation.issues.map((issue) => issue.message)).toEqual([]);
  });

  it('is continuous in slope where the lines meet the top, and flat at the peak (derived from the construction)', () => {
    // Three even samples of a parabola give its slope at the first exactly: y′(x0) = (−3y0 + 4y1 − y2) / (2Δ).
    for (const request of [{}, { positionM: 0.5, widthM: 0.03 }, { positionM: 0.04, heightM: -0.001, widthM: 0.05 }]) {
      const { points } = pluck(request);
      const peak = (points.length - 1) / 2;
      const [[x0, y0], [x1, y1], [, y2]] = points;
      const leftLineSlope = y0 / x0;
      const leftTopSlope = (-3 * y0 + 4 * y1 - y2) / (2 * (x1 - x0));
      expect(Math.abs(leftTopSlope - leftLineSlope)).toBeLessThan(1e-9 * Math.abs(leftLineSlope));

      const [xn, yn] = points[points.length - 1];
      const [xm, ym] = points[points.length - 2];
      const [, yk] = points[points.length - 3];
      const rightLineSlope = -yn / (L - xn);
      const rightTopSlope = (3 * yn - 4 * ym + yk) / (2 * (xn - xm));
      expect(Math.abs(rightTopSlope - rightLineSlope)).toBeLessThan(1e-9 * Math.abs(rightLineSlope));

      const [xp, yp] = points[peak];
      const [xl, yl] = points[peak - 1];
      const [, yll] = points[peak - 2];
      const [, yr] = points[peak + 1];
      const [, yrr] = points[peak + 2];
      const step = xp - xl;
      expect(Math.abs((3 * yp - 4 * yl + yll) / (2 * step))).toBeLessThan(1e-9 * Math.abs(leftLineSlope));
      expect(Math.abs((-3 * yp + 4 * yr - yrr) / (2 * step))).toBeLessThan(1e-9 * Math.abs(leftLineSlope));
    }
  });

  it('has no corner at the cap edges as sampled: the slope turns there by half the turn inside the top (chords of a parabola)', () => {
    const { points } = pluck({ points: 25 });
    const line = withSupports(points);
    const slopes = line.slice(0, -1).map(([x0, y0], j) => (line[j + 1][1] - y0) / (line[j + 1][0] - x0));
    const turns = slopes.slice(0, -1).map((s, j) => s - slopes[j + 1]);
    // Vertex 1 is the left edge, vertex 2 the first inside the top; the last turn is at the right edge.
    expect(turns[0]).toBeGreaterThan(0);
    expect(Math.abs(turns[0] / turns[1] - 0.5)).toBeLessThan(1e-6);
    expect(Math.abs(turns[turns.length - 1] / turns[turns.length - 2] - 0.5)).toBeLessThan(1e-6);
    // And it is small next to the line's own slope: about 1/(points − 1) of it.
    expect(turns[0] / slopes[0]).toBeLessThan(2 / 24);
  });

  it('approaches the triangular pluck as the width goes to 0 (Fletcher & Rossing, ch. 2)', () => {
    const p = 0.17;
    const h = 0.003;
    const a1 = triangleCoefficient(1, p, h);
    const errors = [1e-2, 1e-3, 1e-4, 1e-5].map((w) => {
      const c = sineProjection(withSupports(pluck({ positionM: p, heightM: h, widthM: w }).points), L, 50);
      let largest = 0;
      for (let n = 1; n <= 50; n++) largest = Math.max(largest, Math.abs(c[n - 1] - triangleCoefficient(n, p, h)));
      return largest / a1;
    });
    // First order in w: the lines are tangent to the top, so a little steeper than the triangle's (measured ≈ 0.45·w/L).
    errors.forEach((error, i) => expect(error).toBeLessThan((0.5 * 10 ** (-2 - i)) / L));
    for (let i = 1; i < errors.length; i++) expect(errors[i - 1] / errors[i]).toBeGreaterThan(9.5);
  });

  it('differs from the triangle by the first-order term in w, with a second-order remainder (derived here)', () => {
    // The top's curvature −y″ is a spread-out kink: s₁ = h/(p − w/4) centred at p − w/4, s₂ = h/(L − p − w/4) at p + w/4
    // (the sampled top has the same total and first moment). With a_n = (2/(L k²))∫−y″ sin(kx) dx, to first order in w:
    //   δa_n ≈ (2/(L k²)) (w h / 4) [ sin(kp) (1/p² + 1/(L − p)²) + k cos(kp) (1/(L − p) − 1/p) ],  k = nπ/L.
    const p = 0.17;
    const h = 0.003;
    const a1 = triangleCoefficient(1, p, h);
    const firstOrder = (n: number, w: number) => {
      const k = (n * Math.PI) / L;
      const bracket = Math.sin(k * p) * (1 / p ** 2 + 1 / (L - p) ** 2) + k * Math.cos(k * p) * (1 / (L - p) - 1 / p);
      return (2 / (L * k * k)) * ((w * h) / 4) * bracket;
    };
    const remainders = [1e-2, 1e-3, 1e-4].map((w) => {
      const c = sineProjection(withSupports(pluck({ positionM: p, heightM: h, widthM: w }).points), L, 50);
      let largest = 0;
      for (let n = 1; n <= 50; n++) largest = Math.max(largest, Math.abs(c[n - 1] - triangleCoefficient(n, p, h) - firstOrder(n, w)));
      return largest / a1;
    });
    remainders.forEach((remainder, i) => expect(remainder).toBeLessThan((10 ** (-2 - i) / L) ** 2));
    for (let i = 1; i < remainders.length; i++) expect(remainders[i - 1] / remainders[i]).toBeGreaterThan(90);
  });

  it('narrower than two minimum gaps, is the knife-edge pluck itself (Fletcher & Rossing, ch. 2)', () => {
    const shape = pluck({ widthM: 1.5 * gap });
    expect(shape.points).toEqual([[0.17, 0.003]]);
    const c = sineProjection(withSupports(shape.points), L, 100);
    for (let n = 1; n <= 100; n++) expect(Math.abs(c[n - 1] - triangleCoefficient(n, 0.17, 0.003))).toBeLessThan(1e-13 * c[0]);
  });

  it('uses fewer points rather than crowd them closer than the minimum gap', () => {
    const { points } = pluck({ widthM: 4.5 * gap });
    expect(points).toHaveLength(5);
    for (let i = 1; i < points.length; i++) expect(points[i][0] - points[i - 1][0]).toBeGreaterThanOrEqual(gap * (1 - 1e-6));
  });

  it.each([
    ['a zero width', { widthM: 0 }, /width must be > 0/],
    ['a negative width', { widthM: -0.01 }, /width must be > 0/],
    ['a width that is not a number', { widthM: Number.NaN }, /finite/],
    ['a position on a support', { positionM: 0 }, /between the supports/],
    ['a position past the far support', { positionM: 0.7 }, /between the supports/],
    ['a contact reaching past the near support', { positionM: 0.02, widthM: 0.05 }, /reaches past a support/],
    ['a contact wider than the string', { positionM: L / 2, widthM: L }, /reaches past a support/],
    ['a string with no length', { lengthM: 0 }, /length must be > 0/],
    ['too few points', { points: 2 }, /whole number of points/],
    ['a fractional count', { points: 7.5 }, /whole number of points/],
  ])('refuses %s, with a reason', (_label, request, reason) => {
    const result = pluckShape({ ...base, ...request });
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.reason).toMatch(reason);
  });
});

describe('clampPluckPositionM', () => {
  it('keeps the contact inside the string, one gap from each support, and pluckShape accepts the result', () => {
    expect(clampPluckPositionM(L, 0.001, 0.02)).toBe(0.01 + gap);
    expect(clampPluckPositionM(L, 0.649, 0.02)).toBe(L - 0.01 - gap);
    expect(clampPluckPositionM(L, 0.3, 0.02)).toBe(0.3);
    for (const [target, width] of [[0, 0.02], [L, 0.02], [-5, 0.3], [5, 0.3], [0.1, L - 3 * gap]]) {
      const positionM = clampPluckPositionM(L, target, width) as number;
      expect(pluckShape({ ...base, positionM, widthM: width }).ok).toBe(true);
    }
  });

  it('gives null when the contact cannot fit anywhere, or the position is not a number', () => {
    expect(clampPluckPositionM(L, 0.3, L)).toBeNull();
    expect(clampPluckPositionM(L, Number.NaN, 0.02)).toBeNull();
  });
});
