import { describe, expect, expectTypeOf, it } from 'vitest';
import { PATCH_NUMBER_FIELDS, fieldRule, fieldSchema, type PatchNumberField } from '../../../shared/patch/field-rules';
import { patchSchema } from '../../../shared/patch/patch-schema';
import { validatePatch } from '../../../shared/patch/validate-patch';
import { LIMITS } from '../../../shared/limits';
import { testPatch } from '../../support/patches';

/** The test patch with one field changed; a new length takes a plain pluck at mid-string and the pickup at a quarter, so only the field itself is in question. */
function patchWith(field: PatchNumberField, value: number): unknown {
  const patch = structuredClone(testPatch()) as Record<string, Record<string, unknown>>;
  const [section, key] = field.split('.');
  patch[section][key] = value;
  if (field === 'string.lengthM' && Number.isFinite(value) && value > 0) {
    patch.excitation.displacementM = [[0, 0], [value / 2, 0.001], [value, 0]];
    patch.pickup.positionM = value / 4;
  }
  return patch;
}

/** What validatePatch says about this one field: its message, or null when it raises none. */
function verdict(field: PatchNumberField, value: number): string | null {
  const result = validatePatch(patchWith(field, value));
  if (result.ok) return null;
  return result.issues.find((issue) => issue.field === field)?.message ?? null;
}

const step = (bound: number) => 1e-9 * Math.max(1, Math.abs(bound));

describe('field rules come from the patch schema', () => {
  it('types every numeric field of the patch as a dotted path', () => {
    expectTypeOf<PatchNumberField>().toEqualTypeOf<
      | 'string.lengthM' | 'string.tensionN' | 'string.linearDensityKgPerM' | 'string.inharmonicityB'
      | 'damping.b1PerS' | 'damping.b2M2PerS' | 'pickup.positionM'
      | 'render.sampleRateHz' | 'render.durationS' | 'render.maxModes'
    >();
  });

  it('lists exactly the number fields the schema has', () => {
    const found: string[] = [];
    for (const [section, schema] of Object.entries(patchSchema.shape)) {
      const shape = (schema as { shape?: Record<string, { _zod: { def: { type: string; innerType?: { _zod: { def: { type: string } } } } } }> }).shape;
      for (const [key, field] of Object.entries(shape ?? {})) {
        const type = field._zod.def.type === 'default' ? field._zod.def.innerType?._zod.def.type : field._zod.def.type;
        if (type === 'number') found.push(`${section}.${key}`);
      }
    }
    expect([...PATCH_NUMBER_FIELDS].sort()).toEqual(found.sort());
  });

  it('reads the bounds the schema states (LIMITS spelled once)', () => {
    expect(fieldRule('render.durationS')).toMatchObject({ min: 0, exclusiveMin: true, max: LIMITS.maxDurationS, exclusiveMax: false, integer: false, unit: 's' });
    expect(fieldRule('render.maxModes')).toMatchObject({ min: 1, exclusiveMin: false, max: LIMITS.maxModes, integer: true });
    expect(fieldRule('damping.b1PerS')).toMatchObject({ min: 0, exclusiveMin: false, max: null, unit: '1/s' });
    expect(fieldRule('string.inharmonicityB')).toMatchObject({ min: 0, max: LIMITS.maxInharmonicityB, exclusiveMax: false });
    expect(fieldRule('render.sampleRateHz').allowed).toEqual(LIMITS.sampleRatesHz);
  });

  it.each(PATCH_NUMBER_FIELDS)('%s: accepted and refused by the rule exactly as validatePatch does, at and around each bound, with its message', (field) => {
    const rule = fieldRule(field);
    const agree = (value: number, accepted: boolean) => {
      const said = verdict(field, value);
      expect(rule.message(value), `${field} = ${value}`).toBe(said);
      expect(said === null, `${field} = ${value} accepted`).toBe(accepted);
    };
    if (rule.min !== null) {
      agree(rule.min, !rule.exclusiveMin);
      agree(rule.min - step(rule.min), false);
      agree(rule.min + (rule.integer ? 1 : step(rule.min)), true);
    }
    if (rule.max !== null) {
      agree(rule.max, !rule.exclusiveMax);
      agree(rule.max + step(rule.max), false);
      agree(rule.max - (rule.integer ? 1 : step(rule.max)), true);
    } else if (rule.allowed === null) {
      // No upper bound in the schema: a larger value than the test patch's is taken.
      const [section, key] = field.split('.');
      agree(((testPatch() as unknown as Record<string, Record<string, number>>)[section][key] || 1) * 1.5, true);
    }
    if (rule.integer && rule.min !== null) agree(rule.min + 0.5, false);
    if (rule.allowed) {
      for (const value of rule.allowed) {
        agree(value, true);
        agree(value + 1, false);
        agree(value - 1, false);
      }
    }
    agree(Number.NaN, false);
    agree(Number.POSITIVE_INFINITY, false);
  });

  it('gives the schema of a field with its default unwrapped', () => {
    expect(fieldSchema('string.inharmonicityB').safeParse(undefined).success).toBe(false);
  });
});
