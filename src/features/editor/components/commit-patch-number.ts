import { setPatchNumbers } from '../../../../shared/collab/patch-number-edit';
import type { PatchNumberField } from '../../../../shared/patch/field-rules';
import type { SessionConnection } from '../../../lib/live-session/session-connection';

/** What the panels need of a live session: running an edit as this person's undoable change. */
export type SessionEdits = Pick<SessionConnection, 'edit'>;

/**
 * Writes typed numbers of the patch as one undoable edit, held to the shared patch schema
 * (`setPatchNumbers`). Returns the schema's message when refused (nothing is written), else null.
 */
export function commitPatchNumbers(connection: SessionEdits, values: Partial<Record<PatchNumberField, number>>): string | null {
  const outcome: { reason: string | null } = { reason: null };
  connection.edit((doc, origin) => {
    const result = setPatchNumbers(doc, values, origin);
    if (!result.ok) outcome.reason = result.reason;
  });
  return outcome.reason;
}
