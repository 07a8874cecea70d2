import { assert } from '../assert';
import type { Polyline } from '../patch/patch-schema';
import type { Metres } from '../units';

/**
 * The shape played harder: a narrower contact. Every interior point moves toward the shape's peak
 * by the same factor, x' = p + (x − p)·widthFactor, with its value kept; the supports (0 and L)
 * stay. p is the x of the point of largest |y| (the middle of the run when several neighbouring
 * points share that height, a flat top). The rounded top of a pluck (its contact width) and the
 * slopes beside it shrink toward p, so the peak and the pluck position stay while the curvature
 * there rises, which brightens the tone: a rounded top holds back the modes whose half-wavelength
 * is shorter than it, and a narrower one holds back fewer (each vertex with a change of slope Δs
 * adds 2L·Δs·sin(nπx/L)/(n²π²) to the coefficient c_n; see `sineProjection`).
 * This is our own model of "harder is narrower", a geometric one, not a measured contact law.
 *
 * widthFactor is in (0, 1]; 1 returns the shape unchanged, and so does any factor for a shape whose
 * only interior point is its peak (a triangle pluck) or a shape that is zero everywhere. The map is
 * an increasing affine one that keeps every interior point between where it was and p, so x stays
 * strictly increasing and inside (0, L).
 */
export function narrowShape(points: Polyline, lengthM: Metres, widthFactor: number): Array<[number, number]> {
  assert(widthFactor > 0 && widthFactor <= 1, `widthFactor must be in (0, 1], got ${widthFactor}`);
  assert(points.length >= 2 && points[0][0] === 0 && points[points.length - 1][0] === lengthM, 'a shape runs from the support at 0 to the support at L');
  const copy = points.map(([x, y]): [number, number] => [x, y]);
  let peak = 0;
  for (let i = 1; i < points.length; i++) if (Math.abs(points[i][1]) > Math.abs(points[peak][1])) peak = i;
  const height = Math.abs(points[peak][1]);
  if (widthFactor === 1 || height === 0) return copy;
  let plateauEnd = peak;
  while (plateauEnd + 1 < points.length && Math.abs(points[plateauEnd + 1][1]) === height) plateauEnd++;
  const peakXM = (points[peak][0] + points[plateauEnd][0]) / 2;

  const last = points.length - 1;
  for (let i = 1; i < last; i++) {
    const x = points[i][0];
    copy[i][0] = x === peakXM ? x : peakXM + (x - peakXM) * widthFactor;
  }
  for (let i = 1; i <= last; i++) assert(copy[i][0] > copy[i - 1][0], `narrowing by ${widthFactor} brought points ${i - 1} and ${i} together`);
  return copy;
}
