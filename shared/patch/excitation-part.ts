import { z } from 'zod';
import { LIMITS } from '../limits';

/**
 * How an excitation was made: plucks (a displacement held and let go) and strikes (a velocity given
 * at rest). The patch's polylines stay exact and authoritative for the engine; these parts travel
 * beside them (`excitation.parts`) so the editor can move a whole pluck as one object.
 */

/** What meets the string in a pluck: a fingertip's soft pad (a rounded top) or a pick's edge (a flat top). */
export const pluckContacts = ['fingertip', 'pick'] as const;
export type PluckContact = (typeof pluckContacts)[number];

const finite = () => z.number();
const positive = () => z.number().gt(0, 'must be > 0');
const width = () => z.number().gte(LIMITS.minContactWidthM, `must be >= ${LIMITS.minContactWidthM}`);

export const pluckPartSchema = z.strictObject({
  kind: z.literal('pluck'),
  /** Where the contact's centre meets the string, metres from the left support. */
  positionM: positive(),
  /** Displacement held at the contact's centre (negative pulls the other way). */
  heightM: finite(),
  /** Width of the contact. */
  widthM: width(),
  contact: z.enum(pluckContacts, `must be one of ${pluckContacts.join(', ')}`),
});

export const strikePartSchema = z.strictObject({
  kind: z.literal('strike'),
  /** Where the hammer's centre meets the string. */
  positionM: positive(),
  /** Velocity given at the hammer's centre (negative strikes the other way). */
  velocityMPerS: finite(),
  /** Width of the hammer's face. */
  widthM: width(),
});

export const excitationPartSchema = z.discriminatedUnion('kind', [pluckPartSchema, strikePartSchema], 'must be a pluck or a strike');

export const excitationPartsSchema = z.array(excitationPartSchema).max(LIMITS.maxExcitationParts, `must have at most ${LIMITS.maxExcitationParts} plucks and strikes`);

export type PluckPart = z.output<typeof pluckPartSchema>;
export type StrikePart = z.output<typeof strikePartSchema>;
export type ExcitationPart = z.output<typeof excitationPartSchema>;

/** The polyline each kind of part makes: a pluck the displacement, a strike the velocity. */
export const PART_LAYER = { pluck: 'displacement', strike: 'velocity' } as const;

/** Whether the parts make this layer (then it is edited through their handles, not point by point). */
export function partsMakeLayer(parts: readonly ExcitationPart[] | undefined, layer: 'displacement' | 'velocity'): boolean {
  return (parts ?? []).some((part) => PART_LAYER[part.kind] === layer);
}

/** A part's number among those of its kind, from 1 (the second strike is "strike 2" even after a pluck). */
export function partOrdinal(parts: readonly ExcitationPart[], index: number): number {
  return parts.slice(0, index + 1).filter((part) => part.kind === parts[index].kind).length;
}
