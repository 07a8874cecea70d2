import type * as Y from 'yjs';
import type { patchSchema } from '../patch/patch-schema';

/** A top-level part of the patch (`name`, `string`, `excitation`, …): the keys of `patchSchema.shape`. */
export type PatchSectionName = keyof typeof patchSchema.shape;

/** One interior point: x in metres along the string, value in metres (displacement) or m/s (velocity). */
export type DocPoint = Y.Map<number>;

/** A part stored as one Y.Map of scalars; `V` is the type of its values (used for typing only). */
export interface MapPart<V> {
  readonly kind: 'map';
  /** The patch section it holds, or null for the one documented exception (`extras`). */
  readonly section: PatchSectionName | null;
  readonly about: string;
  /** Never set: carries the value type to `PatchDoc`. */
  readonly values?: V;
}

/** A part stored as a Y.Array of point maps: the interior points of one polyline of `excitation`. */
export interface PointsPart {
  readonly kind: 'points';
  readonly section: 'excitation';
  readonly field: 'displacementM' | 'velocityMPerS';
  readonly about: string;
}

/**
 * A part stored as a Y.Array of part maps: how `excitation` was made (`excitation.parts`), one Y.Map
 * of scalars per pluck or strike, so two people moving different plucks never collide.
 */
export interface PartsPart {
  readonly kind: 'parts';
  readonly section: 'excitation';
  readonly field: 'parts';
  readonly about: string;
}

/** One pluck or strike in the document: its fields as scalars (see shared/patch/excitation-part.ts). */
export type DocExcitationPart = Y.Map<number | string>;

export type DocPart = MapPart<unknown> | PointsPart | PartsPart;

const mapPart = <V>(section: PatchSectionName | null, about: string): MapPart<V> => ({ kind: 'map', section, about });

/**
 * The layout of a session's shared document, defined once: every part's name (its root name in
 * the Y.Doc), its kind, and the patch section it holds. The undo manager, the patch ↔ document
 * mapping and the live edit gate's shape check all read it.
 *
 * Scalars live in one Y.Map per section, so two people changing different fields never collide;
 * each interior polyline point is its own Y.Map inside a Y.Array, so two people dragging different
 * points never overwrite each other. The two supports are not stored: they are always (0, 0) and
 * (lengthM, 0).
 *
 * The documented exceptions to "one part, one section":
 * - `meta` holds the section `name` and one flag that is not a patch field: `hasVelocity`, whether
 *   `excitation.velocityMPerS` is present (an empty layer and no layer differ).
 * - `extras` holds no section: whatever a patch carries beside its sections (a design record,
 *   tags), passed through untouched.
 *
 * Adding a section to `patchSchema` without a part here fails `tests/shared/collab/doc-layout.test.ts`.
 */
export const DOC_LAYOUT = {
  meta: mapPart<unknown>('name', 'the name, and hasVelocity: whether the velocity layer is present'),
  string: mapPart<number>('string', 'length, tension, linear density, stiffness B'),
  damping: mapPart<number>('damping', 'the two loss coefficients'),
  pickup: mapPart<number | string>('pickup', 'position and what it reads'),
  render: mapPart<number>('render', 'sample rate, duration, most modes'),
  displacement: { kind: 'points', section: 'excitation', field: 'displacementM', about: 'interior points of the initial displacement' },
  velocity: { kind: 'points', section: 'excitation', field: 'velocityMPerS', about: 'interior points of the initial velocity' },
  excitationParts: { kind: 'parts', section: 'excitation', field: 'parts', about: 'the plucks and strikes the polylines were made from' },
  extras: mapPart<unknown>(null, 'pass-through fields beside the sections (design record, tags)'),
} as const satisfies Record<string, DocPart>;

export type DocPartName = keyof typeof DOC_LAYOUT;

/** The parts stored as point arrays (the polylines of `excitation`). */
export type PointsPartName = { [K in DocPartName]: (typeof DOC_LAYOUT)[K] extends PointsPart ? K : never }[DocPartName];

/** The name of every part, in layout order. */
export const DOC_PART_NAMES = Object.keys(DOC_LAYOUT) as DocPartName[];

/** The shared types of a document, one per part, typed by the layout. */
export type PatchDoc = {
  [K in DocPartName]: (typeof DOC_LAYOUT)[K] extends PointsPart
    ? Y.Array<DocPoint>
    : (typeof DOC_LAYOUT)[K] extends PartsPart
      ? Y.Array<DocExcitationPart>
      : (typeof DOC_LAYOUT)[K] extends MapPart<infer V>
        ? Y.Map<V>
        : never;
};

/**
 * The document's parts, creating any that are missing as the layout's kind of shared type. Call
 * it before applying updates to a fresh document, so content lands in the right kind of type.
 */
export function patchDoc(doc: Y.Doc): PatchDoc {
  const parts: Record<string, unknown> = {};
  for (const name of DOC_PART_NAMES) parts[name] = DOC_LAYOUT[name].kind === 'map' ? doc.getMap(name) : doc.getArray(name);
  return parts as unknown as PatchDoc;
}

/** Every part's shared type, in layout order: what `Y.UndoManager` tracks. */
export function docSharedTypes(doc: Y.Doc): Array<PatchDoc[DocPartName]> {
  const parts = patchDoc(doc);
  return DOC_PART_NAMES.map((name) => parts[name]);
}

/** The map part that holds a section, if the section is kept as a map of scalars. */
export function mapPartOfSection(section: PatchSectionName): DocPartName | null {
  return DOC_PART_NAMES.find((name) => DOC_LAYOUT[name].kind === 'map' && DOC_LAYOUT[name].section === section) ?? null;
}

/** The parts that hold no patch section, by design (see `DOC_LAYOUT`). */
export const SECTIONLESS_PARTS: ReadonlySet<string> = new Set(['extras']);

/**
 * What does not line up between a patch's sections and a layout: a section that no part holds (its
 * edits would fall into `extras`, or be lost), a part that holds no section and is not a documented
 * exception, or a part naming a section the patch does not have. Empty when they agree.
 */
export function docLayoutGaps(sections: readonly string[], layout: Readonly<Record<string, DocPart>> = DOC_LAYOUT): string[] {
  const gaps: string[] = [];
  const held = new Set(Object.values(layout).map((part) => part.section));
  for (const section of sections) if (!held.has(section as PatchSectionName)) gaps.push(`patch section ${section} has no part in the document layout`);
  for (const [name, part] of Object.entries(layout)) {
    if (part.section === null) {
      if (!SECTIONLESS_PARTS.has(name)) gaps.push(`document part ${name} holds no patch section`);
    } else if (!sections.includes(part.section)) {
      gaps.push(`document part ${name} holds ${part.section}, which is not a patch section`);
    }
  }
  return gaps;
}
