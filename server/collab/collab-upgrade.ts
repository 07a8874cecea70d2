import type { IncomingMessage } from 'node:http';
import type { Duplex } from 'node:stream';
import { WebSocketServer } from 'ws';
import { can } from '../../shared/access/roles';
import { LIMITS } from '../../shared/limits';
import type { AppContext } from '../app-context';
import { tokenFromCookieHeader, userFromToken } from '../auth/authenticate';
import { Membership } from '../db/entities/membership';
import { Session } from '../db/entities/session';
import type { CollabHub } from './collab-hub';

export const COLLAB_PATH = '/collab/';

function refuse(socket: Duplex, status: number, reason: string): void {
  socket.write(`HTTP/1.1 ${status} ${reason}\r\nConnection: close\r\nContent-Type: text/plain\r\nContent-Length: ${Buffer.byteLength(reason)}\r\n\r\n${reason}`);
  socket.destroy();
}

/**
 * Who may open a session's document: a signed-in member of the session's studio (token from the
 * cookie, or `?token=` for scripts and tests). Unknown, foreign and archived sessions are refused
 * before the upgrade completes. Producers and listeners connect read-only.
 */
export async function authorizeCollabUpgrade(context: AppContext, request: IncomingMessage) {
  const url = new URL(request.url ?? '/', 'http://localhost');
  const sessionId = decodeURIComponent(url.pathname.slice(COLLAB_PATH.length));
  const token = url.searchParams.get('token') ?? tokenFromCookieHeader(request.headers.cookie);
  const found = token ? await userFromToken(context, token) : null;
  if (!found) return { ok: false as const, status: 401, reason: 'Unauthorized' };
  const session = sessionId ? await context.dataSource.getRepository(Session).findOne({ where: { id: sessionId }, select: { id: true, studioId: true, archived: true } }) : null;
  const membership = session ? await context.dataSource.getRepository(Membership).findOneBy({ userId: found.user.id, studioId: session.studioId }) : null;
  if (!session || !membership) return { ok: false as const, status: 404, reason: 'Not Found' };
  if (session.archived) return { ok: false as const, status: 410, reason: 'Gone' };
  return { ok: true as const, sessionId, userId: found.user.id, role: membership.role, readOnly: !can(membership.role, 'editSessions') };
}

/** Routes `upgrade` requests under /collab/ to the document hub, after checking who asks. */
export function collabUpgradeHandler(context: AppContext, hub: CollabHub) {
  const wss = new WebSocketServer({ noServer: true, maxPayload: LIMITS.maxCollabMessageBytes });
  return (request: IncomingMessage, socket: Duplex, head: Buffer) => {
    socket.on('error', () => socket.destroy());
    authorizeCollabUpgrade(context, request).then(
      (decision) => {
        if (!decision.ok) return refuse(socket, decision.status, decision.reason);
        wss.handleUpgrade(request, socket, head, (ws) => hub.connect(decision.sessionId, ws, { userId: decision.userId, readOnly: decision.readOnly }));
      },
      (error: Error) => {
        context.log(`collab: upgrade failed: ${error.message}`);
        refuse(socket, 500, 'Internal Server Error');
      },
    );
  };
}
