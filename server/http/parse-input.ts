import type { z } from 'zod';
import { fieldIssue, type FieldIssue } from '../../shared/patch/field-issue';
import type { Patch } from '../../shared/patch/patch-schema';
import { validatePatch } from '../../shared/patch/validate-patch';
import { issuesFromZod } from '../../shared/patch/zod-issues';
import { invalidFields } from './api-error';

/** A problem with the body as a whole is reported as `body`, not as a field of it. */
function asBodyIssue(issue: FieldIssue): FieldIssue {
  if (issue.field !== '(patch)') return issue;
  return { ...issue, field: 'body', message: `body${issue.message.slice('(patch)'.length)}` };
}

/** Parses a request body (or query) with a shared zod schema; a failure is a 400 naming each field. */
export function parseInput<S extends z.ZodType>(schema: S, input: unknown): z.output<S> {
  if (input === undefined || input === null || typeof input !== 'object' || Array.isArray(input)) {
    throw invalidFields([asBodyIssue(fieldIssue([], 'must be a JSON object', input))]);
  }
  const result = schema.safeParse(input);
  if (!result.success) throw invalidFields(issuesFromZod(result.error, input).map(asBodyIssue));
  return result.data;
}

/** Validates a patch carried in a body under `patch`; a failure is a 422 whose fields read `patch.…`. */
export function parsePatch(input: unknown, prefix = 'patch'): Patch {
  const result = validatePatch(input);
  if (result.ok) return result.value;
  throw invalidFields(
    result.issues.map((issue) => {
      const field = issue.field === '(patch)' ? prefix : `${prefix}.${issue.field}`;
      return { ...issue, field, message: `${prefix}${issue.field === '(patch)' ? '' : '.'}${issue.message.replace(/^\(patch\)/, '')}` };
    }),
    422,
  );
}
