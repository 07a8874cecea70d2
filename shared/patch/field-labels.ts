import type { PatchNumberField } from './field-rules';

/** How a numeric patch field is named and shown to a person: its plain label, and the unit (and scale from SI) the panels use. */
export interface FieldLabel {
  /** Starts a sentence: "Tension", "Pickup position". */
  label: string;
  /** The unit shown ('' for a plain count or coefficient). */
  unit: string;
  /** Shown value = SI value × scale (1000 for metres shown in millimetres). */
  scale: number;
}

/**
 * Every numeric field of a patch in the trade's words. Typed by `PatchNumberField`, so a new
 * numeric field does not compile until it has a label here (the units agree with `UNITS` in
 * field-rules.ts once scaled: m shown as mm).
 */
export const FIELD_LABELS: Readonly<Record<PatchNumberField, FieldLabel>> = {
  'string.lengthM': { label: 'Length', unit: 'mm', scale: 1000 },
  'string.tensionN': { label: 'Tension', unit: 'N', scale: 1 },
  'string.linearDensityKgPerM': { label: 'Linear density', unit: 'kg/m', scale: 1 },
  'string.inharmonicityB': { label: 'Stiffness B', unit: '', scale: 1 },
  'damping.b1PerS': { label: 'Loss b1', unit: '1/s', scale: 1 },
  'damping.b2M2PerS': { label: 'Loss b2', unit: 'm²/s', scale: 1 },
  'pickup.positionM': { label: 'Pickup position', unit: 'mm', scale: 1000 },
  'render.sampleRateHz': { label: 'Sample rate', unit: 'Hz', scale: 1 },
  'render.durationS': { label: 'Duration', unit: 's', scale: 1 },
  'render.maxModes': { label: 'Most modes', unit: '', scale: 1 },
};

/** A number for a message: at most 4 significant digits, no trailing zeros, no exponent for everyday sizes. */
export function plainNumber(value: number): string {
  if (!Number.isFinite(value)) return String(value);
  const rounded = Number(value.toPrecision(4));
  const abs = Math.abs(rounded);
  if (abs !== 0 && (abs < 1e-4 || abs >= 1e7)) return rounded.toExponential(2).replace(/\.?0+e/, 'e').replace('e', ' × 10^').replace('^+', '^');
  return String(rounded);
}

/** A value with its unit as a person reads it: `650 mm`, `0.5 s`, `0.0003` (no unit). */
export function withUnit(value: number, unit: string): string {
  return unit === '' ? plainNumber(value) : `${plainNumber(value)} ${unit}`;
}
