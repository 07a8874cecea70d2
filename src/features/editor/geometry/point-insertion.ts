import { assert } from '../../../../shared/assert';
import { MIN_POINT_GAP_FRACTION } from '../../../../shared/collab/point-edits';
import type { Polyline } from '../../../../shared/patch/patch-schema';
import type { Metres } from '../../../../shared/units';
import type { CanvasScale } from './canvas-scale';
import type { Pixels } from './canvas-units';
import { segmentApproach } from './segment-distance';

/**
 * The rules here match `allowedRangeM` and `movePoint` in shared/collab/point-edits.ts: a point
 * keeps at least gap = L × MIN_POINT_GAP_FRACTION from each neighbour, the supports at 0 and L
 * counting as neighbours. Point lists named `interior` hold the interior points only (as the shared
 * document stores them), sorted by x.
 */

export type InsertionIndex = { ok: true; index: number } | { ok: false; reason: string };

/** Smallest distance two neighbouring points may keep on a string of this length. */
export function minPointGapM(lengthM: Metres): Metres {
  return lengthM * MIN_POINT_GAP_FRACTION;
}

/** First index whose x is greater than xM (binary search; `interior` is sorted by x). */
function firstIndexAfter(interior: Polyline, xM: Metres): number {
  let low = 0;
  let high = interior.length;
  while (low < high) {
    const middle = (low + high) >>> 1;
    if (interior[middle][0] > xM) high = middle;
    else low = middle + 1;
  }
  return low;
}

/**
 * Where a new point at xM goes in the interior list: the index it will have once inserted. Refused
 * when xM is not finite, off the string (xM ≤ 0 or ≥ L), or closer than the minimum gap to a point
 * or a support, i.e. unless previous + gap ≤ xM ≤ next − gap.
 */
export function insertionIndex(interior: Polyline, xM: Metres, lengthM: Metres): InsertionIndex {
  if (!Number.isFinite(xM)) return { ok: false, reason: 'x must be a finite number' };
  if (!(xM > 0 && xM < lengthM)) return { ok: false, reason: `x must lie between the supports (0 and ${lengthM} m)` };
  const gapM = minPointGapM(lengthM);
  const index = firstIndexAfter(interior, xM);
  const previousM = index > 0 ? interior[index - 1][0] : 0;
  const nextM = index < interior.length ? interior[index][0] : lengthM;
  if (xM < previousM + gapM) {
    return { ok: false, reason: index > 0 ? `too close to point ${index - 1}` : 'too close to the left support' };
  }
  if (xM > nextM - gapM) {
    return { ok: false, reason: index < interior.length ? `too close to point ${index}` : 'too close to the right support' };
  }
  return { ok: true, index };
}

export interface NearestSegment {
  /** Segment i runs from points[i] to points[i + 1]; a point added on it becomes points[i + 1] (interior index i). */
  segmentIndex: number;
  /** Distance from the click to the segment as drawn, in pixels (to the nearer end if the foot falls beyond one). */
  distancePx: number;
  /** Where the foot of the perpendicular falls: a + t·(b − a), t in [0, 1]. */
  alongFraction: number;
  /** The foot in string coordinates: on the segment, since the canvas map is affine in each axis. */
  xM: Metres;
  yM: Metres;
}

/**
 * For "click the line to add a point": the segment of the drawn polyline (`points` with both
 * supports) nearest the click, measured in pixels so the hit area is the same in x and y whatever the
 * vertical exaggeration. On a tie (a click nearest a shared vertex) the lower segment wins.
 * Returns null for fewer than two points, which draw no line.
 */
export function nearestSegment(points: Polyline, xPx: Pixels, yPx: Pixels, scale: CanvasScale): NearestSegment | null {
  if (points.length < 2) return null;
  let best: NearestSegment | null = null;
  let ax = scale.xToPx(points[0][0]);
  let ay = scale.yToPx(points[0][1]);
  for (let i = 0; i + 1 < points.length; i++) {
    const [bxM, byM] = points[i + 1];
    const bx = scale.xToPx(bxM);
    const by = scale.yToPx(byM);
    const approach = segmentApproach(xPx, yPx, ax, ay, bx, by);
    if (best === null || approach.distance < best.distancePx) {
      const [axM, ayM] = points[i];
      const t = approach.alongFraction;
      best = { segmentIndex: i, distancePx: approach.distance, alongFraction: t, xM: axM + t * (bxM - axM), yM: ayM + t * (byM - ayM) };
    }
    ax = bx;
    ay = by;
  }
  return best;
}

/**
 * The x a dragged interior point may take: xM clamped to [previous + gap, next − gap], so a drag can
 * never pass (or land on) a neighbour or a support. When there is no room (neighbours closer than
 * two gaps) or xM is not finite, the point stays where it is. An index off the list is a bug.
 */
export function clampDrag(interior: Polyline, index: number, xM: Metres, lengthM: Metres): Metres {
  assert(Number.isInteger(index) && index >= 0 && index < interior.length, `clampDrag: no interior point ${index}`);
  const currentM = interior[index][0];
  if (!Number.isFinite(xM)) return currentM;
  const gapM = minPointGapM(lengthM);
  const minM = (index > 0 ? interior[index - 1][0] : 0) + gapM;
  const maxM = (index + 1 < interior.length ? interior[index + 1][0] : lengthM) - gapM;
  if (!(minM <= maxM)) return currentM;
  return Math.min(maxM, Math.max(minM, xM));
}
