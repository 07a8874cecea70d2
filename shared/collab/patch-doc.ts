import * as Y from 'yjs';
import { patchSchema, type Patch } from '../patch/patch-schema';
import { validatePatch } from '../patch/validate-patch';
import { fieldIssue, type FieldIssue, type Validation } from '../patch/field-issue';
import { DOC_LAYOUT, DOC_PART_NAMES, patchDoc, type DocExcitationPart, type DocPartName, type DocPoint, type PatchSectionName, type PointsPart, type PointsPartName } from './doc-layout';

// The layout lives in doc-layout.ts; these are re-exported for the many callers that read the document here.
export { DOC_LAYOUT, docSharedTypes, patchDoc, type DocPoint, type PatchDoc } from './doc-layout';

export function docPoint(x: number, value: number): DocPoint {
  const point = new Y.Map<number>();
  point.set('x', x);
  point.set('y', value);
  return point;
}

/** The patch's sections in the schema's order (name, string, excitation, …). */
const PATCH_SECTIONS = Object.keys(patchSchema.shape) as PatchSectionName[];
const SECTION_NAMES: ReadonlySet<string> = new Set(PATCH_SECTIONS);

/** The point-array parts, each with its polyline field of `excitation`. */
const POINT_PARTS = DOC_PART_NAMES.filter((name): name is PointsPartName => DOC_LAYOUT[name].kind === 'points').map((name) => [name, DOC_LAYOUT[name] as PointsPart] as const);

/** The map part holding each section kept as scalars (every section but `excitation`). */
const MAP_PART_OF_SECTION = new Map<PatchSectionName, DocPartName>(
  DOC_PART_NAMES.flatMap((name) => {
    const part = DOC_LAYOUT[name];
    return part.kind === 'map' && part.section !== null ? [[part.section, name] as const] : [];
  }),
);

/** The flag in `meta` that says the velocity layer is present (an empty layer and no layer differ). */
const HAS_VELOCITY = 'hasVelocity';

function setAll<T>(map: Y.Map<T>, values: Record<string, T>): void {
  for (const [key, value] of Object.entries(values)) if (map.get(key) !== value) map.set(key, value);
  for (const key of [...map.keys()]) if (!(key in values)) map.delete(key);
}

/** Replaces the excitation's parts (plucks, strikes) with new part maps; none when the patch has none. */
function replaceParts(array: Y.Array<DocExcitationPart>, parts: Patch['excitation']['parts']): void {
  if (array.length > 0) array.delete(0, array.length);
  if (parts && parts.length > 0) array.insert(0, parts.map((part) => docExcitationPart(part)));
}

/** One pluck or strike as a map of its scalar fields. */
export function docExcitationPart(part: Readonly<Record<string, number | string>>): DocExcitationPart {
  const map = new Y.Map<number | string>();
  for (const [key, value] of Object.entries(part)) map.set(key, value);
  return map;
}

function replacePoints(array: Y.Array<DocPoint>, polyline: ReadonlyArray<readonly [number, number]> | undefined): void {
  const interior = polyline ? polyline.slice(1, -1) : [];
  if (array.length > 0) array.delete(0, array.length);
  if (interior.length > 0) array.insert(0, interior.map(([x, value]) => docPoint(x, value)));
}

/** A section as the scalars of its map: an object section's fields, or a scalar section under its own name. */
function sectionValues(patch: Patch, section: PatchSectionName): Record<string, unknown> {
  const value: unknown = patch[section];
  return value !== null && typeof value === 'object' ? { ...(value as Record<string, unknown>) } : { [section]: value };
}

/** Writes a whole patch into the document in one transaction (a session's first state, or a preset loaded). */
export function writePatchToDoc(doc: Y.Doc, patch: Patch, origin: unknown = null): void {
  const parts = patchDoc(doc);
  doc.transact(() => {
    const mapValues = new Map<DocPartName, Record<string, unknown>>();
    for (const section of PATCH_SECTIONS) {
      if (section === 'excitation') continue;
      const name = MAP_PART_OF_SECTION.get(section);
      if (!name) throw new Error(`patch section ${section} has no part in DOC_LAYOUT`);
      mapValues.set(name, { ...mapValues.get(name), ...sectionValues(patch, section) });
    }
    mapValues.set('meta', { ...mapValues.get('meta'), [HAS_VELOCITY]: patch.excitation.velocityMPerS !== undefined });
    mapValues.set('extras', Object.fromEntries(Object.entries(patch).filter(([key]) => !SECTION_NAMES.has(key))));
    for (const [name, values] of mapValues) setAll(parts[name] as Y.Map<unknown>, values);
    for (const [name, part] of POINT_PARTS) replacePoints(parts[name], patch.excitation[part.field]);
    replaceParts(parts.excitationParts, patch.excitation.parts);
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

const ROOT_NAMES: ReadonlySet<string> = new Set(DOC_PART_NAMES);

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
  for (const [name, part] of POINT_PARTS) {
    const entries = parts[name].toArray() as unknown[];
    for (let index = 0; index < entries.length && issues.length < 5; index++) {
      const entry = entries[index];
      const path = [part.section, part.field, index + 1];
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
  // A pluck or strike is a map of scalars; its fields and their bounds are the patch schema's to check.
  parts.excitationParts.toArray().forEach((entry: unknown, index) => {
    if (issues.length >= 5) return;
    const path = ['excitation', 'parts', index + 1];
    if (!(entry instanceof Y.Map)) issues.push(fieldIssue(path, 'must be a pluck or a strike', entry instanceof Y.AbstractType ? 'a shared text or list' : entry));
    else if ([...entry.values()].some((value: unknown) => typeof value !== 'number' && typeof value !== 'string')) issues.push(fieldIssue(path, 'must hold only numbers and names', undefined, false));
  });
  return issues;
}

/** The document as a patch-shaped object, not yet validated. */
export function patchFromDoc(doc: Y.Doc): unknown {
  const parts = patchDoc(doc);
  const string = parts.string.toJSON() as Record<string, unknown>;
  const lengthM = typeof string.lengthM === 'number' ? string.lengthM : NaN;
  const out: Record<string, unknown> = { ...(parts.extras.toJSON() as Record<string, unknown>) };
  for (const section of PATCH_SECTIONS) {
    if (section === 'excitation') {
      const excitation: Record<string, unknown> = {};
      for (const [name, part] of POINT_PARTS) {
        if (part.field === 'velocityMPerS' && !parts.meta.get(HAS_VELOCITY)) continue;
        excitation[part.field] = readPolyline(parts[name], lengthM);
      }
      // Only a shape made from plucks or strikes carries parts, so other patches read back unchanged.
      if (parts.excitationParts.length > 0) excitation.parts = parts.excitationParts.toArray().map((part) => (part instanceof Y.Map ? part.toJSON() : part));
      out[section] = excitation;
      continue;
    }
    const name = MAP_PART_OF_SECTION.get(section);
    if (!name) continue;
    const map = parts[name] as Y.Map<unknown>;
    const kept = patchSchema.shape[section];
    // An object section is its whole map; a scalar section (the name) is one key of its map.
    out[section] = 'shape' in kept ? map.toJSON() : map.get(section);
  }
  return out;
}

/** The document as a validated patch, or the field problems that stop it from being one. */
export function validatedPatchFromDoc(doc: Y.Doc): Validation<Patch> {
  const shape = docShapeIssues(doc);
  if (shape.length > 0) return { ok: false, issues: shape };
  return validatePatch(patchFromDoc(doc));
}
