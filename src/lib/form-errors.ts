import { ApiRequestError } from './api-error';

/**
 * The server names a field by its key ("newPassword must be at least 10 characters") and lists the
 * bare problem in `issues`. Before its answer goes to useFieldErrors, this puts the field's label in
 * front of the problem, so the message beside the field reads "New password must be at least 10
 * characters". Whole sentences the server wrote ("This invitation has already been used") are kept as they are.
 */
export function withFieldLabels(error: unknown, labels: Readonly<Record<string, string>>): unknown {
  if (!(error instanceof ApiRequestError) || error.issues.length === 0) return error;
  const issues = error.issues.map((issue) => {
    const label = labels[issue.field];
    if (!label) return issue;
    // A bare problem ("must be …", "is wrong") follows the label; a sentence of its own (problem = message) stays as it is.
    return issue.message === issue.problem ? issue : { ...issue, problem: `${label} ${issue.problem}` };
  });
  return new ApiRequestError(error.status, error.code, error.message, error.field, issues);
}

/** True when the error blames one of these fields, so the form shows it there rather than in a notice. */
export function blamesField(error: unknown, fields: readonly string[]): boolean {
  return error instanceof ApiRequestError && error.issues.some((issue) => fields.includes(issue.field));
}
