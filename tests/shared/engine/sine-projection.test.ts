import { describe, expect, it } from 'vitest';
import { sineProjection } from '../../../shared/engine/sine-projection';
import { seededRandom } from '../../../shared/random/seeded-random';
import { integrate } from '../../support/gauss-legendre';
import { trianglePluck } from '../../support/patches';

const L = 0.65;

describe('sine projection of a polyline', () => {
  it('matches the closed-form coefficients of the triangular pluck (Fletcher & Rossing, ch. 2)', () => {
    const p = 0.17;
    const h = 0.003;
    const coefficients = sineProjection(trianglePluck(L, p, h), L, 500);
    for (let n = 1; n <= 500; n++) {
      // a_n = 2hL² sin(nπp/L) / (n²π² p (L − p))
      const expected = (2 * h * L * L * Math.sin((n * Math.PI * p) / L)) / (n * n * Math.PI * Math.PI * p * (L - p));
      expect(Math.abs(coefficients[n - 1] - expected)).toBeLessThan(1e-13 * Math.abs(coefficients[0]));
    }
  });

  it.each([2, 3, 5, 7])('leaves out modes m, 2m, 3m… of a pluck at L/%i (Young’s law; Rayleigh, Theory of Sound I §128 — from memory)', (m) => {
    const coefficients = sineProjection(trianglePluck(L, L / m, 0.002), L, 60);
    for (let n = 1; n <= 60; n++) {
      if (n % m === 0) expect(Math.abs(coefficients[n - 1])).toBeLessThan(1e-14 * Math.abs(coefficients[0]));
      else expect(Math.abs(coefficients[n - 1])).toBeGreaterThan(1e-6 * Math.abs(coefficients[0]) / (n * n));
    }
  });

  it('agrees with Gauss–Legendre quadrature of (2/L)∫f(x)sin(nπx/L)dx for a random polyline', () => {
    const random = seededRandom(20261201);
    const xs = [0];
    while (xs.length < 40) xs.push(xs[xs.length - 1] + 0.2 + random());
    const scale = L / (xs[xs.length - 1] + 0.2 + random());
    const points: [number, number][] = xs.map((x, i) => [x * scale, i === 0 ? 0 : (random() - 0.5) * 0.004]);
    points.push([L, 0]);
    const f = (x: number) => {
      let j = 0;
      while (points[j + 1][0] < x) j++;
      const [x0, y0] = points[j];
      const [x1, y1] = points[j + 1];
      return y0 + ((y1 - y0) * (x - x0)) / (x1 - x0);
    };
    const coefficients = sineProjection(points, L, 80);
    for (const n of [1, 2, 3, 7, 20, 41, 80]) {
      let numeric = 0;
      for (let j = 0; j + 1 < points.length; j++) {
        numeric += integrate((x) => f(x) * Math.sin((n * Math.PI * x) / L), points[j][0], points[j + 1][0], 1, 40);
      }
      numeric *= 2 / L;
      expect(Math.abs(coefficients[n - 1] - numeric)).toBeLessThan(1e-15 + 1e-11 * Math.abs(numeric));
    }
  });

  it('keeps the boundary term for a polyline whose ends are not zero: f = 1 gives 4/(nπ) for odd n (square wave series)', () => {
    const coefficients = sineProjection(
      [
        [0, 1],
        [L, 1],
      ],
      L,
      9,
    );
    for (let n = 1; n <= 9; n++) {
      const expected = n % 2 === 1 ? 4 / (n * Math.PI) : 0;
      expect(coefficients[n - 1]).toBeCloseTo(expected, 14);
    }
  });

  it('stays accurate at high mode numbers (rotation re-seeded): mode 4096 of a pluck against the closed form', () => {
    const p = 0.211;
    const h = 0.001;
    const coefficients = sineProjection(trianglePluck(L, p, h), L, 4096);
    for (const n of [1000, 2049, 4095, 4096]) {
      const expected = (2 * h * L * L * Math.sin((n * Math.PI * p) / L)) / (n * n * Math.PI * Math.PI * p * (L - p));
      expect(Math.abs(coefficients[n - 1] - expected)).toBeLessThan(1e-12 * Math.abs(coefficients[0]) / (n * n) + 1e-20);
    }
  });
});
