import { describe, expect, it } from 'vitest';
import { LIMITS } from '../../../shared/limits';
import { jsonSizeBytes, nestingDepth } from '../../../shared/patch/pass-through-bounds';
import { validatePatch } from '../../../shared/patch/validate-patch';
import { testPatch } from '../../support/patches';

/** `{ a: { a: … } }` nested `levels` deep, built without recursion. */
function nested(levels: number): unknown {
  let value: unknown = 'bottom';
  for (let i = 0; i < levels; i++) value = { a: value };
  return value;
}

function issuesOf(input: unknown) {
  const result = validatePatch(input);
  return result.ok ? [] : result.issues;
}

describe('bounds on the fields a patch carries beside the physics', () => {
  it('counts nesting and JSON size without recursion, agreeing with JSON.stringify on ordinary values', () => {
    expect(nestingDepth(nested(3), 100)).toBe(3);
    expect(nestingDepth([[1, 2], [3, [4]]], 100)).toBe(3);
    expect(nestingDepth(nested(100_000), 20)).toBe(21); // stops counting past the bound; no stack overflow
    for (const value of [{ material: 'steel', notes: ['a', 'bc'], gaugeMm: 0.254 }, [1, 2, 3], 'x', { a: { b: {} } }]) {
      expect(jsonSizeBytes(value, 1e9)).toBe(JSON.stringify(value).length);
    }
  });

  it('refuses a pass-through field nested 2,300 levels deep, naming it (the probe that gave a 500)', () => {
    const issues = issuesOf({ ...testPatch(), design: nested(2300) });
    expect(issues).toHaveLength(1);
    expect(issues[0].field).toBe('design');
    expect(issues[0].message).toContain(`at most ${LIMITS.maxPatchNestingDepth} levels`);
  });

  it('refuses deep nesting inside a part of the patch too (string.notes)', () => {
    const patch = testPatch() as Record<string, any>;
    patch.string = { ...patch.string, notes: nested(LIMITS.maxPatchNestingDepth) };
    expect(issuesOf(patch)[0].field).toBe('string.notes');
  });

  it(`keeps designer notes up to the limits, and refuses more than ${LIMITS.maxPassThroughBytes / 1024} KiB of them`, () => {
    const depthOk = { ...testPatch(), design: nested(LIMITS.maxPatchNestingDepth - 1) };
    expect(issuesOf(depthOk)).toEqual([]);
    const small = { ...testPatch(), design: { material: 'phosphor bronze', notes: 'x'.repeat(1000) } };
    expect(issuesOf(small)).toEqual([]);
    const big = { ...testPatch(), design: { notes: 'x'.repeat(LIMITS.maxPassThroughBytes) } };
    const issues = issuesOf(big);
    expect(issues[0].field).toBe('design');
    expect(issues[0].message).toContain('KiB');
    // Many small fields add up.
    const many = { ...testPatch(), design: Object.fromEntries(Array.from({ length: 2000 }, (_, i) => [`note${i}`, 'y'.repeat(40)])) };
    expect(issuesOf(many)[0].field).toBe('design');
  });
});
