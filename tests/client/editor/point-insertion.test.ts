import { describe, expect, it } from 'vitest';
import * as Y from 'yjs';
import { createCanvasScale } from '../../../src/features/editor/geometry/canvas-scale';
import { asPixels } from '../../../src/features/editor/geometry/canvas-units';
import { clampDrag, insertionIndex, minPointGapM, nearestSegment } from '../../../src/features/editor/geometry/point-insertion';
import { patchDoc, writePatchToDoc } from '../../../shared/collab/patch-doc';
import { insertPoint, movePoint, MIN_POINT_GAP_FRACTION } from '../../../shared/collab/point-edits';
import { validatePatch } from '../../../shared/patch/validate-patch';
import { seededRandom } from '../../../shared/random/seeded-random';
import { testPatch } from '../../support/patches';

const L = 0.65;
const gap = L * MIN_POINT_GAP_FRACTION;
const interior: [number, number][] = [
  [0.1, 0.001],
  [0.3, 0.003],
  [0.5, 0.002],
];

/** A shared document holding a patch with these interior displacement points. */
function docWith(points: [number, number][]): Y.Doc {
  const validation = validatePatch(testPatch({ excitation: { displacementM: [[0, 0], ...points, [L, 0]] } }));
  if (!validation.ok) throw new Error(validation.issues[0].message);
  const doc = new Y.Doc();
  writePatchToDoc(doc, validation.value);
  return doc;
}

function docXs(doc: Y.Doc): number[] {
  return patchDoc(doc).displacement.map((point) => point.get('x') as number);
}

/** Random sorted interior points with at least `minGap` between neighbours and from the supports. */
function randomInterior(random: () => number, count: number, minGap: number): [number, number][] {
  const xs: number[] = [];
  while (xs.length < count) {
    const x = minGap + random() * (L - 2 * minGap);
    if (xs.every((other) => Math.abs(other - x) >= minGap)) xs.push(x);
  }
  return xs.sort((a, b) => a - b).map((x) => [x, (random() - 0.5) * 0.006]);
}

describe('insertionIndex', () => {
  it('finds the place in the sorted interior list', () => {
    expect(insertionIndex(interior, 0.05, L)).toEqual({ ok: true, index: 0 });
    expect(insertionIndex(interior, 0.2, L)).toEqual({ ok: true, index: 1 });
    expect(insertionIndex(interior, 0.4, L)).toEqual({ ok: true, index: 2 });
    expect(insertionIndex(interior, 0.6, L)).toEqual({ ok: true, index: 3 });
    expect(insertionIndex([], 0.3, L)).toEqual({ ok: true, index: 0 });
  });

  it.each([
    ['at the left support', 0, /between the supports/],
    ['left of the string', -0.1, /between the supports/],
    ['at the right support', L, /between the supports/],
    ['right of the string', 0.7, /between the supports/],
    ['not a number', Number.NaN, /finite/],
    ['infinite', Number.POSITIVE_INFINITY, /finite/],
    ['on an existing point', 0.3, /point 1/],
    ['just right of a point', 0.3 + gap / 2, /point 1/],
    ['just left of a point', 0.5 - gap / 2, /point 2/],
    ['within the gap of the left support', gap / 2, /left support/],
    ['within the gap of the right support', L - gap / 2, /right support/],
  ])('refuses x %s, with a reason', (_label, xM, reason) => {
    const result = insertionIndex(interior, xM, L);
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.reason).toMatch(reason);
  });

  it('accepts x exactly one gap from a neighbour (the same bound as allowedRangeM)', () => {
    expect(insertionIndex(interior, 0.3 + gap, L)).toEqual({ ok: true, index: 2 });
  });

  it('agrees with insertPoint on the shared document wherever it accepts', () => {
    const random = seededRandom(11);
    for (let i = 0; i < 200; i++) {
      const xM = random() * L;
      const result = insertionIndex(interior, xM, L);
      if (!result.ok) continue;
      const doc = docWith(interior);
      const shared = insertPoint(doc, 'displacement', xM, 0.001);
      expect(shared).toEqual({ ok: true, index: result.index });
    }
  });
});

