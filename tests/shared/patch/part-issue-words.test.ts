import { describe, expect, it } from 'vitest';
import { excitationPartSchema, excitationPartsSchema } from '../../../shared/patch/excitation-part';
import { plainPartIssue } from '../../../shared/patch/part-issue-words';
import { LIMITS } from '../../../shared/limits';

function firstIssue(schema: typeof excitationPartSchema | typeof excitationPartsSchema, value: unknown) {
  const parsed = schema.safeParse(value);
  if (parsed.success) throw new Error('expected a refusal');
  return parsed.error.issues[0];
}

describe('a pluck’s or strike’s problems in plain words', () => {
  it('names the field and the bound in millimetres, never the internal name or a raw float', () => {
    const message = plainPartIssue(firstIssue(excitationPartSchema, { kind: 'pluck', positionM: 0.2, heightM: 0.003, widthM: 0, contact: 'pick' }));
    expect(message).toBe(`Contact width must be at least ${LIMITS.minContactWidthM * 1000} mm`);
    expect(message).not.toMatch(/widthM|0\.0001/);
  });

  it('says which pluck or strike when the problem is in a list', () => {
    const parts = [
      { kind: 'pluck', positionM: 0.2, heightM: 0.003, widthM: 0.01, contact: 'pick' },
      { kind: 'strike', positionM: 0, velocityMPerS: 1, widthM: 0.01 },
    ];
    expect(plainPartIssue(firstIssue(excitationPartsSchema, parts), (index) => (index === 1 ? 'strike 1' : 'pluck 1'))).toBe('Strike 1: position must be more than 0 mm');
  });

  it('asks for a number when one is missing', () => {
    expect(plainPartIssue(firstIssue(excitationPartSchema, { kind: 'strike', positionM: 0.2, velocityMPerS: 'fast', widthM: 0.01 }))).toBe('Velocity must be a number of m/s');
  });
});
