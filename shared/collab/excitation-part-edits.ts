import * as Y from 'yjs';
import { LIMITS } from '../limits';
import { plainPartIssue } from '../patch/part-issue-words';
import { excitationPartSchema, excitationPartsSchema, partsMakeLayer, type ExcitationPart } from '../patch/excitation-part';
import type { Metres } from '../units';
import { polylinesFromParts, type InteriorPoints } from './excitation-polyline';
import { docExcitationPart, docPoint, patchDoc, type DocPoint } from './patch-doc';
import { MIN_POINT_GAP_FRACTION, type EditResult } from './point-edits';

/**
 * Edits of the plucks and strikes an excitation is made of (`excitationParts` in the document).
 * Every edit writes the parts and the polylines they make in one transaction, so the patch's exact
 * polylines always follow the parts, and one undo takes back both. A layer is rewritten when a part
 * of its kind is there before or after the edit: removing the last pluck leaves the string at rest.
 */

/** The document's parts as checked values, or null when one of them is not a valid pluck or strike. */
export function readExcitationParts(doc: Y.Doc): ExcitationPart[] | null {
  const parsed = excitationPartsSchema.safeParse(patchDoc(doc).excitationParts.toArray().map((part) => (part instanceof Y.Map ? part.toJSON() : part)));
  return parsed.success ? parsed.data : null;
}

/** Sets a layer's interior points, moving the existing point maps when the count is unchanged (a drag). */
function writeLayer(array: Y.Array<DocPoint>, interior: InteriorPoints): void {
  if (array.length === interior.length) {
    interior.forEach(([x, value], index) => {
      const point = array.get(index);
      if (point.get('x') !== x) point.set('x', x);
      if (point.get('y') !== value) point.set('y', value);
    });
    return;
  }
  if (array.length > 0) array.delete(0, array.length);
  if (interior.length > 0) array.insert(0, interior.map(([x, value]) => docPoint(x, value)));
}

/** Makes the polylines for `next`, or says why not; writes nothing itself. */
function layersFor(doc: Y.Doc, before: readonly ExcitationPart[], next: readonly ExcitationPart[]): { ok: false; reason: string } | { ok: true; write: () => void } {
  const parts = patchDoc(doc);
  const lengthM = parts.string.get('lengthM') as number;
  const made = polylinesFromParts(lengthM, next);
  if (!made.ok) return made;
  return {
    ok: true,
    write: () => {
      if (partsMakeLayer(before, 'displacement') || made.displacement) writeLayer(parts.displacement, made.displacement ?? []);
      if (partsMakeLayer(before, 'velocity') || made.velocity) writeLayer(parts.velocity, made.velocity ?? []);
      if (made.velocity && !parts.meta.get('hasVelocity')) parts.meta.set('hasVelocity', true);
    },
  };
}

/** "pluck 2", "strike 1": a part named by its kind and its number within that kind. */
function partName(parts: readonly unknown[], index: number): string {
  const kind = (parts[index] as { kind?: unknown } | undefined)?.kind;
  const named = kind === 'strike' ? 'strike' : 'pluck';
  const ordinal = parts.slice(0, index + 1).filter((part) => ((part as { kind?: unknown })?.kind === 'strike' ? 'strike' : 'pluck') === named).length;
  return `${named} ${ordinal}`;
}

function checkedParts(parts: readonly unknown[]): { ok: true; parts: ExcitationPart[] } | { ok: false; reason: string } {
  const parsed = excitationPartsSchema.safeParse(parts);
  if (parsed.success) return { ok: true, parts: parsed.data };
  return { ok: false, reason: plainPartIssue(parsed.error.issues[0], (index) => partName(parts, index)) };
}

/** Replaces every part (a pluck laid down, a preset's parts) and the polylines they make, in one transaction. */
export function setExcitationParts(doc: Y.Doc, parts: readonly ExcitationPart[], origin?: unknown): EditResult {
  const checked = checkedParts(parts);
  if (!checked.ok) return checked;
  const before = readExcitationParts(doc) ?? [];
  const layers = layersFor(doc, before, checked.parts);
  if (!layers.ok) return layers;
  const array = patchDoc(doc).excitationParts;
  doc.transact(() => {
    if (array.length > 0) array.delete(0, array.length);
    if (checked.parts.length > 0) array.insert(0, checked.parts.map((part) => docExcitationPart(part)));
    layers.write();
  }, origin);
  return { ok: true };
}

