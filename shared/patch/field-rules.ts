import type { z } from 'zod';
import { LIMITS } from '../limits';
import { fieldIssue } from './field-issue';
import { patchSchema } from './patch-schema';
import { issueFromZod } from './zod-issues';

type Shape = typeof patchSchema.shape;
type SectionFields<S extends keyof Shape> = Shape[S] extends { shape: infer O } ? O : never;
type NumberKeys<O> = { [K in keyof O & string]: O[K] extends z.ZodType ? (z.output<O[K]> extends number ? K : never) : never }[keyof O & string];

/**
 * Every numeric field of a patch as a dotted path, `'string.lengthM' | 'damping.b1PerS' | …`,
 * derived from the schema's types: a number added to a section of `patchSchema` joins it.
 */
export type PatchNumberField = { [S in keyof Shape]: [SectionFields<S>] extends [never] ? never : `${S}.${NumberKeys<SectionFields<S>>}` }[keyof Shape];

/**
 * The unit of each numeric field, as the panels show it ('' for a plain count or coefficient).
 * Typed by `PatchNumberField`, so a new numeric field does not compile until it has its unit here.
 */
const UNITS: Record<PatchNumberField, string> = {
  'string.lengthM': 'm',
  'string.tensionN': 'N',
  'string.linearDensityKgPerM': 'kg/m',
  'string.inharmonicityB': '',
  'damping.b1PerS': '1/s',
  'damping.b2M2PerS': 'm²/s',
  'pickup.positionM': 'm',
  'render.sampleRateHz': 'Hz',
  'render.durationS': 's',
  'render.maxModes': '',
};

/**
 * Fields whose schema accepts only listed values (a refinement the schema cannot describe as a
 * range). The lists are the same `LIMITS` entries the schema reads.
 */
const ALLOWED: Partial<Record<PatchNumberField, readonly number[]>> = {
  'render.sampleRateHz': LIMITS.sampleRatesHz,
};

/** Every numeric field of a patch, in the schema's order. */
export const PATCH_NUMBER_FIELDS = Object.keys(UNITS) as PatchNumberField[];

/** One numeric field's own rule, as the schema states it. Rules between fields live in `validatePatch`. */
export interface FieldRule {
  field: PatchNumberField;
  /** Lowest value, or null when unbounded below; `exclusiveMin` when the bound itself is refused. */
  min: number | null;
  exclusiveMin: boolean;
  max: number | null;
  exclusiveMax: boolean;
  integer: boolean;
  /** The only values accepted, when the schema lists them (sample rates). */
  allowed: readonly number[] | null;
  unit: string;
  /** The schema's message for a value of this field (`render.durationS must be <= 60, got 61`), or null when it is accepted. */
  message(value: number): string | null;
}

interface CheckDef {
  check?: string;
  value?: unknown;
  inclusive?: boolean;
  format?: string;
}

/** The zod schema of one field, without its default (a default changes nothing about the bounds). */
export function fieldSchema(field: PatchNumberField): z.ZodType {
  const [section, key] = field.split('.') as [keyof Shape, string];
  let schema = (patchSchema.shape[section] as unknown as { shape: Record<string, z.ZodType> }).shape[key];
  while (schema._zod.def.type === 'default') schema = (schema._zod.def as unknown as { innerType: z.ZodType }).innerType;
  return schema;
}

const rules = new Map<PatchNumberField, FieldRule>();

/**
 * The bounds and message of one numeric field, read from the zod schema itself (zod 4 keeps each
 * check's definition: greater_than / less_than with `inclusive`, number_format for integers), so
 * the panels and the schema cannot drift apart.
 */
export function fieldRule(field: PatchNumberField): FieldRule {
  const known = rules.get(field);
  if (known) return known;
  const schema = fieldSchema(field);
  const checks = ((schema._zod.def as { checks?: Array<{ _zod: { def: CheckDef } }> }).checks ?? []).map((check) => check._zod.def);
  let min: number | null = null;
  let max: number | null = null;
  let exclusiveMin = false;
  let exclusiveMax = false;
  let integer = false;
  for (const check of checks) {
    if (check.check === 'greater_than' && typeof check.value === 'number' && (min === null || check.value >= min)) {
      min = check.value;
      exclusiveMin = check.inclusive !== true;
    } else if (check.check === 'less_than' && typeof check.value === 'number' && (max === null || check.value <= max)) {
      max = check.value;
      exclusiveMax = check.inclusive !== true;
    } else if (check.check === 'number_format' && (check.format === 'safeint' || check.format === 'int32' || check.format === 'uint32')) {
      integer = true;
    }
  }
  const [section, key] = field.split('.');
  const rule: FieldRule = {
    field,
    min,
    exclusiveMin,
    max,
    exclusiveMax,
    integer,
    allowed: ALLOWED[field] ?? null,
    unit: UNITS[field],
    message(value: number): string | null {
      const parsed = schema.safeParse(value);
      if (parsed.success) return null;
      return fieldIssue([section, key], issueFromZod(parsed.error.issues[0], value).problem, value).message;
    },
  };
  rules.set(field, rule);
  return rule;
}
