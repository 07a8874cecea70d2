import type { Action } from '../../shared/access/roles';
import { ACTION_REASONS } from '../../shared/access/roles';
import { apiErrorBody, type ApiErrorBody, type ApiErrorCode } from '../../shared/api/error-body';
import type { FieldIssue } from '../../shared/patch/field-issue';

/** An expected failure of a request: becomes `{ error: { code, message, field?, issues? } }` with its status (see apiErrorBody). */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: ApiErrorCode,
    message: string,
    readonly field?: string,
    readonly issues?: FieldIssue[],
  ) {
    super(message);
    this.name = 'ApiError';
  }

  /** The response body: whenever a field is blamed (always on 400 and 422), `issues` lists every problem, even a single one. */
  body(): ApiErrorBody {
    return apiErrorBody(this.status, this.code, this.message, this.field, this.issues);
  }
}

/** 404 for anything the caller may not know exists: foreign ids answer exactly like missing ones. */
export const notFound = (what: string) => new ApiError(404, 'not_found', `${what} not found`);

export const forbidden = (action: Action) => new ApiError(403, 'forbidden', `Not allowed: ${ACTION_REASONS[action]}`);

export const unauthenticated = (message = 'Sign in first') => new ApiError(401, 'unauthenticated', message);

export const conflict = (message: string, field?: string) => new ApiError(409, 'conflict', message, field);

/** 400 (malformed body) or 422 (a patch that breaks its rules) listing every field problem. */
export function invalidFields(issues: FieldIssue[], status: 400 | 422 = 400): ApiError {
  const [first] = issues;
  const more = issues.length > 1 ? ` (and ${issues.length - 1} more)` : '';
  return new ApiError(status, status === 422 ? 'invalid_patch' : 'invalid', `${first.message}${more}`, first.field, issues);
}