/** Adds a pluck or strike to the ones already there (a double pluck, a pluck plus a strike). */
export function addExcitationPart(doc: Y.Doc, part: ExcitationPart, origin?: unknown): EditResult {
  const before = readExcitationParts(doc);
  if (!before) return { ok: false, reason: 'the plucks and strikes cannot be read; convert the shape to free points first' };
  if (before.length >= LIMITS.maxExcitationParts) return { ok: false, reason: `a shape is made of at most ${LIMITS.maxExcitationParts} plucks and strikes` };
  return setExcitationParts(doc, [...before, part], origin);
}

export function removeExcitationPart(doc: Y.Doc, index: number, origin?: unknown): EditResult {
  const before = readExcitationParts(doc);
  if (!before || !Number.isInteger(index) || index < 0 || index >= before.length) return { ok: false, reason: `there is no pluck or strike ${index + 1}` };
  return setExcitationParts(doc, before.filter((_, at) => at !== index), origin);
}

/** The widest contact that fits at this position, with the minimum gap to each support. */
export function widestContactM(lengthM: Metres, positionM: Metres): Metres {
  return 2 * (Math.min(positionM, lengthM - positionM) - lengthM * MIN_POINT_GAP_FRACTION);
}

export type PartChanges = Partial<{ positionM: Metres; heightM: Metres; velocityMPerS: number; widthM: Metres; contact: string }>;

/**
 * Moves or reshapes one part, light enough for every pointer move of a drag: a moved position is
 * clamped so the contact stays on the string at its width; a changed width is clamped so it fits
 * where the part is (and is no narrower than `LIMITS.minContactWidthM`); other fields are checked by the schema, and a refused
 * change writes nothing. Only the fields that changed are written to the part's map, so two people
 * editing different fields of one pluck both keep theirs.
 */
export function updateExcitationPart(doc: Y.Doc, index: number, changes: PartChanges, origin?: unknown): EditResult {
  const before = readExcitationParts(doc);
  if (!before || !Number.isInteger(index) || index < 0 || index >= before.length) return { ok: false, reason: `there is no pluck or strike ${index + 1}` };
  const values = Object.values(changes).filter((value) => typeof value === 'number');
  if (!values.every(Number.isFinite)) return { ok: false, reason: 'position, height, velocity and width must be finite numbers' };
  const lengthM = patchDoc(doc).string.get('lengthM') as number;
  const merged: Record<string, unknown> = { ...before[index], ...changes };
  const gapM = lengthM * MIN_POINT_GAP_FRACTION;
  const clamp = (value: number, low: number, high: number) => Math.min(high, Math.max(low, value));
  const fitWidth = (positionM: number) => Math.max(LIMITS.minContactWidthM, Math.min(merged.widthM as number, widestContactM(lengthM, positionM)));
  if (changes.widthM !== undefined) {
    // An edge dragged: the position holds (inside the string) and the width fits where it is.
    merged.positionM = clamp(merged.positionM as number, LIMITS.minContactWidthM / 2 + gapM, lengthM - LIMITS.minContactWidthM / 2 - gapM);
    merged.widthM = fitWidth(merged.positionM as number);
  } else {
    // The handle dragged: the width holds and the position stops where the contact meets a support.
    merged.widthM = fitWidth(lengthM / 2);
    merged.positionM = clamp(merged.positionM as number, (merged.widthM as number) / 2 + gapM, lengthM - (merged.widthM as number) / 2 - gapM);
  }
  const parsed = excitationPartSchema.safeParse(merged);
  if (!parsed.success) return { ok: false, reason: plainPartIssue(parsed.error.issues[0]) };
  const next = before.map((part, at) => (at === index ? parsed.data : part));
  const layers = layersFor(doc, before, next);
  if (!layers.ok) return layers;
  const map = patchDoc(doc).excitationParts.get(index);
  doc.transact(() => {
    for (const [key, value] of Object.entries(parsed.data)) if (map.get(key) !== value) map.set(key, value);
    layers.write();
  }, origin);
  return { ok: true };
}

/**
 * Keeps the polylines exactly as they are and forgets how they were made: from here the shape is
 * edited point by point. The explicit step before a point edit of a shape made by plucks or strikes.
 */
export function convertToFreePoints(doc: Y.Doc, origin?: unknown): EditResult {
  const array = patchDoc(doc).excitationParts;
  if (array.length === 0) return { ok: false, reason: 'the shape is already free points' };
  doc.transact(() => array.delete(0, array.length), origin);
  return { ok: true };
}
