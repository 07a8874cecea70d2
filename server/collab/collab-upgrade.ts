import type { IncomingMessage } from 'node:http';
import type { Duplex } from 'node:stream';
import { WebSocketServer } from 'ws';
import { LIMITS } from '../../shared/limits';
import type { AppContext } from '../app-context';
import { tokenFromCookieHeader } from '../auth/authenticate';
import { AccessLookup } from '../access/live-access-decision';
import type { CollabHub } from './collab-hub';
import { User } from '../db/entities/user';

export const COLLAB_PATH = '/collab/';

function refuse(socket: Duplex, status: number, reason: string): void {
  socket.write(`HTTP/1.1 ${status} ${reason}\r\nConnection: close\r\nContent-Type: text/plain\r\nContent-Length: ${Buffer.byteLength(reason)}\r\n\r\n${reason}`);
  socket.destroy();
}

/**
 * Who may open a session's document: a signed-in member of the session's studio (token from the
 * cookie, or `?token=` for scripts and tests). Unknown and foreign sessions are refused
 * before the upgrade completes. Producers and listeners connect read-only, and so does everyone
 * to an archived session (it can be watched and heard, not changed, until it is restored).
 */
export async function authorizeCollabUpgrade(context: AppContext, request: IncomingMessage) {
  const url = new URL(request.url ?? '/', 'http://localhost');
  const sessionId = decodeURIComponent(url.pathname.slice(COLLAB_PATH.length));
  const token = url.searchParams.get('token') ?? tokenFromCookieHeader(request.headers.cookie);
  // The same decision as every later re-check of the open connection (live-access-guard.ts).
  const access = token ? await new AccessLookup(context).sessionAccess(token, sessionId) : null;
  if (!token || !access || (!access.ok && access.reason === 'signed-out')) return { ok: false as const, status: 401, reason: 'Unauthorized' };
  if (!access.ok) return { ok: false as const, status: 404, reason: 'Not Found' };
  // Presence shows the name the server knows, never one the browser claims.
  const user = await context.dataSource.getRepository(User).findOne({ where: { id: access.userId }, select: { id: true, displayName: true } });
  return { ok: true as const, sessionId, token, userId: access.userId, studioId: access.studioId, role: access.role, readOnly: access.readOnly, displayName: user?.displayName ?? 'someone' };
}

/** Routes `upgrade` requests under /collab/ to the document hub, after checking who asks. */
export function collabUpgradeHandler(context: AppContext, hub: CollabHub) {
  const wss = new WebSocketServer({ noServer: true, maxPayload: LIMITS.maxCollabMessageBytes });
  return (request: IncomingMessage, socket: Duplex, head: Buffer) => {
    socket.on('error', () => socket.destroy());
    authorizeCollabUpgrade(context, request).then(
      (decision) => {
        if (!decision.ok) return refuse(socket, decision.status, decision.reason);
        wss.handleUpgrade(request, socket, head, (ws) => hub.connect(decision.sessionId, ws, { userId: decision.userId, readOnly: decision.readOnly, token: decision.token, studioId: decision.studioId, role: decision.role, displayName: decision.displayName }));
      },
      (error: Error) => {
        context.log(`collab: upgrade failed: ${error.message}`);
        refuse(socket, 500, 'Internal Server Error');
      },
    );
  };
}
