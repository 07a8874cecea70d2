import { assert } from '../../../../shared/assert';
import { segmentApproach } from './segment-distance';

/** The result of simplifying a run of points: which to keep, and how far the dropped ones lie from the kept line. */
export interface PolylineSimplification {
  /** Indices into the input, ascending; always the first and the last. */
  keptIndices: number[];
  /** Largest distance of a dropped point from the kept segment spanning it (0 if none was dropped). */
  maxDeviation: number;
}

/** A run of dropped points between two kept ones, with the point farthest from the segment joining them. */
interface Span {
  from: number;
  to: number;
  farthest: number;
  distance: number;
}

function spanOf(points: ReadonlyArray<readonly [number, number]>, from: number, to: number): Span | null {
  if (to - from < 2) return null;
  const [ax, ay] = points[from];
  const [bx, by] = points[to];
  // On equal distances the point nearest the middle wins: a regular zigzag then splits in halves,
  // O(n log n), instead of peeling one point at a time, O(n²).
  const middle = (from + to) / 2;
  let farthest = from + 1;
  let distance = -1;
  for (let i = from + 1; i < to; i++) {
    const d = segmentApproach(points[i][0], points[i][1], ax, ay, bx, by).distance;
    if (d > distance || (d === distance && Math.abs(i - middle) < Math.abs(farthest - middle))) {
      distance = d;
      farthest = i;
    }
  }
  return { from, to, farthest, distance };
}

/** Larger distance first; on equal distances the earlier span, so the result never depends on heap order. */
function comesFirst(a: Span, b: Span): boolean {
  return a.distance > b.distance || (a.distance === b.distance && a.from < b.from);
}

/** A binary max-heap of spans, keyed by `comesFirst`. */
class SpanHeap {
  private readonly items: Span[] = [];

  get size(): number {
    return this.items.length;
  }

  peek(): Span | undefined {
    return this.items[0];
  }

  push(span: Span): void {
    const items = this.items;
    items.push(span);
    let i = items.length - 1;
    while (i > 0) {
      const parent = (i - 1) >> 1;
      if (!comesFirst(items[i], items[parent])) break;
      [items[i], items[parent]] = [items[parent], items[i]];
      i = parent;
    }
  }

  pop(): Span | undefined {
    const items = this.items;
    const top = items[0];
    const last = items.pop();
    if (items.length > 0 && last !== undefined) {
      items[0] = last;
      let i = 0;
      for (;;) {
        const left = 2 * i + 1;
        const right = left + 1;
        let first = i;
        if (left < items.length && comesFirst(items[left], items[first])) first = left;
        if (right < items.length && comesFirst(items[right], items[first])) first = right;
        if (first === i) break;
        [items[i], items[first]] = [items[first], items[i]];
        i = first;
      }
    }
    return top;
  }
}

/**
 * Ramer–Douglas–Peucker simplification (Ramer 1972; Douglas & Peucker 1973 — citations from memory), run best-first: starting
 * from the two ends, repeatedly keep the point farthest from the kept segment spanning it, until
 * every dropped point lies within `tolerance` of its segment or `maxPoints` are kept. Without the cap
 * this keeps exactly the points the classic recursive form keeps; with it, the cap spends the points
 * on the largest deviations first, and `maxDeviation` says how close the result came.
 *
 * Distance is to the segment (not the infinite line), so `maxDeviation` bounds each dropped point's
 * distance from the simplified polyline itself. Cost O(n log n) when the splits fall near the middle of their spans, O(n·kept) at worst.
 */
export function polylineSimplification(
  points: ReadonlyArray<readonly [number, number]>,
  tolerance: number,
  maxPoints: number = Number.POSITIVE_INFINITY,
): PolylineSimplification {
  assert(Number.isFinite(tolerance) && tolerance >= 0, 'polylineSimplification: tolerance must be finite and >= 0');
  assert(maxPoints >= 2, 'polylineSimplification: maxPoints must be >= 2 (the two ends)');
  if (points.length <= 2) return { keptIndices: points.map((_, i) => i), maxDeviation: 0 };

  const kept = [0, points.length - 1];
  const heap = new SpanHeap();
  const whole = spanOf(points, 0, points.length - 1);
  if (whole) heap.push(whole);
  while (heap.size > 0 && kept.length < maxPoints) {
    const top = heap.peek() as Span;
    if (top.distance <= tolerance) break;
    heap.pop();
    kept.push(top.farthest);
    const left = spanOf(points, top.from, top.farthest);
    const right = spanOf(points, top.farthest, top.to);
    if (left) heap.push(left);
    if (right) heap.push(right);
  }
  kept.sort((a, b) => a - b);
  return { keptIndices: kept, maxDeviation: heap.peek()?.distance ?? 0 };
}
