import type { DataSource } from 'typeorm';
import { LessThanOrEqual, type QueryDeepPartialEntity } from 'typeorm';
import type { Patch } from '../../shared/patch/patch-schema';
import { Session } from '../db/entities/session';
import { SessionUpdate } from '../db/entities/session-update';

export interface StoredDocument {
  patch: Patch;
  snapshot: Uint8Array | null;
  updates: Uint8Array[];
  /** Id of the last log row read, so compaction removes exactly what it folded in. */
  lastUpdateId: number;
}

/** Where a session's collaborative document lives; the collaboration layer sees only this interface. */
export interface CollabStorage {
  load(sessionId: string): Promise<StoredDocument | null>;
  /** Appends updates in one transaction; returns the id of the last row written. */
  append(sessionId: string, updates: Uint8Array[]): Promise<number>;
  /** Replaces the snapshot with `state` and drops the log rows up to `upToId`, in one transaction. */
  compact(sessionId: string, state: Uint8Array, upToId: number): Promise<void>;
  /** Refreshes the session's patch JSON (for the REST API and the command line). */
  savePatch(sessionId: string, patch: Patch, userId: string | null): Promise<void>;
}

/** The TypeORM implementation on the sessions table and the session_updates log. */
export function typeormCollabStorage(dataSource: DataSource, clock: () => Date): CollabStorage {
  return {
    async load(sessionId) {
      const session = await dataSource.getRepository(Session).findOneBy({ id: sessionId });
      if (!session) return null;
      const rows = await dataSource.getRepository(SessionUpdate).find({ where: { sessionId }, order: { id: 'ASC' } });
      return {
        patch: session.patch,
        snapshot: session.docState ? new Uint8Array(session.docState) : null,
        updates: rows.map((row) => new Uint8Array(row.update)),
        lastUpdateId: rows.length > 0 ? rows[rows.length - 1].id : 0,
      };
    },
    async append(sessionId, updates) {
      return dataSource.transaction(async (manager) => {
        let lastId = 0;
        for (const update of updates) {
          const result = await manager.insert(SessionUpdate, { sessionId, update: Buffer.from(update) });
          lastId = Number(result.identifiers[0].id);
        }
        return lastId;
      });
    },
    async compact(sessionId, state, upToId) {
      await dataSource.transaction(async (manager) => {
        // Folding the log is storage housekeeping, not an edit: updatedAt is set to itself, so TypeORM's
        // UpdateDateColumn does not stamp it with the database's time ("last edited" moves only with edits).
        await manager
          .createQueryBuilder()
          .update(Session)
          .set({ docState: Buffer.from(state), updatedAt: () => 'updatedAt' })
          .where('id = :id', { id: sessionId })
          .execute();
        await manager.delete(SessionUpdate, { sessionId, id: LessThanOrEqual(upToId) });
      });
    },
    async savePatch(sessionId, patch, userId) {
      // Only these columns: a full save would write back a stale docState over a fresh snapshot.
      const changes: QueryDeepPartialEntity<Session> = { patch: patch as QueryDeepPartialEntity<Patch>, updatedAt: clock(), ...(userId ? { updatedById: userId } : {}) };
      await dataSource.getRepository(Session).update({ id: sessionId }, changes);
    },
  };
}
