import { setPatchNumbers } from '../../../../shared/collab/patch-number-edit';
import { patchDoc } from '../../../../shared/collab/doc-layout';
import type { FieldIssue } from '../../../../shared/patch/field-issue';
import { PATCH_NUMBER_FIELDS, type PatchNumberField } from '../../../../shared/patch/field-rules';
import type { Patch } from '../../../../shared/patch/patch-schema';
import { patchWithNumbers } from '../../../../shared/patch/patch-with-numbers';
import { plainFieldMessage, plainIssueMessage } from '../../../../shared/patch/plain-messages';
import { validatePatch } from '../../../../shared/patch/validate-patch';
import type { SessionEdits } from './commit-patch-number';

type NumberValues = Partial<Record<PatchNumberField, number>>;

const issueKey = (issue: FieldIssue) => `${issue.field} ${issue.problem}`;

/**
 * Why the document refused numbers, in the trade's words: the field's own rule first, then the
 * first problem the change would add to the patch (found on the patch as it would be); the
 * document's own reason, its field path replaced by the label, only if neither says.
 */
export function plainRefusal(patch: Patch, values: NumberValues, reason: string): string {
  for (const [field, value] of Object.entries(values) as Array<[PatchNumberField, number]>) {
    const own = plainFieldMessage(field, value);
    if (own) return own;
  }
  const before = validatePatch(patch);
  const known = new Set(before.ok ? [] : before.issues.map(issueKey));
  const after = validatePatch(patchWithNumbers(patch, values));
  const fresh = after.ok ? undefined : after.issues.find((issue) => !known.has(issueKey(issue)));
  if (fresh) return plainIssueMessage(fresh);
  const field = PATCH_NUMBER_FIELDS.find((name) => reason.startsWith(`${name} `));
  if (!field) return reason;
  const [problem, got] = reason.slice(field.length + 1).split(/, got (?=[^,]*$)/);
  return plainIssueMessage({ field, problem, got: got ?? null, message: reason });
}

/**
 * Writes numbers of the patch as one undoable edit (`setPatchNumbers`), optionally with the design
 * record in the same transaction; returns the refusal in the trade's words (nothing written), or null.
 */
export function commitPlainNumbers(connection: SessionEdits, patch: Patch, values: NumberValues, design?: Record<string, unknown>): string | null {
  const outcome: { reason: string | null } = { reason: null };
  connection.edit((doc, origin) => {
    const result = setPatchNumbers(doc, values, origin);
    if (!result.ok) {
      outcome.reason = result.reason;
      return;
    }
    if (design) doc.transact(() => patchDoc(doc).extras.set('design', design), origin);
  });
  return outcome.reason === null ? null : plainRefusal(patch, values, outcome.reason);
}
