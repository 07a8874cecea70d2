import { describe, expect, it } from 'vitest';
import { polylineSimplification } from '../../../src/features/editor/geometry/polyline-simplification';
import { segmentApproach } from '../../../src/features/editor/geometry/segment-distance';
import { seededRandom } from '../../../shared/random/seeded-random';

/** The classic recursive Ramer–Douglas–Peucker (Ramer 1972; Douglas & Peucker 1973 — citations from memory), written out plainly as the reference. */
function recursiveSimplification(points: Array<[number, number]>, tolerance: number): number[] {
  const kept = new Set([0, points.length - 1]);
  const split = (from: number, to: number) => {
    let farthest = -1;
    let distance = -1;
    for (let i = from + 1; i < to; i++) {
      const d = segmentApproach(...points[i], ...points[from], ...points[to]).distance;
      if (d > distance) [farthest, distance] = [i, d];
    }
    if (farthest < 0 || distance <= tolerance) return;
    kept.add(farthest);
    split(from, farthest);
    split(farthest, to);
  };
  split(0, points.length - 1);
  return [...kept].sort((a, b) => a - b);
}

function randomWalk(seed: number, count: number): Array<[number, number]> {
  const random = seededRandom(seed);
  const points: Array<[number, number]> = [[0, 0]];
  for (let i = 1; i < count; i++) points.push([points[i - 1][0] + random() * 3, points[i - 1][1] + (random() - 0.5) * 6]);
  return points;
}

describe('polylineSimplification (best-first Ramer–Douglas–Peucker)', () => {
  it('keeps exactly the points the recursive form keeps when uncapped', () => {
    for (const seed of [1, 2, 3, 4, 5]) {
      const points = randomWalk(seed, 800);
      for (const tolerance of [0.5, 2, 8]) {
        expect(polylineSimplification(points, tolerance).keptIndices).toEqual(recursiveSimplification(points, tolerance));
      }
    }
  });

  it('drops collinear points and keeps corners', () => {
    const points: Array<[number, number]> = [[0, 0], [1, 1], [2, 2], [3, 3], [4, 2], [5, 1], [6, 0]];
    expect(polylineSimplification(points, 0)).toEqual({ keptIndices: [0, 3, 6], maxDeviation: 0 });
  });

  it('spends a cap on the largest deviations first, and reports what is left', () => {
    const points = randomWalk(6, 500);
    const capped = polylineSimplification(points, 0, 20);
    expect(capped.keptIndices.length).toBe(20);
    expect(capped.keptIndices[0]).toBe(0);
    expect(capped.keptIndices[19]).toBe(499);
    const fewer = polylineSimplification(points, 0, 10);
    expect(fewer.keptIndices.every((i) => capped.keptIndices.includes(i))).toBe(true);
    expect(capped.maxDeviation).toBeLessThanOrEqual(fewer.maxDeviation);
  });

  it('keeps both ends of a run of two or fewer points', () => {
    expect(polylineSimplification([[0, 0], [1, 5]], 1)).toEqual({ keptIndices: [0, 1], maxDeviation: 0 });
    expect(polylineSimplification([], 1)).toEqual({ keptIndices: [], maxDeviation: 0 });
  });
});
