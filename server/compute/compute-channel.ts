import type { Server as HttpServer } from 'node:http';
import { availableParallelism } from 'node:os';
import { Server as SocketServer, type Socket } from 'socket.io';
import { can } from '../../shared/access/roles';
import { validatedPatchFromDoc } from '../../shared/collab/patch-doc';
import { LIMITS } from '../../shared/limits';
import { validatePatch } from '../../shared/patch/validate-patch';
import {
  COMPUTE_EVENTS,
  PROTOCOL_VERSION,
  type ComputeResultMessage,
  type InvalidMessage,
  type JoinedMessage,
  type RefusedMessage,
  type SubscribeRequest,
} from '../../shared/protocol/compute-protocol';
import type { AppContext } from '../app-context';
import { tokenFromCookieHeader, userFromToken } from '../auth/authenticate';
import { isOriginAllowed } from '../http/request-origin';
import type { CollabHub } from '../collab/collab-hub';
import { Membership } from '../db/entities/membership';
import { Session } from '../db/entities/session';
import { ComputeScheduler } from './compute-scheduler';
import { ComputeWorker } from './compute-worker';

const roomOf = (sessionId: string) => `session:${sessionId}`;

interface SessionCompute {
  scheduler: ComputeScheduler;
  sequence: number;
  latest: ComputeResultMessage | InvalidMessage | null;
}

/**
 * The compute channel (socket.io on /socket.io/): members subscribe to a session; on every change
 * of its document the server computes the mode table and a preview on a worker thread and sends
 * every subscriber the result, arrays as binary. A patch that fails validation sends its field
 * problems instead.
 */
export function attachComputeChannel(httpServer: HttpServer, context: AppContext, hub: CollabHub, previewDurationS: number = LIMITS.previewMaxDurationS) {
  const io = new SocketServer(httpServer, {
    path: '/socket.io/',
    serveClient: false,
    destroyUpgrade: false,
    maxHttpBufferSize: 64 * 1024,
    // A page from another site may not open the channel with the user's cookie (403 on polling and upgrade alike).
    allowRequest: (request, callback) => callback(null, isOriginAllowed(context.config, request.headers.origin)),
  });
  // One worker per core; a session always computes on the same one, so two sessions never queue behind each other.
  const workers = Array.from({ length: Math.max(1, Math.min(2, availableParallelism())) }, () => new ComputeWorker());
  let nextWorker = 0;
  const computes = new Map<string, SessionCompute>();

  io.use((socket, next) => {
    const token = (socket.handshake.auth as { token?: unknown })?.token;
    const raw = typeof token === 'string' ? token : tokenFromCookieHeader(socket.handshake.headers.cookie);
    if (!raw) return next(new Error('unauthenticated'));
    userFromToken(context, raw).then(
      (found) => {
        if (!found) return next(new Error('unauthenticated'));
        socket.data.userId = found.user.id;
        next();
      },
      () => next(new Error('unauthenticated')),
    );
  });

  async function currentPatch(sessionId: string) {
    const room = hub.room(sessionId);
    if (room) return validatedPatchFromDoc(room.doc);
    const session = await context.dataSource.getRepository(Session).findOneBy({ id: sessionId });
    return validatePatch(session?.patch);
  }

  function computeFor(sessionId: string): SessionCompute {
    let entry = computes.get(sessionId);
    if (!entry) {
      const worker = workers[nextWorker++ % workers.length];
      const created: SessionCompute = {
        sequence: 0,
        latest: null,
        scheduler: new ComputeScheduler(async () => {
          const sequence = ++created.sequence;
          const patch = await currentPatch(sessionId);
          if (!patch.ok) {
            const invalid: InvalidMessage = { type: 'invalid', sessionId, sequence, issues: patch.issues };
            return () => {
              created.latest = invalid;
              io.to(roomOf(sessionId)).emit(COMPUTE_EVENTS.invalid, invalid);
            };
          }
          const output = await worker.compute(patch.value, previewDurationS);
          const result: ComputeResultMessage = { type: 'result', sessionId, sequence, ...output };
          return () => {
            created.latest = result;
            io.to(roomOf(sessionId)).emit(COMPUTE_EVENTS.result, result);
          };
        }),
      };
      computes.set(sessionId, created);
      entry = created;
    }
    return entry;
  }

  const onChange = (sessionId: string) => computes.get(sessionId)?.scheduler.schedule();
  hub.on('change', onChange);

  io.on('connection', (socket: Socket) => {
    const refuse = (sessionId: string, code: RefusedMessage['code'], message: string) =>
      socket.emit(COMPUTE_EVENTS.refused, { type: 'refused', sessionId, code, message } satisfies RefusedMessage);

    socket.on(COMPUTE_EVENTS.subscribe, async (request: SubscribeRequest) => {
      try {
        const sessionId = typeof request?.sessionId === 'string' ? request.sessionId : '';
        if (request?.protocolVersion !== PROTOCOL_VERSION) return refuse(sessionId, 'protocol', `protocol version ${PROTOCOL_VERSION} is required`);
        const session = await context.dataSource.getRepository(Session).findOne({ where: { id: sessionId }, select: { id: true, studioId: true } });
        const membership = session ? await context.dataSource.getRepository(Membership).findOneBy({ userId: socket.data.userId, studioId: session.studioId }) : null;
        if (!session || !membership) return refuse(sessionId, 'not_found', 'Session not found');
        await socket.join(roomOf(sessionId));
        socket.emit(COMPUTE_EVENTS.joined, { type: 'joined', sessionId, role: membership.role, readOnly: !can(membership.role, 'editSessions') } satisfies JoinedMessage);
        const entry = computeFor(sessionId);
        if (entry.latest && !entry.scheduler.busy) socket.emit(entry.latest.type === 'result' ? COMPUTE_EVENTS.result : COMPUTE_EVENTS.invalid, entry.latest);
        else entry.scheduler.schedule();
      } catch (error) {
        context.log(`compute: subscribe failed: ${(error as Error).message}`);
      }
    });

    socket.on(COMPUTE_EVENTS.unsubscribe, (request: { sessionId?: unknown }) => {
      if (typeof request?.sessionId === 'string') void socket.leave(roomOf(request.sessionId));
    });
  });

  // Forget a session's compute state when its last subscriber leaves.
  io.of('/').adapter.on('delete-room', (room: string) => {
    if (room.startsWith('session:')) computes.delete(room.slice('session:'.length));
  });

  return {
    io,
    close: async () => {
      hub.off('change', onChange);
      await new Promise<void>((resolve) => io.close(() => resolve()));
      await Promise.all(workers.map((worker) => worker.close()));
    },
  };
}
