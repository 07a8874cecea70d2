import { LIMITS } from '../limits';
import type { ExcitationPart, PluckPart, StrikePart } from '../patch/excitation-part';
import type { Metres } from '../units';
import { PLUCK_CAP_POINTS, pluckShape } from './pluck-shape';
import { MIN_POINT_GAP_FRACTION } from './point-edits';

/** Interior points of a polyline (the supports (0, 0) and (L, 0) implicit), x strictly increasing. */
export type InteriorPoints = Array<[number, number]>;

export type PartPolyline = { ok: true; points: InteriorPoints } | { ok: false; reason: string };

const gapOf = (lengthM: Metres): Metres => lengthM * MIN_POINT_GAP_FRACTION;

/** Whether a contact of width w centred at p fits on the string with the minimum gap to each support. */
function contactFits(lengthM: Metres, positionM: Metres, widthM: Metres): boolean {
  const gapM = gapOf(lengthM);
  return positionM >= widthM / 2 + gapM && positionM <= lengthM - widthM / 2 - gapM;
}

/**
 * A pluck's displacement. A fingertip's pad: the rounded top of `pluckShape` (two half-parabolas
 * tangent to the straight lines from the supports, peak h at p). A pick's edge: the string lies
 * straight along the edge, so the top is flat at h from p − w/2 to p + w/2 (with p itself kept as a
 * point, the apex a handle sits on) and bends at the edge's two corners.
 */
export function pluckPolyline(lengthM: Metres, part: PluckPart): PartPolyline {
  if (part.contact === 'fingertip') {
    const shape = pluckShape({ lengthM, positionM: part.positionM, heightM: part.heightM, widthM: part.widthM });
    return shape.ok ? { ok: true, points: shape.points } : shape;
  }
  const { positionM: p, heightM: h, widthM: w } = part;
  if (![lengthM, p, h, w].every(Number.isFinite)) return { ok: false, reason: 'position, height and width must be finite numbers' };
  if (!contactFits(lengthM, p, w)) return { ok: false, reason: `a contact ${w} m wide at ${p} m reaches past a support; move it inward or make it narrower` };
  // Below two gaps the edge's corners would crowd the apex: the pick is then a knife edge at p.
  if (w / 2 < gapOf(lengthM)) return { ok: true, points: [[p, h]] };
  return { ok: true, points: [[p - w / 2, h], [p, h], [p + w / 2, h]] };
}

/**
 * A strike's velocity: a raised cosine across the hammer's face, v(x) = V·½(1 + cos(2π(x − p)/w))
 * on [p − w/2, p + w/2] and zero elsewhere, so the velocity is V at the centre and falls smoothly
 * to rest at the face's edges (a chosen smooth profile, exact in its own terms; a real hammer's
 * pressure profile depends on its felt). Sampled evenly, the edges and the centre included.
 */
export function strikePolyline(lengthM: Metres, part: StrikePart): PartPolyline {
  const { positionM: p, velocityMPerS: v, widthM: w } = part;
  if (![lengthM, p, v, w].every(Number.isFinite)) return { ok: false, reason: 'position, velocity and width must be finite numbers' };
  if (!contactFits(lengthM, p, w)) return { ok: false, reason: `a hammer ${w} m wide at ${p} m reaches past a support; move it inward or make it narrower` };
  const steps = Math.min(PLUCK_CAP_POINTS - 1, Math.floor(w / gapOf(lengthM)));
  if (steps < 2) return { ok: true, points: [[p, v]] };
  const points: InteriorPoints = [];
  for (let j = 0; j <= steps; j++) {
    const x = j === steps ? p + w / 2 : p - w / 2 + (w * j) / steps;
    const value = j === 0 || j === steps ? 0 : (v * (1 + Math.cos((2 * Math.PI * (x - p)) / w))) / 2;
    points.push([x, value]);
  }
  return { ok: true, points };
}

export function partPolyline(lengthM: Metres, part: ExcitationPart): PartPolyline {
  return part.kind === 'pluck' ? pluckPolyline(lengthM, part) : strikePolyline(lengthM, part);
}

/** A polyline's value at x by linear interpolation (the supports included); exact at its own points. */
function valueAt(full: ReadonlyArray<readonly [number, number]>, xM: number): number {
  let low = 0;
  let high = full.length - 1;
  while (high - low > 1) {
    const middle = (low + high) >>> 1;
    if (full[middle][0] <= xM) low = middle;
    else high = middle;
  }
  const [x0, y0] = full[low];
  const [x1, y1] = full[high];
  if (xM === x0) return y0;
  if (xM === x1) return y1;
  return y0 + ((y1 - y0) * (xM - x0)) / (x1 - x0);
}

/**
 * The sum of several polylines on one string, itself a polyline: every one's points, each valued
 * at the sum of all of them there. Superposition is exact for the linear string: the displacement
 * (or velocity) of two plucks at once is the sum of each one's. A point closer than the minimum gap
 * to the one before it is dropped (the sum is still exact at the points kept, and off by at most
 * slope × gap between them). One polyline comes back unchanged.
 */
export function sumPolylines(lengthM: Metres, layers: readonly InteriorPoints[]): PartPolyline {
  if (layers.length === 1) return { ok: true, points: layers[0].map(([x, y]): [number, number] => [x, y]) };
  const gapM = gapOf(lengthM);
  const fulls = layers.map((interior) => [[0, 0] as const, ...interior, [lengthM, 0] as const]);
  const xs = layers.flatMap((interior) => interior.map(([x]) => x)).sort((a, b) => a - b);
  const kept: number[] = [];
  for (const x of xs) if (kept.length === 0 ? x >= gapM : x >= kept[kept.length - 1] + gapM) kept.push(x);
  while (kept.length > 0 && kept[kept.length - 1] > lengthM - gapM) kept.pop();
  if (kept.length > LIMITS.maxPolylinePoints - 2) return { ok: false, reason: `together these make more than ${LIMITS.maxPolylinePoints} points` };
  return { ok: true, points: kept.map((x): [number, number] => [x, fulls.reduce((sum, full) => sum + valueAt(full, x), 0)]) };
}

export interface PartsPolylines {
  ok: true;
  /** The displacement the plucks make, or null when there is no pluck (the layer is not theirs). */
  displacement: InteriorPoints | null;
  /** The velocity the strikes make, or null when there is no strike. */
  velocity: InteriorPoints | null;
}

/**
 * The excitation's polylines made from its parts: the plucks' displacements summed, the strikes'
 * velocities summed. Refused with the first part's problem (numbered from 1) if one cannot be made.
 */
export function polylinesFromParts(lengthM: Metres, parts: readonly ExcitationPart[]): PartsPolylines | { ok: false; reason: string } {
  const made: Record<'pluck' | 'strike', InteriorPoints[]> = { pluck: [], strike: [] };
  for (const [index, part] of parts.entries()) {
    const line = partPolyline(lengthM, part);
    if (!line.ok) return { ok: false, reason: `${part.kind} ${index + 1}: ${line.reason}` };
    made[part.kind].push(line.points);
  }
  const layer = (lines: InteriorPoints[]): PartPolyline | null => (lines.length === 0 ? null : sumPolylines(lengthM, lines));
  const displacement = layer(made.pluck);
  const velocity = layer(made.strike);
  if (displacement && !displacement.ok) return displacement;
  if (velocity && !velocity.ok) return velocity;
  return { ok: true, displacement: displacement?.points ?? null, velocity: velocity?.points ?? null };
}
