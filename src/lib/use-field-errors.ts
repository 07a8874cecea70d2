import { useState } from 'react';
import type { z } from 'zod';
import { issuesFromZod } from '../../shared/patch/zod-issues';
import { ApiRequestError } from './api-error';

/**
 * Field errors of a form: checked first in the browser with the same zod schema the server uses,
 * then filled from the server's answer. `problem` is shown beside the field (the label names it).
 */
export function useFieldErrors() {
  const [errors, setErrors] = useState<Record<string, string>>({});
  return {
    errors,
    clear: () => setErrors({}),
    /** Validates input with a shared schema; returns the parsed value, or null after setting the errors. */
    check<S extends z.ZodType>(schema: S, input: unknown): z.output<S> | null {
      const result = schema.safeParse(input);
      if (result.success) {
        setErrors({});
        return result.data;
      }
      setErrors(Object.fromEntries(issuesFromZod(result.error, input).map((issue) => [issue.field, capitalise(issue.problem)])));
      return null;
    },
    fromServer(error: unknown): void {
      if (error instanceof ApiRequestError && error.issues.length > 0) {
        setErrors(Object.fromEntries(error.issues.map((issue) => [issue.field, capitalise(issue.problem)])));
      }
    },
  };
}

function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}
