import type { z } from 'zod';

/** A pluck's or strike's fields as people call them, with the unit they are shown in. */
const PART_FIELDS: Record<string, { label: string; unit: string; scale: number }> = {
  positionM: { label: 'Position', unit: 'mm', scale: 1000 },
  heightM: { label: 'Height', unit: 'mm', scale: 1000 },
  widthM: { label: 'Contact width', unit: 'mm', scale: 1000 },
  velocityMPerS: { label: 'Velocity', unit: 'm/s', scale: 1 },
  contact: { label: 'Contact', unit: '', scale: 1 },
};

const plain = (value: number) => String(Number(value.toPrecision(4)));

/**
 * One problem with a pluck or strike in plain words with units, e.g. "Pluck 2: contact width must be
 * at least 0.1 mm", instead of the schema's "1 widthM must be >= 0.0001". `kindOf` names the part
 * at an index ("pluck 2", "strike 1").
 */
export function plainPartIssue(issue: z.core.$ZodIssue, kindOf: (index: number) => string = (index) => `part ${index + 1}`): string {
  const index = issue.path.find((step): step is number => typeof step === 'number');
  const key = [...issue.path].reverse().find((step): step is string => typeof step === 'string');
  const field = key ? PART_FIELDS[key] : undefined;
  const who = index === undefined ? '' : `${kindOf(index).replace(/^./, (first) => first.toUpperCase())}: `;
  const label = field ? field.label.toLowerCase() : 'the pluck or strike';
  const subject = who ? label : label.replace(/^./, (first) => first.toUpperCase());
  if (field && (issue.code === 'too_small' || issue.code === 'too_big')) {
    const bound = Number(issue.code === 'too_small' ? issue.minimum : issue.maximum) * field.scale;
    const words = issue.code === 'too_small' ? (issue.inclusive ? 'at least' : 'more than') : issue.inclusive ? 'at most' : 'less than';
    return `${who}${subject} must be ${words} ${plain(bound)} ${field.unit}`.trim();
  }
  if (field && issue.code === 'invalid_type') return `${who}${subject} must be a number${field.unit ? ` of ${field.unit}` : ''}`;
  return `${who}${subject} ${issue.message}`;
}
