import * as Y from 'yjs';
import type { Patch } from '../patch/patch-schema';
import { validatePatch } from '../patch/validate-patch';
import { fieldIssue, type FieldIssue, type Validation } from '../patch/field-issue';

/**
 * The layout of a session's shared document, defined once. Scalars live in one Y.Map per part of
 * the patch, so two people changing different fields never collide; each interior polyline point is
 * its own Y.Map inside a Y.Array, so two people dragging different points never overwrite each
 * other. The two supports are not stored: they are always (0, 0) and (lengthM, 0).
 */
export const DOC_KEYS = {
  meta: 'meta',
  string: 'string',
  damping: 'damping',
  pickup: 'pickup',
  render: 'render',
  displacement: 'displacement',
  velocity: 'velocity',
  extras: 'extras',
} as const;

/** One interior point: x in metres along the string, value in metres (displacement) or m/s (velocity). */
export type DocPoint = Y.Map<number>;

export interface PatchDoc {
  meta: Y.Map<unknown>;
  string: Y.Map<number>;
  damping: Y.Map<number>;
  pickup: Y.Map<number | string>;
  render: Y.Map<number>;
  displacement: Y.Array<DocPoint>;
  velocity: Y.Array<DocPoint>;
  extras: Y.Map<unknown>;
}

export function patchDoc(doc: Y.Doc): PatchDoc {
  return {
    meta: doc.getMap(DOC_KEYS.meta),
    string: doc.getMap(DOC_KEYS.string),
    damping: doc.getMap(DOC_KEYS.damping),
    pickup: doc.getMap(DOC_KEYS.pickup),
    render: doc.getMap(DOC_KEYS.render),
    displacement: doc.getArray(DOC_KEYS.displacement),
    velocity: doc.getArray(DOC_KEYS.velocity),
    extras: doc.getMap(DOC_KEYS.extras),
  };
}

export function docPoint(x: number, value: number): DocPoint {
  const point = new Y.Map<number>();
  point.set('x', x);
  point.set('y', value);
  return point;
}

const PATCH_FIELDS = new Set(['name', 'string', 'excitation', 'damping', 'pickup', 'render']);

function setAll<T>(map: Y.Map<T>, values: Record<string, T>): void {
  for (const [key, value] of Object.entries(values)) if (map.get(key) !== value) map.set(key, value);
  for (const key of [...map.keys()]) if (!(key in values)) map.delete(key);
}

function replacePoints(array: Y.Array<DocPoint>, polyline: ReadonlyArray<readonly [number, number]> | undefined): void {
  const interior = polyline ? polyline.slice(1, -1) : [];
  if (array.length > 0) array.delete(0, array.length);
  if (interior.length > 0) array.insert(0, interior.map(([x, value]) => docPoint(x, value)));
}

/** Writes a whole patch into the document in one transaction (a session's first state, or a preset loaded). */
export function writePatchToDoc(doc: Y.Doc, patch: Patch, origin: unknown = null): void {
  const parts = patchDoc(doc);
  doc.transact(() => {
    setAll(parts.meta, { name: patch.name, hasVelocity: patch.excitation.velocityMPerS !== undefined });
    setAll(parts.string, { ...patch.string } as Record<string, number>);
    setAll(parts.damping, { ...patch.damping } as Record<string, number>);
    setAll(parts.pickup, { ...patch.pickup } as Record<string, number | string>);
    setAll(parts.render, { ...patch.render } as Record<string, number>);
    replacePoints(parts.displacement, patch.excitation.displacementM);
    replacePoints(parts.velocity, patch.excitation.velocityMPerS);
    setAll(
      parts.extras,
      Object.fromEntries(Object.entries(patch).filter(([key]) => !PATCH_FIELDS.has(key))),
    );
  }, origin);
}

/**
 * Reads the interior points of a polyline, repaired so that concurrent edits can never produce
 * garbage: points off the string (x ≤ 0, x ≥ L) or not finite are dropped, the rest sorted by x,
 * and a point on the same x as its neighbour dropped (the first one kept). Entries that are not
 * points at all are skipped here; `docShapeIssues` refuses them before they reach the document.
 */
