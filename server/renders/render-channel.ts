import { RENDER_EVENTS, type RenderRefusedMessage } from '../../shared/protocol/render-protocol';
import { claimedId, parsePayload, payloadProblem, renderSubscribeRequestSchema } from '../../shared/protocol/socket-payloads';
import { LIVE_ACCESS_MESSAGES } from '../../shared/protocol/live-access';
import { AccessLookup } from '../access/live-access-decision';
import type { AppContext } from '../app-context';
import { LIVE_ACCESS_SWEEP_MS } from '../collab/live-access-guard';
import type { AppSocket, AppSocketServer } from '../compute/socket-server';
import { Membership } from '../db/entities/membership';
import type { RenderService } from './render-service';

const ROOM_PREFIX = 'renders:';
const roomOf = (studioId: string) => `${ROOM_PREFIX}${studioId}`;

/**
 * The renders channel on the app's socket.io server: a member subscribes to their studio and is
 * sent every state and progress change of its render jobs. Anyone else is refused as "not found".
 */
export function attachRenderChannel(io: AppSocketServer, context: AppContext, service: RenderService): () => void {
  const stop = service.onProgress((message) => io.to(roomOf(message.studioId)).emit(RENDER_EVENTS.progress, message));
  io.on('connection', (socket) => {
    const refuse = (studioId: string, code: RenderRefusedMessage['code'], message: string) =>
      socket.emit(RENDER_EVENTS.refused, { type: 'refused', studioId, code, message } satisfies RenderRefusedMessage);
    // Payloads are parsed, never trusted: a malformed one is refused with the field it got wrong.
    socket.on(RENDER_EVENTS.subscribe, async (payload: unknown) => {
      const request = parsePayload(renderSubscribeRequestSchema, payload);
      if (!request.ok) return refuse(claimedId(payload, 'studioId'), 'bad_request', payloadProblem(request.issues));
      const { studioId } = request.value;
      try {
        const membership = await context.dataSource.getRepository(Membership).findOneBy({ userId: socket.data.userId, studioId });
        if (!membership) return refuse(studioId, 'not_found', 'Studio not found');
        await socket.join(roomOf(studioId));
        socket.emit(RENDER_EVENTS.joined, { type: 'joined', studioId });
      } catch (error) {
        context.log(`renders: subscribe failed: ${(error as Error).message}`);
      }
    });
    socket.on(RENDER_EVENTS.unsubscribe, (payload: unknown) => {
      const request = parsePayload(renderSubscribeRequestSchema, payload);
      if (!request.ok) return refuse(claimedId(payload, 'studioId'), 'bad_request', payloadProblem(request.issues));
      void socket.leave(roomOf(request.value.studioId));
    });
  });

  const studiosOf = (socket: AppSocket) => [...socket.rooms].filter((room) => room.startsWith(ROOM_PREFIX)).map((room) => room.slice(ROOM_PREFIX.length));
  /** The latest check of each socket; an older check finishing later is ignored. */
  const latestCheck = new WeakMap<AppSocket, number>();
  let checks = 0;

  /** Checks each socket's studios again; a studio it may no longer follow is left, with a `refused` message saying why. */
  async function recheck(sockets: AppSocket[]): Promise<void> {
    const lookup = new AccessLookup(context);
    await Promise.all(
      sockets.map(async (socket) => {
        const check = ++checks;
        latestCheck.set(socket, check);
        const token = socket.data.token;
        if (token === undefined) return;
        const decisions = await Promise.all(studiosOf(socket).map(async (studioId) => ({ studioId, access: await lookup.studioAccess(token, studioId) })));
        if (latestCheck.get(socket) !== check) return;
        for (const { studioId, access } of decisions) {
          if (access.ok) continue;
          const refused: RenderRefusedMessage = access.reason === 'signed-out'
            ? { type: 'refused', studioId, code: 'unauthenticated', message: LIVE_ACCESS_MESSAGES['signed-out'] }
            : { type: 'refused', studioId, code: 'not_found', message: LIVE_ACCESS_MESSAGES.removed };
          socket.emit(RENDER_EVENTS.refused, refused);
          void socket.leave(roomOf(studioId));
        }
      }),
    );
  }

  const report = (error: Error) => context.log(`renders: access check failed: ${error.message}`);
  const stopAccess = context.access.subscribe((change) => {
    if (change.kind === 'session') return; // sessions do not change who follows a studio's renders
    const concerned = [...io.of('/').sockets.values()].filter((socket) =>
      change.kind === 'studio' ? socket.rooms.has(roomOf(change.studioId)) : socket.data.userId === change.userId && (change.kind === 'user' || socket.rooms.has(roomOf(change.studioId))),
    );
    recheck(concerned).catch(report);
  });
  const sweep = setInterval(() => void recheck([...io.of('/').sockets.values()]).catch(report), LIVE_ACCESS_SWEEP_MS);
  sweep.unref();
  return () => {
    stop();
    stopAccess();
    clearInterval(sweep);
  };
}
