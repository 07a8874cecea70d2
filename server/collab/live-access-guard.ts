import { can } from '../../shared/access/roles';
import { LIVE_ACCESS_MESSAGES, LIVE_CLOSE_CODES, liveCloseFor, type LiveAccessEndReason } from '../../shared/protocol/live-access';
import type { AccessChange } from '../access/access-events';
import { AccessLookup } from '../access/live-access-decision';
import type { AppContext } from '../app-context';
import type { CollabHub } from './collab-hub';
import type { Connection } from './collab-room';

/** How often every open document connection is checked again, whatever happened (token expiry, a missed change). */
export const LIVE_ACCESS_SWEEP_MS = 30_000;

/** Which open connections an access change concerns. */
function concerns(change: AccessChange, connection: Connection, sessionId: string): boolean {
  switch (change.kind) {
    case 'membership':
      return connection.userId === change.userId && connection.studioId === change.studioId;
    case 'user':
      return connection.userId === change.userId;
    case 'session':
      return sessionId === change.sessionId;
    case 'studio':
      return connection.studioId === change.studioId;
  }
}

/**
 * Keeps every open collaboration websocket within its rights: on each access change that concerns
 * it (and on a slow sweep of all of them) the connection's token, membership, role and session are
 * decided again, by the same decision the upgrade used, and the outcome applied at once:
 * - no longer a member, token void, account gone: closed with `accessRevoked` and the reason;
 * - session deleted: the room is closed (`sessionDeleted`) and nothing more is written;
 * - now read-only (role lowered, session archived): told with `permission denied`, writes dropped;
 * - writable again (role raised, session restored): closed with `roleChanged`, so the client
 *   reconnects with a fresh document and its new rights.
 * Returns a function that stops it.
 */
export function attachCollabAccessGuard(context: AppContext, hub: CollabHub, sweepMs = LIVE_ACCESS_SWEEP_MS): () => void {
  /** The latest check of each connection; an older check finishing later is ignored. */
  const latestCheck = new WeakMap<Connection, number>();
  let checks = 0;

  async function recheck(targets: ReturnType<CollabHub['connectionsOf']>, userGone: boolean): Promise<void> {
    const lookup = new AccessLookup(context);
    await Promise.all(
      targets.map(async ({ sessionId, room, connection }) => {
        if (connection.token === undefined) return;
        const check = ++checks;
        latestCheck.set(connection, check);
        const access = await lookup.sessionAccess(connection.token, sessionId, connection.studioId);
        if (latestCheck.get(connection) !== check || !room.connections.has(connection)) return;
        if (!access.ok) {
          const reason: LiveAccessEndReason = access.reason === 'unknown' ? 'removed' : access.reason === 'signed-out' && userGone ? 'account-deleted' : access.reason;
          if (reason === 'session-deleted') return void (await hub.closeSession(sessionId, LIVE_CLOSE_CODES.sessionDeleted, LIVE_ACCESS_MESSAGES['session-deleted']));
          const close = liveCloseFor(reason);
          return room.disconnect(connection, close.code, close.reason);
        }
        const hadRight = connection.role !== undefined && can(connection.role, 'editSessions');
        connection.role = access.role;
        if (access.readOnly && !connection.readOnly) {
          room.setReadOnly(connection, true, access.archived ? LIVE_ACCESS_MESSAGES.readOnlyArchived : LIVE_ACCESS_MESSAGES.readOnlyRole);
        } else if (!access.readOnly && connection.readOnly) {
          // Writable again: a fresh connection gets the server's whole state and the new rights.
          room.disconnect(connection, LIVE_CLOSE_CODES.roleChanged, hadRight ? LIVE_ACCESS_MESSAGES.writableRestored : LIVE_ACCESS_MESSAGES.writableRole);
        }
      }),
    );
  }

  const report = (error: Error) => context.log(`collab: access check failed: ${error.message}`);

  const stopListening = context.access.subscribe((change) => {
    if (change.kind === 'session' && change.reason === 'deleted') {
      return void hub.closeSession(change.sessionId, LIVE_CLOSE_CODES.sessionDeleted, LIVE_ACCESS_MESSAGES['session-deleted']).catch(report);
    }
    if (change.kind === 'studio') {
      const sessions = new Set(hub.connectionsOf((connection) => connection.studioId === change.studioId).map((target) => target.sessionId));
      for (const sessionId of sessions) void hub.closeSession(sessionId, LIVE_CLOSE_CODES.sessionDeleted, LIVE_ACCESS_MESSAGES['session-deleted']).catch(report);
      return;
    }
    const userGone = change.kind === 'user' && change.reason === 'account-deleted';
    if (userGone) {
      // The row is gone: nothing to look up. (Studios deleted with the account are published first, so their rooms are already closed without writing.)
      const close = liveCloseFor('account-deleted');
      for (const { room, connection } of hub.connectionsOf((connection) => connection.userId === change.userId)) room.disconnect(connection, close.code, close.reason);
      return;
    }
    recheck(
      hub.connectionsOf((connection, sessionId) => concerns(change, connection, sessionId)),
      userGone,
    ).catch(report);
  });

  const sweep = setInterval(() => void recheck(hub.connectionsOf(() => true), false).catch(report), sweepMs);
  sweep.unref();

  return () => {
    stopListening();
    clearInterval(sweep);
  };
}
