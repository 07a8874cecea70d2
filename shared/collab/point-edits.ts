import type * as Y from 'yjs';
import type { Metres } from '../units';
import { docPoint, patchDoc, type DocPoint } from './patch-doc';

/** Closest two points may come, as a fraction of the string's length (keeps x strictly increasing). */
export const MIN_POINT_GAP_FRACTION = 1e-6;

export type EditResult = { ok: true } | { ok: false; reason: string };

type Layer = 'displacement' | 'velocity';

function layerArray(doc: Y.Doc, layer: Layer): Y.Array<DocPoint> {
  return patchDoc(doc)[layer];
}

function lengthOf(doc: Y.Doc): Metres {
  return patchDoc(doc).string.get('lengthM') as number;
}

/**
 * Why a layer cannot be edited point by point: it is made by plucks (the shape) or strikes (the
 * strike layer), whose polylines are remade from them on every change. Null when it can.
 */
export function layerMadeByPartsReason(doc: Y.Doc, layer: Layer): string | null {
  const kind = layer === 'displacement' ? 'pluck' : 'strike';
  const made = patchDoc(doc).excitationParts.toArray().some((part) => typeof part?.get === 'function' && part.get('kind') === kind);
  return made ? `the ${layer === 'displacement' ? 'shape' : 'strike layer'} is made by a ${kind}: drag its handle, or convert it to free points to edit it point by point` : null;
}

/** The x range a point may move in: strictly between its neighbours (or the supports). */
export function allowedRangeM(doc: Y.Doc, layer: Layer, index: number): { minM: Metres; maxM: Metres } {
  const array = layerArray(doc, layer);
  const lengthM = lengthOf(doc);
  const gap = lengthM * MIN_POINT_GAP_FRACTION;
  const previous = index > 0 ? (array.get(index - 1).get('x') as number) : 0;
  const next = index < array.length - 1 ? (array.get(index + 1).get('x') as number) : lengthM;
  return { minM: previous + gap, maxM: next - gap };
}

/**
 * Moves an interior point, clamping x between its neighbours so a drag can never pass one, and
 * refusing values that are not finite. Returns what was done.
 */
export function movePoint(doc: Y.Doc, layer: Layer, index: number, xM: Metres, value: number, origin?: unknown): EditResult {
  const array = layerArray(doc, layer);
  if (!Number.isInteger(index) || index < 0 || index >= array.length) return { ok: false, reason: `no point ${index} on the ${layer} layer` };
  if (!Number.isFinite(xM) || !Number.isFinite(value)) return { ok: false, reason: 'x and value must be finite numbers' };
  const made = layerMadeByPartsReason(doc, layer);
  if (made) return { ok: false, reason: made };
  const { minM, maxM } = allowedRangeM(doc, layer, index);
  if (!(minM < maxM)) return { ok: false, reason: 'no room to move this point' };
  const point = array.get(index);
  doc.transact(() => {
    point.set('x', Math.min(maxM, Math.max(minM, xM)));
    point.set('y', value);
  }, origin);
  return { ok: true };
}

/** Adds a point where x falls between two existing ones; refuses x off the string or on an existing point. */
export function insertPoint(doc: Y.Doc, layer: Layer, xM: Metres, value: number, origin?: unknown): EditResult & { index?: number } {
  const lengthM = lengthOf(doc);
  if (!Number.isFinite(xM) || !Number.isFinite(value)) return { ok: false, reason: 'x and value must be finite numbers' };
  if (!(xM > 0 && xM < lengthM)) return { ok: false, reason: `x must lie between the supports (0 and ${lengthM} m)` };
  const made = layerMadeByPartsReason(doc, layer);
  if (made) return { ok: false, reason: made };
  const array = layerArray(doc, layer);
  let index = 0;
  while (index < array.length && (array.get(index).get('x') as number) < xM) index++;
  if (index < array.length && (array.get(index).get('x') as number) === xM) return { ok: false, reason: 'a point already sits at this x' };
  doc.transact(() => array.insert(index, [docPoint(xM, value)]), origin);
  return { ok: true, index };
}

export function deletePoint(doc: Y.Doc, layer: Layer, index: number, origin?: unknown): EditResult {
  const array = layerArray(doc, layer);
  if (!Number.isInteger(index) || index < 0 || index >= array.length) return { ok: false, reason: `no point ${index} on the ${layer} layer` };
  const made = layerMadeByPartsReason(doc, layer);
  if (made) return { ok: false, reason: made };
  doc.transact(() => array.delete(index, 1), origin);
  return { ok: true };
}

/**
 * Changes the string's length and scales every point's x with it, so a pluck stays at the same
 * fraction of the string (and the pickup too, clamped inside the string).
 */
export function setLengthM(doc: Y.Doc, lengthM: Metres, origin?: unknown): EditResult {
  if (!(Number.isFinite(lengthM) && lengthM > 0)) return { ok: false, reason: 'length must be > 0' };
  const parts = patchDoc(doc);
  const old = parts.string.get('lengthM') as number;
  const scale = lengthM / old;
  doc.transact(() => {
    parts.string.set('lengthM', lengthM);
    for (const array of [parts.displacement, parts.velocity]) {
      array.forEach((point) => point.set('x', (point.get('x') as number) * scale));
    }
    // A pluck's or strike's shape scales exactly with its position and width (pluckShape's heights
    // depend on x only through x/p and w/p), so scaling both keeps the parts and the points in step.
    parts.excitationParts.forEach((part) => {
      for (const key of ['positionM', 'widthM']) {
        const value = part.get(key);
        if (typeof value === 'number') part.set(key, value * scale);
      }
    });
    const pickup = parts.pickup.get('positionM') as number;
    parts.pickup.set('positionM', Math.min(lengthM * (1 - MIN_POINT_GAP_FRACTION), pickup * scale));
  }, origin);
  return { ok: true };
}

/**
 * Replaces every interior point of a layer in one transaction (a freehand stroke, a pluck laid
 * down): one undo step for the person who made it. Refuses points that are off the string, out of
 * order, closer than the minimum gap or not finite, and then changes nothing.
 */
export function replaceLayerPoints(doc: Y.Doc, layer: Layer, interior: ReadonlyArray<readonly [number, number]>, origin?: unknown): EditResult {
  const made = layerMadeByPartsReason(doc, layer);
  if (made) return { ok: false, reason: made };
  const lengthM = lengthOf(doc);
  const gap = lengthM * MIN_POINT_GAP_FRACTION;
  let previous = 0;
  for (const [x, value] of interior) {
    if (!Number.isFinite(x) || !Number.isFinite(value)) return { ok: false, reason: 'x and value must be finite numbers' };
    if (!(x >= previous + gap && x <= lengthM - gap)) return { ok: false, reason: 'points must lie between the supports in increasing x' };
    previous = x;
  }
  const array = layerArray(doc, layer);
  doc.transact(() => {
    if (array.length > 0) array.delete(0, array.length);
    if (interior.length > 0) array.insert(0, interior.map(([x, value]) => docPoint(x, value)));
  }, origin);
  return { ok: true };
}
