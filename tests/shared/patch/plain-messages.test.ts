import { describe, expect, it } from 'vitest';
import { dampingFromT60 } from '../../../shared/designer/damping-from-t60';
import { FIELD_LABELS, plainNumber } from '../../../shared/patch/field-labels';
import { fieldRule, PATCH_NUMBER_FIELDS, type PatchNumberField } from '../../../shared/patch/field-rules';
import { plainFieldMessage, plainIssueMessage } from '../../../shared/patch/plain-messages';
import { validatePatch } from '../../../shared/patch/validate-patch';
import { testPatch } from '../../support/patches';

/** A value each field's own rule refuses, and the message a person should read. */
const REFUSED: Record<PatchNumberField, [number, string]> = {
  'string.lengthM': [0, 'Length must be more than 0 mm'],
  'string.tensionN': [-5, 'Tension must be more than 0 N'],
  'string.linearDensityKgPerM': [0, 'Linear density must be more than 0 kg/m'],
  'string.inharmonicityB': [2, `Stiffness B must be at most ${plainNumber(fieldRule('string.inharmonicityB').max ?? NaN)}`],
  'damping.b1PerS': [-1, 'Loss b1 must be at least 0 1/s'],
  'damping.b2M2PerS': [-0.5, 'Loss b2 must be at least 0 m²/s'],
  'pickup.positionM': [0, 'Pickup position must be more than 0 mm'],
  'render.sampleRateHz': [12345, `Sample rate must be one of ${fieldRule('render.sampleRateHz').allowed?.join(', ')} Hz`],
  'render.durationS': [61, `Duration must be at most ${fieldRule('render.durationS').max} s`],
  'render.maxModes': [2.5, 'Most modes must be a whole number'],
};

describe('field messages in the trade’s words', () => {
  it('every numeric field has a plain label', () => {
    for (const field of PATCH_NUMBER_FIELDS) expect(FIELD_LABELS[field].label).toMatch(/^[A-Z][a-z]/);
  });

  it.each(PATCH_NUMBER_FIELDS)('%s: refused where the schema refuses, said with its label and unit, no internal name', (field) => {
    const [value, expected] = REFUSED[field];
    expect(fieldRule(field).message(value)).not.toBeNull();
    const message = plainFieldMessage(field, value);
    expect(message).toBe(expected);
    expect(message).not.toMatch(/[a-z]+[A-Z][a-zA-Z]*(M|N|S|Hz|PerS|PerM)\b|\.[a-z]+M\b/);
  });

  it.each(PATCH_NUMBER_FIELDS)('%s: no message for a value the schema accepts', (field) => {
    const patch = testPatch() as unknown as Record<string, Record<string, number>>;
    const [section, key] = field.split('.');
    expect(plainFieldMessage(field, patch[section][key])).toBeNull();
  });

  it('says a cross-field problem plainly: the pickup past the end, in mm', () => {
    const patch = { ...testPatch(), pickup: { positionM: 0.7, output: 'displacement' } };
    const result = validatePatch(patch);
    if (result.ok) throw new Error('expected a problem');
    expect(plainIssueMessage(result.issues[0])).toBe('Pickup position must be inside the string, less than its length (650 mm)');
  });

  it('says a fundamental above half the sample rate plainly, rounded, with units', () => {
    const base = testPatch();
    const result = validatePatch({ ...base, string: { ...base.string, tensionN: 1e9 } });
    if (result.ok) throw new Error('expected a problem');
    const message = plainIssueMessage(result.issues[0]);
    expect(message).toMatch(/^The fundamental would be [\d.]+ Hz, at or above half the sample rate \(24000 Hz\): no mode could sound$/);
    expect(message).not.toMatch(/\d\.\d{5,}/);
  });

  it('names decay-time targets by their frequency: "Decay time at 196 Hz must be longer than 0 s"', () => {
    const string = { lengthM: 0.65, tensionN: 70, linearDensityKgPerM: 6e-4, inharmonicityB: 3e-4 };
    const names = { lowFrequencyHz: 196, highFrequencyHz: 4000 };
    const zero = dampingFromT60({ lowFrequencyHz: 196, lowT60S: 0, highFrequencyHz: 4000, highT60S: 1 }, string);
    if (zero.ok) throw new Error('expected a problem');
    expect(plainIssueMessage(zero.issues[0], names)).toBe('Decay time at 196 Hz must be longer than 0 s');
    const longerHigh = dampingFromT60({ lowFrequencyHz: 196, lowT60S: 1, highFrequencyHz: 4000, highT60S: 2 }, string);
    if (longerHigh.ok) throw new Error('expected a problem');
    expect(plainIssueMessage(longerHigh.issues[0], names)).toMatch(/^Decay time at 4000 Hz must not be longer than the decay time at 196 Hz/);
    const tooLong = dampingFromT60({ lowFrequencyHz: 1000, lowT60S: 10, highFrequencyHz: 2000, highT60S: 1 }, string);
    if (tooLong.ok) throw new Error('expected a problem');
    const message = plainIssueMessage(tooLong.issues[0], { lowFrequencyHz: 1000, highFrequencyHz: 2000 });
    expect(message).toMatch(/^Decay time at 1000 Hz is too long for the decay time at 2000 Hz: keep it at or below [\d.]+ s/);
    expect(message).not.toMatch(/T60S|b1/);
  });

  it('names excitation points in words', () => {
    const base = testPatch();
    const result = validatePatch({ ...base, excitation: { displacementM: [[0, 0.001], [0.3, 0.002], [0.65, 0]] } });
    if (result.ok) throw new Error('expected a problem');
    expect(plainIssueMessage(result.issues[0])).toBe('Shape point 0 height must be 0 (the string is pinned at its supports)');
  });
});