function readPolyline(array: Y.Array<DocPoint>, lengthM: number): [number, number][] {
  const interior = array
    .toArray()
    .filter((point): point is DocPoint => point instanceof Y.Map)
    .map((point) => [point.get('x'), point.get('y')] as [unknown, unknown])
    .filter((point): point is [number, number] => isFiniteNumber(point[0]) && isFiniteNumber(point[1]) && point[0] > 0 && point[0] < lengthM)
    .sort((a, b) => a[0] - b[0]);
  const kept: [number, number][] = [];
  for (const point of interior) if (kept.length === 0 || point[0] > kept[kept.length - 1][0]) kept.push(point);
  return [[0, 0], ...kept, [lengthM, 0]];
}

const isFiniteNumber = (value: unknown): value is number => typeof value === 'number' && Number.isFinite(value);

const POLYLINE_FIELDS = { displacement: 'displacementM', velocity: 'velocityMPerS' } as const;
const ROOT_NAMES: ReadonlySet<string> = new Set(Object.values(DOC_KEYS));

/**
 * What the document holds that no patch could: a shared part the layout does not have, or a
 * polyline entry that is not a point made of a finite x and value (a string, null, a number, text,
 * NaN, a point with other keys). Ordering and points off the string are not problems here: they
 * happen when two people edit at once, and reading repairs them the same way on every side.
 */
export function docShapeIssues(doc: Y.Doc): FieldIssue[] {
  const issues: FieldIssue[] = [];
  for (const name of doc.share.keys()) if (!ROOT_NAMES.has(name)) issues.push(fieldIssue([name], 'is not a part of a patch', undefined, false));
  const parts = patchDoc(doc);
  for (const [layer, field] of Object.entries(POLYLINE_FIELDS) as Array<[keyof typeof POLYLINE_FIELDS, string]>) {
    const entries = parts[layer].toArray() as unknown[];
    for (let index = 0; index < entries.length && issues.length < 5; index++) {
      const entry = entries[index];
      const path = ['excitation', field, index + 1];
      if (!(entry instanceof Y.Map)) {
        issues.push(fieldIssue(path, 'must be a point with x and a value', entry instanceof Y.AbstractType ? 'a shared text or list' : entry));
        continue;
      }
      const keys = [...entry.keys()].sort();
      if (keys.length !== 2 || keys[0] !== 'x' || keys[1] !== 'y') {
        issues.push(fieldIssue(path, `must hold exactly x and y, got keys ${keys.join(', ') || '(none)'}`, undefined, false));
        continue;
      }
      for (const [key, index2] of [['x', 0], ['y', 1]] as const) {
        const value: unknown = entry.get(key);
        if (!isFiniteNumber(value)) issues.push(fieldIssue([...path, index2], 'must be a finite number', value));
      }
    }
  }
  return issues;
}

/** The document as a patch-shaped object, not yet validated. */
export function patchFromDoc(doc: Y.Doc): unknown {
  const parts = patchDoc(doc);
  const string = parts.string.toJSON() as Record<string, unknown>;
  const lengthM = typeof string.lengthM === 'number' ? string.lengthM : NaN;
  return {
    ...(parts.extras.toJSON() as Record<string, unknown>),
    name: parts.meta.get('name'),
    string,
    excitation: {
      displacementM: readPolyline(parts.displacement, lengthM),
      ...(parts.meta.get('hasVelocity') ? { velocityMPerS: readPolyline(parts.velocity, lengthM) } : {}),
    },
    damping: parts.damping.toJSON(),
    pickup: parts.pickup.toJSON(),
    render: parts.render.toJSON(),
  };
}

/** The document as a validated patch, or the field problems that stop it from being one. */
export function validatedPatchFromDoc(doc: Y.Doc): Validation<Patch> {
  const shape = docShapeIssues(doc);
  if (shape.length > 0) return { ok: false, issues: shape };
  return validatePatch(patchFromDoc(doc));
}
