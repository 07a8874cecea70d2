import type { ApiErrorBody, ApiErrorCode } from '../../shared/api/error-body';
import type { FieldIssue } from '../../shared/patch/field-issue';

/** The one error type of the client: the server's error body, or a network failure. */
export class ApiRequestError extends Error {
  constructor(
    readonly status: number,
    readonly code: ApiErrorCode | 'network',
    message: string,
    readonly field?: string,
    readonly issues: FieldIssue[] = [],
  ) {
    super(message);
    this.name = 'ApiRequestError';
  }

  static fromBody(status: number, body: unknown): ApiRequestError {
    const error = (body as Partial<ApiErrorBody> | null)?.error;
    if (!error) return new ApiRequestError(status, 'internal', `The server answered ${status}`);
    // The server lists every field problem under `issues`, a single one too; nothing is read out of the message.
    return new ApiRequestError(status, error.code, error.message, error.field, Array.isArray(error.issues) ? error.issues : []);
  }

  /** The message to show beside one field, if the server blamed it. */
  fieldMessage(field: string): string | undefined {
    return this.issues.find((issue) => issue.field === field)?.message;
  }
}

export function isUnauthenticated(error: unknown): boolean {
  return error instanceof ApiRequestError && error.status === 401;
}
