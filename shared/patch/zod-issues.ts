import type { z } from 'zod';
import { fieldIssue, valueAtPath, type FieldIssue } from './field-issue';

const typeNames: Record<string, string> = {
  number: 'a number',
  string: 'a string',
  object: 'an object',
  array: 'an array',
  tuple: 'an array',
  boolean: 'true or false',
  int: 'a whole number',
};

/** Turns one zod issue into a FieldIssue whose message names the field and what was found. */
export function issueFromZod(issue: z.core.$ZodIssue, input: unknown): FieldIssue {
  const { present, value } = valueAtPath(input, issue.path);
  if (issue.code === 'invalid_type') {
    if (!present || value === undefined) return fieldIssue(issue.path, 'is required', undefined, false);
    const expected = typeNames[issue.expected] ?? issue.expected;
    if (issue.expected === 'number' && typeof value === 'number') {
      return fieldIssue(issue.path, 'must be a finite number', value);
    }
    return fieldIssue(issue.path, `must be ${expected}`, value);
  }
  if (issue.code === 'too_big' && issue.origin === 'array' && Array.isArray(value)) {
    return fieldIssue(issue.path, issue.message, value);
  }
  return fieldIssue(issue.path, issue.message, value, present);
}


/** Every problem of a failed zod parse, as field issues, paths optionally prefixed (e.g. `patch`). */
export function issuesFromZod(error: z.ZodError, input: unknown, prefix: ReadonlyArray<PropertyKey> = []): FieldIssue[] {
  return error.issues.map((issue) => {
    const found = issueFromZod(issue, input);
    if (prefix.length === 0) return found;
    return fieldIssue([...prefix, ...issue.path], found.problem, valueAtPath(input, issue.path).value, found.got !== null);
  });
}
