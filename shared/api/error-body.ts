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

/** Every error the API sends: `{ "error": { "code", "message", "field"?, "issues"? } }`. */
export interface ApiErrorBody {
  error: {
    code: ApiErrorCode;
    message: string;
    /** The first field at fault, e.g. `password` or `patch.string.tensionN`. */
    field?: string;
    /** Every field problem found, when there were several. */
    issues?: FieldIssue[];
  };
}
