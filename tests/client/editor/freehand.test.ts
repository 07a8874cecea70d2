import { describe, expect, it } from 'vitest';
import { createCanvasScale, type CanvasScale } from '../../../src/features/editor/geometry/canvas-scale';
import { asPixels, type PixelPoint } from '../../../src/features/editor/geometry/canvas-units';
import { polylineFromStroke } from '../../../src/features/editor/geometry/freehand';
import { segmentApproach } from '../../../src/features/editor/geometry/segment-distance';
import { LIMITS } from '../../../shared/limits';
import { MIN_POINT_GAP_FRACTION } from '../../../shared/collab/point-edits';
import type { Polyline } from '../../../shared/patch/patch-schema';
import { validatePatch } from '../../../shared/patch/validate-patch';
import { seededRandom } from '../../../shared/random/seeded-random';
import { testPatch } from '../../support/patches';

const L = 0.65;
const gap = L * MIN_POINT_GAP_FRACTION;
const scale = createCanvasScale({ lengthM: L, widthPx: 1000, heightPx: 400, marginPx: 20, displacementRangeM: 0.005 });
const left = scale.xToPx(0);
const right = scale.xToPx(L);
const centre = scale.yToPx(0);

function stroke(samples: Array<[number, number]>): PixelPoint[] {
  return samples.map(([x, y]) => [asPixels(x), asPixels(y)]);
}

/** Half a sine arch across the string, amplitude 120 px, sampled every 0.5 px from outside one end to outside the other, with ±0.4 px noise. */
function noisySineStroke(seed: number): PixelPoint[] {
  const random = seededRandom(seed);
  const samples: Array<[number, number]> = [];
  for (let x = left - 10; x <= right + 10; x += 0.5) {
    samples.push([x, centre - 120 * Math.sin((Math.PI * (x - left)) / (right - left)) + (random() - 0.5) * 0.8]);
  }
  return stroke(samples);
}

/** The result as drawn: pixel points, supports included. */
function drawn(points: Polyline, on: CanvasScale): Array<[number, number]> {
  return [[0, 0] as const, ...points, [on.lengthM, 0] as const].map(([x, y]) => [on.xToPx(x), on.yToPx(y)]);
}

/** Largest distance, in pixels, from any of `samples` to the polyline `line` (independent of the simplifier's bookkeeping). */
function largestDistancePx(samples: ReadonlyArray<readonly [number, number]>, line: Array<[number, number]>): number {
  let largest = 0;
  for (const [x, y] of samples) {
    let nearest = Number.POSITIVE_INFINITY;
    for (let j = 0; j + 1 < line.length; j++) {
      nearest = Math.min(nearest, segmentApproach(x, y, line[j][0], line[j][1], line[j + 1][0], line[j + 1][1]).distance);
    }
    largest = Math.max(largest, nearest);
  }
  return largest;
}

function expectValidInterior(points: Array<[number, number]>): void {
  for (let i = 0; i < points.length; i++) {
    expect(points[i][0]).toBeGreaterThanOrEqual(i === 0 ? gap : points[i - 1][0] + gap * (1 - 1e-9));
    expect(points[i][0]).toBeLessThanOrEqual(L - gap);
  }
  const validation = validatePatch(testPatch({ excitation: { displacementM: [[0, 0], ...points, [L, 0]] } }));
  expect(validation.ok ? [] : validation.issues.map((issue) => issue.message)).toEqual([]);
}

