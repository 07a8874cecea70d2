import type { FieldIssue } from './field-issue';
import { FIELD_LABELS, plainNumber, withUnit } from './field-labels';
import { fieldRule, PATCH_NUMBER_FIELDS, type PatchNumberField } from './field-rules';

const isNumberField = (field: string): field is PatchNumberField => (PATCH_NUMBER_FIELDS as readonly string[]).includes(field);

/**
 * The problem with a value of one numeric field, in the trade's words with the panel's unit, or
 * null when the field's own rule accepts it: "Tension must be more than 0 N", "Duration must be at
 * most 60 s", "Most modes must be a whole number". The bound is the schema's (`fieldRule`); only the
 * wording is made here.
 */
export function plainFieldMessage(field: PatchNumberField, value: number): string | null {
  const rule = fieldRule(field);
  if (rule.message(value) === null) return null;
  const { label, unit, scale } = FIELD_LABELS[field];
  const shown = (si: number) => withUnit(si * scale, unit);
  if (!Number.isFinite(value)) return `${label} must be a number`;
  if (rule.allowed && !rule.allowed.includes(value)) return `${label} must be one of ${rule.allowed.map((v) => plainNumber(v * scale)).join(', ')}${unit ? ` ${unit}` : ''}`;
  if (rule.min !== null && (rule.exclusiveMin ? !(value > rule.min) : !(value >= rule.min))) {
    return `${label} must be ${rule.exclusiveMin ? 'more than' : 'at least'} ${shown(rule.min)}`;
  }
  if (rule.max !== null && (rule.exclusiveMax ? !(value < rule.max) : !(value <= rule.max))) {
    return `${label} must be ${rule.exclusiveMax ? 'less than' : 'at most'} ${shown(rule.max)}`;
  }
  if (rule.integer && !Number.isInteger(value)) return `${label} must be a whole number`;
  return `${label} is not a value a string can take`;
}

/** What a decay-time target is called on screen, by the frequency it is set at. */
export interface DecayTargetNames {
  lowFrequencyHz: number;
  highFrequencyHz: number;
}

const DECAY_FIELDS: Record<string, (names: DecayTargetNames) => string> = {
  lowT60S: (n) => `Decay time at ${plainNumber(n.lowFrequencyHz)} Hz`,
  highT60S: (n) => `Decay time at ${plainNumber(n.highFrequencyHz)} Hz`,
  lowFrequencyHz: () => 'Low frequency',
  highFrequencyHz: () => 'High frequency',
};

/**
 * A problem found by `validatePatch` (or a designer helper), in the trade's words: field paths and
 * raw floats are replaced by the field's label and rounded values with units. Falls back to the
 * label plus the problem with every dotted field path replaced by its label.
 */
export function plainIssueMessage(issue: FieldIssue, decayNames?: DecayTargetNames): string {
  const got = issue.got === null ? NaN : Number(issue.got);
  if (decayNames && issue.field in DECAY_FIELDS) {
    const label = DECAY_FIELDS[issue.field](decayNames);
    if (/^must be > 0/.test(issue.problem)) return `${label} must be longer than 0 s`;
    if (issue.field === 'highT60S') return `${label} must not be longer than the decay time at ${plainNumber(decayNames.lowFrequencyHz)} Hz: higher modes never ring longer in this loss model`;
    const longest = /at or below ([\d.e+-]+) s/.exec(issue.problem);
    if (issue.field === 'lowT60S' && longest) {
      return `${label} is too long for the decay time at ${plainNumber(decayNames.highFrequencyHz)} Hz: keep it at or below ${plainNumber(Number(longest[1]))} s, or lengthen the other`;
    }
    if (issue.field === 'highFrequencyHz') return `${label} must be above the low frequency`;
    return `${label} ${plainProblem(issue.problem)}`;
  }
  if (isNumberField(issue.field)) {
    const own = Number.isFinite(got) ? plainFieldMessage(issue.field, got) : null;
    if (own) return own;
    const { label } = FIELD_LABELS[issue.field];
    if (issue.field === 'pickup.positionM') {
      const length = /string\.lengthM \(([\d.e+-]+)\)/.exec(issue.problem);
      if (length) return `Pickup position must be inside the string, less than its length (${withUnit(Number(length[1]) * 1000, 'mm')})`;
    }
    if (issue.field === 'string.tensionN') {
      const above = /fundamental of ([\d.e+-]+) Hz, at or above half the sample rate \(([\d.e+-]+) Hz\)/.exec(issue.problem);
      if (above) {
        return `The fundamental would be ${withUnit(Number(above[1]), 'Hz')}, at or above half the sample rate (${withUnit(Number(above[2]), 'Hz')}): no mode could sound`;
      }
    }
    return `${label} ${plainProblem(issue.problem)}`;
  }
  return `${plainPath(issue.field)} ${plainProblem(issue.problem)}`;
}

/** A schema problem with field paths swapped for labels and long numbers rounded. */
function plainProblem(problem: string): string {
  return problem
    .replace(/\b(string|damping|pickup|render)\.[A-Za-z0-9]+/g, (path) => (isNumberField(path) ? FIELD_LABELS[path].label.toLowerCase() : path))
    .replace(/-?\d+\.\d{5,}(?:e[+-]?\d+)?/g, (number) => plainNumber(Number(number)))
    .replace(/must be > /g, 'must be more than ')
    .replace(/must be >= /g, 'must be at least ')
    .replace(/must be < /g, 'must be less than ')
    .replace(/must be <= /g, 'must be at most ');
}

/** An excitation path in words: `excitation.displacementM[3][0]` → "Shape point 3 position". */
function plainPath(field: string): string {
  const point = /^excitation\.(displacementM|velocityMPerS)\[(\d+)\](?:\[(0|1)\])?$/.exec(field);
  if (point) {
    const layer = point[1] === 'displacementM' ? 'Shape' : 'Strike layer';
    const part = point[3] === '0' ? ' position' : point[3] === '1' ? (point[1] === 'displacementM' ? ' height' : ' velocity') : '';
    return `${layer} point ${point[2]}${part}`;
  }
  if (field === 'excitation.displacementM') return 'The shape';
  if (field === 'excitation.velocityMPerS') return 'The strike layer';
  if (field === 'name') return 'Name';
  return field;
}