describe('nearestSegment', () => {
  const scale = createCanvasScale({ lengthM: L, widthPx: 1000, heightPx: 500, marginPx: 25, displacementRangeM: 0.005 });
  const points: [number, number][] = [[0, 0], [0.2, 0.004], [0.4, -0.002], [L, 0]];

  it('picks the segment under a click beside its middle and measures the perpendicular distance', () => {
    const [ax, ay] = [scale.xToPx(0.2), scale.yToPx(0.004)];
    const [bx, by] = [scale.xToPx(0.4), scale.yToPx(-0.002)];
    const length = Math.hypot(bx - ax, by - ay);
    const [nx, ny] = [-(by - ay) / length, (bx - ax) / length];
    const hit = nearestSegment(points, asPixels((ax + bx) / 2 + 6 * nx), asPixels((ay + by) / 2 + 6 * ny), scale);
    expect(hit?.segmentIndex).toBe(1);
    expect(hit?.distancePx).toBeCloseTo(6, 9);
    expect(hit?.alongFraction).toBeCloseTo(0.5, 9);
    expect(hit?.xM).toBeCloseTo(0.3, 12);
    expect(hit?.yM).toBeCloseTo(0.001, 12);
  });

  it('measures to the end when the foot falls beyond it', () => {
    const hit = nearestSegment(points, asPixels(scale.xToPx(L) + 30), asPixels(scale.yToPx(0) + 40), scale);
    expect(hit?.segmentIndex).toBe(2);
    expect(hit?.alongFraction).toBe(1);
    expect(hit?.distancePx).toBeCloseTo(50, 9);
  });

  it('gives the lower segment on a tie at a shared vertex, and null with no line', () => {
    expect(nearestSegment(points, scale.xToPx(0.2), scale.yToPx(0.004), scale)).toMatchObject({ segmentIndex: 0, distancePx: 0 });
    expect(nearestSegment([[0, 0]], asPixels(10), asPixels(10), scale)).toBeNull();
  });

  it('agrees with a brute-force search over 1,000 samples of each segment (independent method)', () => {
    const random = seededRandom(3);
    const samples = 1000;
    const line = [[0, 0] as [number, number], ...randomInterior(random, 8, 0.02), [L, 0] as [number, number]];
    const segmentsPx = line.slice(0, -1).map(([x0, y0], j) => {
      const [x1, y1] = line[j + 1];
      return Array.from({ length: samples + 1 }, (_, s) => {
        const t = s / samples;
        return [scale.xToPx(x0 + t * (x1 - x0)), scale.yToPx(y0 + t * (y1 - y0))] as const;
      });
    });
    // Sampling overestimates a distance by at most half a sample spacing.
    const slackPx = Math.max(...segmentsPx.map((s) => Math.hypot(s[samples][0] - s[0][0], s[samples][1] - s[0][1]))) / samples / 2;
    for (let i = 0; i < 200; i++) {
      const xPx = asPixels(random() * 1000);
      const yPx = asPixels(random() * 500);
      const distances = segmentsPx.map((segment) => Math.min(...segment.map(([x, y]) => Math.hypot(x - xPx, y - yPx))));
      const bruteBest = Math.min(...distances);
      const hit = nearestSegment(line, xPx, yPx, scale);
      expect(hit!.distancePx).toBeLessThanOrEqual(bruteBest + 1e-9);
      expect(hit!.distancePx).toBeGreaterThanOrEqual(bruteBest - slackPx);
      expect(distances[hit!.segmentIndex]).toBeLessThanOrEqual(bruteBest + slackPx);
    }
  });
});

describe('clampDrag', () => {
  it('stops a drag one gap short of each neighbour and of the supports', () => {
    expect(clampDrag(interior, 1, 0.05, L)).toBe(0.1 + gap);
    expect(clampDrag(interior, 1, 0.9, L)).toBe(0.5 - gap);
    expect(clampDrag(interior, 0, -1, L)).toBe(gap);
    expect(clampDrag(interior, 2, 2, L)).toBe(L - gap);
    expect(clampDrag(interior, 1, 0.25, L)).toBe(0.25);
    expect(minPointGapM(L)).toBe(gap);
  });

  it('leaves the point where it is for a non-finite x or when its neighbours leave no room', () => {
    expect(clampDrag(interior, 1, Number.NaN, L)).toBe(0.3);
    const crowded: [number, number][] = [[0.3, 0], [0.3 + gap, 0], [0.3 + 1.5 * gap, 0]];
    expect(clampDrag(crowded, 1, 0.1, L)).toBe(0.3 + gap);
  });

  it('throws for an index off the list (a bug in the caller)', () => {
    expect(() => clampDrag(interior, 3, 0.2, L)).toThrow(/no interior point 3/);
    expect(() => clampDrag(interior, -1, 0.2, L)).toThrow();
  });

  it('never lets a point pass a neighbour over 5,000 random drags, wild ones included', () => {
    const random = seededRandom(29);
    const points = randomInterior(random, 12, 0.01);
    let smallestGap = Number.POSITIVE_INFINITY;
    for (let step = 0; step < 5000; step++) {
      const index = Math.floor(random() * points.length);
      const wild = random();
      const target = wild < 0.05 ? Number.NaN : wild < 0.2 ? (random() - 0.5) * 10 : points[index][0] + (random() - 0.5) * 0.1;
      points[index] = [clampDrag(points, index, target, L), points[index][1]];
      const xs = [0, ...points.map(([x]) => x), L];
      for (let i = 1; i < xs.length; i++) smallestGap = Math.min(smallestGap, xs[i] - xs[i - 1]);
    }
    expect(smallestGap).toBeGreaterThanOrEqual(gap * (1 - 1e-9));
    expect(validatePatch(testPatch({ excitation: { displacementM: [[0, 0], ...points, [L, 0]] } })).ok).toBe(true);
  });

  it('lands exactly where movePoint on the shared document does', () => {
    const random = seededRandom(41);
    for (let i = 0; i < 100; i++) {
      const index = Math.floor(random() * interior.length);
      const target = (random() * 1.4 - 0.2) * L;
      const doc = docWith(interior);
      movePoint(doc, 'displacement', index, target, 0.001);
      expect(docXs(doc)[index]).toBe(clampDrag(interior, index, target, L));
    }
  });
});