describe('polylineFromStroke', () => {
  it('simplifies a noisy sine stroke to few points that stay within 1.5 px of every sample on the string (Ramer–Douglas–Peucker bound; Douglas & Peucker 1973 — from memory)', () => {
    const samples = noisySineStroke(7);
    const result = polylineFromStroke(samples, scale);
    if (!result.ok) throw new Error(result.reason);
    expect(samples.length).toBeGreaterThan(1900);
    expect(result.points.length).toBeGreaterThan(5);
    expect(result.points.length).toBeLessThanOrEqual(60);
    const onString = samples.filter(([x]) => x > left && x < right);
    expect(result.droppedSampleCount).toBe(samples.length - onString.length);
    expect(largestDistancePx(onString, drawn(result.points, scale))).toBeLessThanOrEqual(1.5 + 1e-9);
    expect(result.maxDeviationPx).toBeLessThanOrEqual(1.5);
    expectValidInterior(result.points);
  });

  it('keeps a given tolerance: a tighter one keeps more points, each bound still holding', () => {
    const samples = noisySineStroke(8);
    const onString = samples.filter(([x]) => x > left && x < right);
    let previousCount = 0;
    for (const tolerancePx of [4, 1.5, 0.6]) {
      const result = polylineFromStroke(samples, scale, { tolerancePx });
      if (!result.ok) throw new Error(result.reason);
      expect(result.points.length).toBeGreaterThan(previousCount);
      previousCount = result.points.length;
      expect(largestDistancePx(onString, drawn(result.points, scale))).toBeLessThanOrEqual(tolerancePx + 1e-9);
    }
  });

  it('caps the count at 200 by default, and reports the deviation it settled for', () => {
    const samples = noisySineStroke(9);
    const result = polylineFromStroke(samples, scale, { tolerancePx: 0 });
    if (!result.ok) throw new Error(result.reason);
    expect(result.points.length).toBe(200);
    expect(result.maxDeviationPx).toBeGreaterThan(0);
    const onString = samples.filter(([x]) => x > left && x < right);
    expect(largestDistancePx(onString, drawn(result.points, scale))).toBeLessThanOrEqual(result.maxDeviationPx + 1e-9);
    expectValidInterior(result.points);
  });

  it('never returns more than LIMITS.maxPolylinePoints − 2 interior points, whatever is asked', () => {
    const wide = createCanvasScale({ lengthM: L, widthPx: 12_040, heightPx: 400, marginPx: 20, displacementRangeM: 0.005 });
    const random = seededRandom(13);
    const samples: Array<[number, number]> = [];
    for (let i = 1; i < 12_000; i++) samples.push([20 + i, wide.yToPx(0) + (random() - 0.5) * 100]);
    const result = polylineFromStroke(stroke(samples), wide, { tolerancePx: 0, maxPoints: 50_000 });
    if (!result.ok) throw new Error(result.reason);
    expect(result.points.length).toBe(LIMITS.maxPolylinePoints - 2);
    expectValidInterior(result.points);
  });

  it('drops samples that go backwards: the first pass over each x wins', () => {
    // Forward along y = centre − 100 to x = 500, back to 300 along the top edge, then forward again along y = centre − 100.
    const samples: Array<[number, number]> = [];
    for (let x = 100; x <= 500; x += 1) samples.push([x, centre - 100]);
    for (let x = 499; x >= 300; x -= 1) samples.push([x, 20]);
    for (let x = 301; x <= 800; x += 1) samples.push([x, centre - 100 + (x > 500 ? (x - 500) / 10 : 0)]);
    const result = polylineFromStroke(stroke(samples), scale);
    if (!result.ok) throw new Error(result.reason);
    expect(result.droppedSampleCount).toBe(200 + 200);
    for (const [xM, yM] of result.points) {
      const xPx = scale.xToPx(xM);
      const expectedPx = centre - 100 + (xPx > 500 ? (xPx - 500) / 10 : 0);
      expect(scale.yToPx(yM)).toBeCloseTo(expectedPx, 9);
    }
    expectValidInterior(result.points);
  });

  it('reads a right-to-left stroke from its end, giving the same polyline as drawn left to right', () => {
    const samples = noisySineStroke(10);
    const forward = polylineFromStroke(samples, scale);
    const backward = polylineFromStroke([...samples].reverse(), scale);
    expect(backward).toEqual(forward);
  });

  it('clips to the string: a stroke that runs past the far support and back draws nothing more', () => {
    const samples: Array<[number, number]> = [];
    for (let x = 0; x <= 1000; x += 2) samples.push([x, centre - 50]);
    for (let x = 1000; x >= 600; x -= 2) samples.push([x, centre + 150]);
    const result = polylineFromStroke(stroke(samples), scale);
    if (!result.ok) throw new Error(result.reason);
    for (const [xM, yM] of result.points) {
      expect(xM).toBeGreaterThan(0);
      expect(xM).toBeLessThan(L);
      expect(scale.yToPx(yM)).toBeCloseTo(centre - 50, 9);
    }
    expectValidInterior(result.points);
  });

  it('skips samples that are not finite', () => {
    const samples = noisySineStroke(12);
    const spoiled = [...samples];
    spoiled.splice(400, 0, [asPixels(Number.NaN), asPixels(100)], [asPixels(300), asPixels(Number.POSITIVE_INFINITY)]);
    const result = polylineFromStroke(spoiled, scale);
    const clean = polylineFromStroke(samples, scale);
    expect(result.ok && clean.ok && result.points).toEqual(clean.ok && clean.points);
  });

  it('refuses a stroke with no sample on the string', () => {
    expect(polylineFromStroke([], scale)).toMatchObject({ ok: false });
    expect(polylineFromStroke(stroke([[5, 100], [15, 120], [18, 90]]), scale)).toMatchObject({ ok: false, reason: expect.stringMatching(/does not cross/) });
    expect(polylineFromStroke(stroke([[985, 100], [995, 120]]), scale)).toMatchObject({ ok: false });
  });

  it('turns a single sample into one point: a triangle', () => {
    const result = polylineFromStroke(stroke([[400, 100]]), scale);
    expect(result).toMatchObject({ ok: true, points: [[scale.pxToX(asPixels(400)), scale.pxToY(asPixels(100))]] });
  });
});
