import { LIMITS } from '../limits';
import type { Metres } from '../units';
import { MIN_POINT_GAP_FRACTION } from './point-edits';

/** Smallest distance two neighbouring points may keep on a string of this length (as `allowedRangeM` keeps). */
const minPointGapM = (lengthM: Metres): Metres => lengthM * MIN_POINT_GAP_FRACTION;

/** Default number of points sampling the rounded top: the peak and six on each side. */
export const PLUCK_CAP_POINTS = 13;

export interface PluckRequest {
  /** The string's length L. */
  lengthM: Metres;
  /** Where the finger or pick meets the string, p: the peak and the centre of the contact. */
  positionM: Metres;
  /** Displacement at p, h (negative pulls the other way). */
  heightM: Metres;
  /** Width of the contact, w: the rounded top spans [p − w/2, p + w/2]. */
  widthM: Metres;
  /** Points sampling the rounded top, the peak included (integer ≥ 3). Default 13. */
  points?: number;
}

export type PluckShape =
  | {
      ok: true;
      /** Interior points only; the supports (0, 0) and (L, 0) are implicit. */
      points: Array<[number, number]>;
      /** Where the rounded top meets the straight lines: p − w/2 and p + w/2. */
      contactFromM: Metres;
      contactToM: Metres;
    }
  | { ok: false; reason: string };

/**
 * A pluck of given position, height and width: straight lines from the supports, tangent to a
 * rounded top of width w centred at p, whose peak is exactly h at p.
 *
 * The top is two half-parabolas with their vertex at (p, h), so the peak is flat and the shape has
 * no corner there:
 *   y(x) = h − c₁ (x − p)²  on [a, p],  a = p − w/2,
 *   y(x) = h − c₂ (x − p)²  on [p, b],  b = p + w/2.
 * Asking the line from (0, 0) to be tangent at a, y(a) = a·y′(a) with y′(a) = c₁·w, gives
 *   c₁ = h / (w (p − w/4)),   and from (L, 0) at b:   c₂ = h / (w (L − p − w/4)).
 * Value and slope are then continuous everywhere (only the curvature steps, at a, p and b). One
 * parabola cannot do this off the centre: its slopes at a and b would be equal and opposite, but
 * the two lines have different slopes. As w → 0 the lines tend to those of the triangular
 * (knife-edge) pluck through (p, h).
 *
 * Each half is sampled evenly in x (even spacing is best for a parabola's constant curvature), with
 * a, p and b as points. If w is so small that the samples would come closer than the minimum gap,
 * fewer are used; below two gaps only the peak remains, which is the knife-edge pluck itself.
 *
 * Refused: non-finite inputs, L ≤ 0, p not between the supports, w ≤ 0, a contact reaching within
 * the minimum gap of a support (w/2 + gap > p or > L − p), or a bad point count.
 */
export function pluckShape(request: PluckRequest): PluckShape {
  const { lengthM: L, positionM: p, heightM: h, widthM: w } = request;
  const capPoints = request.points ?? PLUCK_CAP_POINTS;
  if (![L, p, h, w].every(Number.isFinite)) return { ok: false, reason: 'length, position, height and width must be finite numbers' };
  if (!(L > 0)) return { ok: false, reason: 'the string length must be > 0' };
  if (!(p > 0 && p < L)) return { ok: false, reason: `the pluck position must lie between the supports (0 and ${L} m)` };
  if (!(w > 0)) return { ok: false, reason: 'the contact width must be > 0 (a finger or pick is not a knife edge)' };
  if (!(Number.isInteger(capPoints) && capPoints >= 3 && capPoints <= LIMITS.maxPolylinePoints - 2)) {
    return { ok: false, reason: `the rounded top needs a whole number of points from 3 to ${LIMITS.maxPolylinePoints - 2}` };
  }
  const gapM = minPointGapM(L);
  // The same bounds as clampPluckPositionM, written the same way, so a clamped position is always accepted.
  if (!(p >= w / 2 + gapM && p <= L - w / 2 - gapM)) {
    return { ok: false, reason: `a contact ${w} m wide at ${p} m reaches past a support; move it inward or make it narrower` };
  }
  const a = p - w / 2;
  const b = p + w / 2;

  const c1 = h / (w * (p - w / 4));
  const c2 = h / (w * (L - p - w / 4));
  const halfM = w / 2;
  const widestSteps = Math.floor(halfM / gapM);
  const leftSteps = Math.min(Math.ceil((capPoints - 1) / 2), widestSteps);
  const rightSteps = Math.min(Math.floor((capPoints - 1) / 2), widestSteps);
  const points: [number, number][] = [];
  if (leftSteps === 0 || rightSteps === 0) {
    points.push([p, h]);
    return { ok: true, points, contactFromM: p, contactToM: p };
  }
  for (let j = 0; j < leftSteps; j++) {
    const x = j === 0 ? a : a + (halfM * j) / leftSteps;
    points.push([x, h - c1 * (x - p) * (x - p)]);
  }
  points.push([p, h]);
  for (let j = 1; j <= rightSteps; j++) {
    const x = j === rightSteps ? b : p + (halfM * j) / rightSteps;
    points.push([x, h - c2 * (x - p) * (x - p)]);
  }
  return { ok: true, points, contactFromM: a, contactToM: b };
}

/**
 * The position nearest positionM at which a contact of width w fits on the string with the minimum
 * gap to each support: positionM clamped to [w/2 + gap, L − w/2 − gap]. For the pluck tool while it
 * is dragged toward a support. Null when the contact cannot fit anywhere (w > L − 2·gap).
 */
export function clampPluckPositionM(lengthM: Metres, positionM: Metres, widthM: Metres): Metres | null {
  const gapM = minPointGapM(lengthM);
  const minM = widthM / 2 + gapM;
  const maxM = lengthM - widthM / 2 - gapM;
  if (!(Number.isFinite(positionM) && minM <= maxM)) return null;
  return Math.min(maxM, Math.max(minM, positionM));
}
