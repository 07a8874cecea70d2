import type * as Y from 'yjs';
import type { Metres } from '../units';
import { patchDoc } from './doc-layout';
import type { EditResult } from './point-edits';

/** How close to a support a dragged pickup may come, as a fraction of the string's length. */
export const PICKUP_EDGE_FRACTION = 0.001;

/**
 * Moves the pickup along the string (`pickup.positionM`), clamped strictly between the supports so
 * a drag or a key press can never put it on or past one. Light enough to run on every pointer move;
 * a value that is not finite is refused and nothing is written.
 */
export function movePickup(doc: Y.Doc, positionM: Metres, origin?: unknown): EditResult {
  if (!Number.isFinite(positionM)) return { ok: false, reason: 'the pickup position must be a finite number of metres' };
  const parts = patchDoc(doc);
  const lengthM = parts.string.get('lengthM') as number;
  const clampedM = Math.min(lengthM * (1 - PICKUP_EDGE_FRACTION), Math.max(lengthM * PICKUP_EDGE_FRACTION, positionM));
  doc.transact(() => parts.pickup.set('positionM', clampedM), origin);
  return { ok: true };
}

/** Adds the strike layer (the initial velocity, zero until points are added). */
export function addStrikeLayer(doc: Y.Doc, origin?: unknown): void {
  doc.transact(() => patchDoc(doc).meta.set('hasVelocity', true), origin);
}
