import { LIMITS } from '../limits';
import { fieldIssue, type FieldIssue } from './field-issue';
import { patchSchema } from './patch-schema';

/** The fields the schema knows at the top of a patch and in each of its parts; anything else passes through. */
const KNOWN_FIELDS: Record<string, ReadonlySet<string>> = Object.fromEntries(
  Object.entries(patchSchema.shape).map(([part, schema]) => [part, new Set('shape' in schema ? Object.keys(schema.shape) : [])]),
);
const TOP_FIELDS: ReadonlySet<string> = new Set(Object.keys(patchSchema.shape));

const isObject = (value: unknown): value is Record<string, unknown> => value !== null && typeof value === 'object';

/**
 * The deepest nesting below `value` (a scalar is 0, `{}` and `[]` are 1), counted without recursion
 * so that hostile input cannot overflow the stack; stops counting past `stopAt`.
 */
export function nestingDepth(value: unknown, stopAt: number): number {
  let deepest = 0;
  const stack: Array<[unknown, number]> = [[value, 0]];
  while (stack.length > 0) {
    const [current, depth] = stack.pop() as [unknown, number];
    if (!isObject(current)) continue;
    const inner = depth + 1;
    if (inner > deepest) deepest = inner;
    if (deepest > stopAt) return deepest;
    for (const child of Object.values(current)) if (isObject(child)) stack.push([child, inner]);
  }
  return deepest;
}

/** Size of a value as JSON text, in bytes (UTF-16 code units, close enough for a bound), without recursion; stops past `stopAt`. */
export function jsonSizeBytes(value: unknown, stopAt: number): number {
  let size = 0;
  const stack: unknown[] = [value];
  while (stack.length > 0 && size <= stopAt) {
    const current = stack.pop();
    if (typeof current === 'string') size += current.length + 2;
    else if (isObject(current)) {
      const entries = Object.entries(current);
      size += 2 + Math.max(0, entries.length - 1);
      for (const [key, child] of entries) {
        if (!Array.isArray(current)) size += key.length + 3;
        stack.push(child);
      }
    } else size += String(current).length;
  }
  return size;
}

/**
 * Bounds on the input as a whole, checked before the schema and before anything is stored:
 * the nesting depth of the whole patch (LIMITS.maxPatchNestingDepth) and the total size of the
 * fields it carries beside the physics (LIMITS.maxPassThroughBytes). Without them a patch nested
 * thousands of levels deep overflowed the database layer's stack, and a session grew without bound.
 */
export function passThroughIssues(input: Record<string, unknown>): FieldIssue[] {
  const depthLimit = LIMITS.maxPatchNestingDepth;
  const sizeLimit = LIMITS.maxPassThroughBytes;
  const issues: FieldIssue[] = [];
  let passThroughBytes = 0;
  const visit = (path: string[], value: unknown, passThrough: boolean) => {
    if (issues.length > 0) return;
    const depth = nestingDepth(value, depthLimit);
    if (depth + path.length > depthLimit) {
      issues.push(fieldIssue(path, `is nested too deep: a patch may nest at most ${depthLimit} levels (a polyline point is 4)`, value));
      return;
    }
    if (passThrough) {
      passThroughBytes += jsonSizeBytes(value, sizeLimit) + path[path.length - 1].length + 3;
      if (passThroughBytes > sizeLimit) {
        issues.push(fieldIssue(path, `takes the fields kept beside the physics past ${sizeLimit / 1024} KiB of JSON; keep notes shorter`, value));
      }
    }
  };
  for (const [key, value] of Object.entries(input)) {
    if (!TOP_FIELDS.has(key)) {
      visit([key], value, true);
      continue;
    }
    const known = KNOWN_FIELDS[key];
    if (isObject(value) && !Array.isArray(value) && known.size > 0) {
      for (const [inner, innerValue] of Object.entries(value)) visit([key, inner], innerValue, !known.has(inner));
    } else visit([key], value, false);
  }
  return issues;
}
