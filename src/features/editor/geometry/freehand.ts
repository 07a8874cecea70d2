import { assert } from '../../../../shared/assert';
import { LIMITS } from '../../../../shared/limits';
import type { CanvasScale } from './canvas-scale';
import type { PixelPoint } from './canvas-units';
import { minPointGapM } from './point-insertion';
import { polylineSimplification } from './polyline-simplification';

/** Default simplification tolerance: about the width of the drawn line, so the result looks like the stroke. */
export const FREEHAND_TOLERANCE_PX = 1.5;

/** Default cap on the interior points a stroke becomes: smooth enough to see, light enough to share and project. */
export const FREEHAND_MAX_POINTS = 200;

export interface FreehandOptions {
  /** Largest distance, in pixels, a kept stroke sample may lie from the result as drawn. Default 1.5. */
  tolerancePx?: number;
  /** Most interior points to return. Default 200; never more than LIMITS.maxPolylinePoints − 2. */
  maxPoints?: number;
}

export type FreehandPolyline =
  | {
      ok: true;
      /** Interior points only, [x m, y m], x strictly increasing with at least the minimum gap, inside (0, L). */
      points: Array<[number, number]>;
      /** Largest distance, in pixels, of a kept sample from the result (≤ tolerancePx unless the cap was reached). */
      maxDeviationPx: number;
      /** Samples left out before simplifying: not finite, backtracking, or off the string. */
      droppedSampleCount: number;
    }
  | { ok: false; reason: string };

/**
 * Turns a freehand stroke (pointer samples in pixels, in the order drawn) into a displacement
 * polyline in metres:
 *
 * 1. Direction. A stroke may be drawn either way; if it ends left of where it began it is read
 *    from its end, so a right-to-left stroke is as good as a left-to-right one.
 * 2. Monotonic x. A sample is kept only if it lies at least the minimum gap (L × MIN_POINT_GAP_FRACTION)
 *    beyond the farthest x reached so far. Samples that go backwards are dropped, not merged: the first
 *    pass over each x wins, and the pen has to pass its farthest point before it draws again. (The
 *    alternative, the stroke's envelope, has no sign to choose when a stroke crosses the axis.)
 * 3. Clip. Samples closer than the gap to a support, or beyond it, are dropped; the supports stay at
 *    (0, 0) and (L, 0). A stroke that leaves past the far support and comes back draws nothing more.
 * 4. Simplify, in pixels so the tolerance means the same in x and y whatever the exaggeration:
 *    Ramer–Douglas–Peucker over [left support, …kept samples, right support], the supports fixed.
 *    Every kept sample then lies within tolerancePx of the polyline as drawn, supports included,
 *    unless maxPoints ran out first (then maxDeviationPx says by how much).
 *
 * The result is a subset of the kept samples, so x stays strictly increasing with at least the gap
 * between neighbours, and the whole polyline passes validatePatch. A stroke with no sample on the
 * string is refused.
 */
export function polylineFromStroke(stroke: ReadonlyArray<PixelPoint>, scale: CanvasScale, options: FreehandOptions = {}): FreehandPolyline {
  const tolerancePx = options.tolerancePx ?? FREEHAND_TOLERANCE_PX;
  const requestedMax = options.maxPoints ?? FREEHAND_MAX_POINTS;
  assert(Number.isFinite(tolerancePx) && tolerancePx >= 0, 'polylineFromStroke: tolerancePx must be finite and >= 0');
  assert(Number.isInteger(requestedMax) && requestedMax >= 1, 'polylineFromStroke: maxPoints must be an integer >= 1');
  const maxInterior = Math.min(requestedMax, LIMITS.maxPolylinePoints - 2);

  const finite = stroke.filter(([x, y]) => Number.isFinite(x) && Number.isFinite(y));
  const ordered = finite.length > 1 && finite[finite.length - 1][0] < finite[0][0] ? [...finite].reverse() : finite;

  const { lengthM } = scale;
  const gapM = minPointGapM(lengthM);
  const samplesPx: [number, number][] = [[scale.xToPx(0), scale.yToPx(0)]];
  const samplesM: [number, number][] = [[0, 0]];
  let frontM = Number.NEGATIVE_INFINITY;
  for (const [xPx, yPx] of ordered) {
    const xM = scale.pxToX(xPx);
    if (!(xM >= frontM + gapM)) continue;
    frontM = xM;
    if (!(xM >= gapM && xM <= lengthM - gapM)) continue;
    samplesPx.push([xPx, yPx]);
    samplesM.push([xM, scale.pxToY(yPx)]);
  }
  samplesPx.push([scale.xToPx(lengthM), scale.yToPx(0)]);
  samplesM.push([lengthM, 0]);

  const keptSampleCount = samplesM.length - 2;
  if (keptSampleCount === 0) return { ok: false, reason: 'the stroke does not cross the string between its supports' };

  const { keptIndices, maxDeviation } = polylineSimplification(samplesPx, tolerancePx, maxInterior + 2);
  return {
    ok: true,
    points: keptIndices.slice(1, -1).map((i) => samplesM[i]),
    maxDeviationPx: maxDeviation,
    droppedSampleCount: stroke.length - keptSampleCount,
  };
}
