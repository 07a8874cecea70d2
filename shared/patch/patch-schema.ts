import { z } from 'zod';
import { LIMITS } from '../limits';
import { excitationPartsSchema } from './excitation-part';

/**
 * The patch: one JSON format exchanged by the browser, the server and the command line.
 * Every field carries its SI unit in its name. Objects are loose: a patch may carry more
 * (designer-facing fields such as material or target pitch) beside these.
 *
 * This schema checks each field on its own; the rules that tie fields together (polyline
 * ends at the string's length, pickup inside the string) live in `validatePatch`.
 */

const finiteNumber = () => z.number();

const positive = () => finiteNumber().gt(0, 'must be > 0');

const nonNegative = () => finiteNumber().gte(0, 'must be >= 0');

/** One polyline vertex: [x in metres along the string, value]. */
const polylinePoint = z.tuple([finiteNumber(), finiteNumber()], 'must be a pair [x, value]');

const polyline = z
  .array(polylinePoint)
  .min(LIMITS.minPolylinePoints, `must have at least ${LIMITS.minPolylinePoints} points (one at each support)`)
  .max(LIMITS.maxPolylinePoints, `must have at most ${LIMITS.maxPolylinePoints} points`);

export const stringSchema = z.looseObject({
  lengthM: positive(),
  tensionN: positive(),
  linearDensityKgPerM: positive(),
  inharmonicityB: nonNegative()
    .lte(LIMITS.maxInharmonicityB, `must be <= ${LIMITS.maxInharmonicityB}`)
    .default(0),
});

export const excitationSchema = z.looseObject({
  displacementM: polyline,
  velocityMPerS: polyline.optional(),
  /** How the polylines were made (plucks and strikes), for the editor; the polylines stay authoritative. */
  parts: excitationPartsSchema.optional(),
});

export const dampingSchema = z.looseObject({
  b1PerS: nonNegative(),
  b2M2PerS: nonNegative(),
});

export const pickupOutputs = ['displacement', 'velocity', 'force'] as const;
export type PickupOutput = (typeof pickupOutputs)[number];

export const pickupSchema = z.looseObject({
  positionM: positive(),
  output: z.enum(pickupOutputs, `must be one of ${pickupOutputs.join(', ')}`),
});

export const renderSchema = z.looseObject({
  sampleRateHz: finiteNumber().refine(
    (rate) => (LIMITS.sampleRatesHz as readonly number[]).includes(rate),
    `must be one of ${LIMITS.sampleRatesHz.join(', ')}`,
  ),
  durationS: positive().lte(LIMITS.maxDurationS, `must be <= ${LIMITS.maxDurationS}`),
  maxModes: finiteNumber()
    .int()
    .gte(1, 'must be >= 1')
    .lte(LIMITS.maxModes, `must be <= ${LIMITS.maxModes}`),
});

export const patchSchema = z.looseObject({
  name: z
    .string()
    .trim()
    .min(1, 'must not be empty')
    .max(LIMITS.maxNameLength, `must be at most ${LIMITS.maxNameLength} characters`),
  string: stringSchema,
  excitation: excitationSchema,
  damping: dampingSchema,
  pickup: pickupSchema,
  render: renderSchema,
});

/** A patch as it arrives (inharmonicityB may be missing). */
export type PatchInput = z.input<typeof patchSchema>;
/** A patch after validation: defaults filled in, every rule checked. */
export type Patch = z.output<typeof patchSchema>;
/** A polyline: [x in metres, value] pairs, x strictly increasing from 0 to the string's length. */
export type Polyline = ReadonlyArray<readonly [number, number]>;
