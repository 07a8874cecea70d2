import type { QueryDeepPartialEntity } from 'typeorm';
import type { Patch } from '../../shared/patch/patch-schema';
import type { AppContext } from '../app-context';
import { Session } from '../db/entities/session';
import { SessionUpdate } from '../db/entities/session-update';

/**
 * Replaces a session's patch from the REST API (an edit, or a preset loaded). With people
 * connected the live document changes and everyone sees it; without, the stored document is reset
 * so the next connection starts from the new patch. The patch column is current either way.
 */
export async function replaceSessionPatch(context: AppContext, sessionId: string, patch: Patch, userId: string): Promise<void> {
  const columns: QueryDeepPartialEntity<Session> = { patch: patch as QueryDeepPartialEntity<Patch>, updatedById: userId, updatedAt: context.clock() };
  const resetStored = () =>
    context.dataSource.transaction(async (manager) => {
      await manager.update(Session, { id: sessionId }, { ...columns, docState: null });
      await manager.delete(SessionUpdate, { sessionId });
    });
  if (context.collab) await context.collab.replacePatch(sessionId, patch, userId, resetStored);
  else await resetStored();
  await context.dataSource.getRepository(Session).update({ id: sessionId }, columns);
}
