import { describe, expect, it } from 'vitest';
import { apiErrorBody } from '../../../shared/api/error-body';
import { withFieldLabels } from '../../../src/lib/form-errors';
import { ApiRequestError } from '../../../src/lib/api-error';

describe('the client reads field problems from issues only', () => {
  it('takes the issues of a body as they are', () => {
    const issue = { field: 'string.tensionN', problem: 'must be > 0', got: '-5', message: 'string.tensionN must be > 0, got -5' };
    const error = ApiRequestError.fromBody(422, { error: { code: 'invalid_patch', message: issue.message, field: issue.field, issues: [issue] } });
    expect(error.issues).toEqual([issue]);
    expect(error.fieldMessage('string.tensionN')).toBe(issue.message);
  });

  it('invents no issue from a message that merely looks like "<field> <problem>"', () => {
    const error = ApiRequestError.fromBody(400, { error: { code: 'invalid', message: 'email must be an e-mail address', field: 'email' } });
    expect(error.issues).toEqual([]);
    expect(error.message).toBe('email must be an e-mail address');
  });

  it('a body built by the server’s own builder puts the label before a bare problem, and keeps a sentence of its own', () => {
    const wrong = ApiRequestError.fromBody(400, apiErrorBody(400, 'invalid', 'currentPassword is wrong', 'currentPassword'));
    const labelled = withFieldLabels(wrong, { currentPassword: 'Current password' }) as ApiRequestError;
    expect(labelled.issues.map((issue) => issue.problem)).toEqual(['Current password is wrong']);

    const used = ApiRequestError.fromBody(409, apiErrorBody(409, 'conflict', 'This invitation has already been used', 'token'));
    expect((withFieldLabels(used, { token: 'Invitation link' }) as ApiRequestError).issues.map((issue) => issue.problem)).toEqual(['This invitation has already been used']);
  });
});
