import type { FieldIssue } from '../patch/field-issue';

/** Machine-readable error codes the API answers with. */
export type ApiErrorCode =
  | 'invalid'
  | 'invalid_patch'
  | 'unauthenticated'
  | 'forbidden'
  | 'not_found'
  | 'conflict'
  | 'too_large'
  | 'render_quota_full'
  | 'too_many_renders'
  | 'rate_limited'
  | 'internal';

/**
 * Every error the API sends: `{ "error": { "code", "message", "field"?, "issues"? } }`.
 * Whenever a field is blamed (always on a 400 or 422), `issues` lists every field problem, one or
 * many; `field` and `message` repeat the first for older clients.
 */
export interface ApiErrorBody {
  error: {
    code: ApiErrorCode;
    message: string;
    /** The first field at fault, e.g. `password` or `patch.string.tensionN`. */
    field?: string;
    /** Every field problem found: present whenever `field` is, even for a single problem. */
    issues?: FieldIssue[];
  };
}

/**
 * The one issue of an error that blames a single field with a sentence of its own. When the
 * sentence starts with the field's key ("currentPassword is wrong"), the problem is the rest
 * ("is wrong"), so a form can put the field's label in front; otherwise it is the whole sentence.
 */
export function singleFieldIssue(field: string, message: string): FieldIssue {
  const problem = message.startsWith(`${field} `) ? message.slice(field.length + 1) : message;
  return { field, problem, got: null, message };
}

/**
 * Builds an error body. With a field, `issues` is always there: the given ones, or one made from
 * the message. A 400 or 422 that names no field blames `body` (the request as a whole).
 */
export function apiErrorBody(status: number, code: ApiErrorCode, message: string, field?: string, issues?: readonly FieldIssue[]): ApiErrorBody {
  const blamed = field ?? issues?.[0]?.field ?? (status === 400 || status === 422 ? 'body' : undefined);
  if (blamed === undefined) return { error: { code, message } };
  const listed = issues && issues.length > 0 ? [...issues] : [singleFieldIssue(blamed, message)];
  return { error: { code, message, field: blamed, issues: listed } };
}
