import type { Server as HttpServer } from 'node:http';
import { availableParallelism } from 'node:os';
import { Server as SocketServer } from 'socket.io';
import * as Y from 'yjs';
import { LIVE_ACCESS_MESSAGES, SESSION_NOTICE_EVENT, type LiveAccessEndReason, type SessionNotice } from '../../shared/protocol/live-access';
import { AccessLookup } from '../access/live-access-decision';
import { LIVE_ACCESS_SWEEP_MS } from '../collab/live-access-guard';
import { validatedPatchFromDoc } from '../../shared/collab/patch-doc';
import { LIMITS } from '../../shared/limits';
import { validatePatch } from '../../shared/patch/validate-patch';
import {
  COMPUTE_EVENTS,
  PROTOCOL_VERSION,
  type InvalidMessage,
  type ModeTableMessage,
  type JoinedMessage,
  type RefusedMessage,
} from '../../shared/protocol/compute-protocol';
import type { ClientToServerEvents, InterServerEvents, ServerToClientEvents, SocketData } from '../../shared/protocol/socket-events';
import { claimedId, parsePayload, payloadProblem, subscribeRequestSchema, unsubscribeRequestSchema } from '../../shared/protocol/socket-payloads';
import { restampModeTable } from '../../shared/protocol/mode-table-wire';
import type { Patch } from '../../shared/patch/patch-schema';
import type { AppContext } from '../app-context';
import { tokenFromCookieHeader, userFromToken } from '../auth/authenticate';
import { isOriginAllowed } from '../http/request-origin';
import type { CollabHub } from '../collab/collab-hub';
import { Session } from '../db/entities/session';
import { ComputeScheduler } from './compute-scheduler';
import { ComputeWorker } from './compute-worker';
import type { AppSocket } from './socket-server';

const roomOf = (sessionId: string) => `session:${sessionId}`;

const socketToken = (socket: AppSocket): string => socket.data.token;
const subscribedOf = (socket: AppSocket) => socket.data.sessions;

interface SessionCompute {
  scheduler: ComputeScheduler;
  sequence: number;
  /** The last message sent, and the physics of the patch a table was computed for (null for an invalid patch). */
  latest: ModeTableMessage | InvalidMessage | null;
  latestKey: string | null;
  /** Tables of the last few distinct patches (by their physics), so undo or a rename costs no compute. */
  tables: Map<string, Uint8Array>;
}

/**
 * What the channel has done since it started: tables computed on a worker, tables re-sent from a
 * session's cache (an undo, a rename), and table emits (one to a session's room counts once). Read by tests.
 */
export interface ComputeCounts {
  workerComputes: number;
  cachedTables: number;
  tablesSent: number;
}

/** Distinct patches whose tables a session keeps. */
const TABLES_KEPT = 8;

/** What a mode table depends on: the physics, not the name or the designer's notes. */
function physicsKey(patch: Patch): string {
  const { string, excitation, damping, pickup, render } = patch;
  return JSON.stringify([string.lengthM, string.tensionN, string.linearDensityKgPerM, string.inharmonicityB, excitation.displacementM, excitation.velocityMPerS ?? null, damping.b1PerS, damping.b2M2PerS, pickup.output, pickup.positionM, render.sampleRateHz, render.durationS, render.maxModes]);
}

/**
 * The compute channel (socket.io on /socket.io/): members subscribe to a session; on every change
 * of its document the server computes the mode table once (latest wins, on a worker thread) and
 * sends every subscriber the same binary table (shared/protocol/mode-table-wire.ts), stamped with
 * the document version it was computed for. No audio: each browser synthesises its own preview
 * from the table. A patch that fails validation sends its field problems instead.
 */
export function attachComputeChannel(httpServer: HttpServer, context: AppContext, hub: CollabHub, previewDurationS: number = LIMITS.livePreviewMaxDurationS) {
  const io = new SocketServer<ClientToServerEvents, ServerToClientEvents, InterServerEvents, SocketData>(httpServer, {
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
  const counts: ComputeCounts = { workerComputes: 0, cachedTables: 0, tablesSent: 0 };

  io.use((socket, next) => {
    const token = (socket.handshake.auth as { token?: unknown })?.token;
    const raw = typeof token === 'string' ? token : tokenFromCookieHeader(socket.handshake.headers.cookie);
    if (!raw) return next(new Error('unauthenticated'));
    userFromToken(context, raw).then(
      (found) => {
        if (!found) return next(new Error('unauthenticated'));
        socket.data.userId = found.user.id;
        // Kept to check again on every access change (see recheckSockets below).
        socket.data.token = raw;
        socket.data.sessions = new Map();
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
        latestKey: null,
        tables: new Map(),
        scheduler: new ComputeScheduler(async () => {
          const sequence = ++created.sequence;
          const room = hub.room(sessionId);
          // Read before the patch: the table is for this version or a later one, never an earlier one.
          const documentVersion = room?.version ?? 0;
          const stateVector = room ? Y.encodeStateVector(room.doc) : new Uint8Array(0);
          const patch = await currentPatch(sessionId);
          if (!patch.ok) {
            const invalid: InvalidMessage = { type: 'invalid', sessionId, sequence, issues: patch.issues };
            return () => {
              created.latest = invalid;
              created.latestKey = null;
              io.to(roomOf(sessionId)).emit(COMPUTE_EVENTS.invalid, invalid);
            };
          }
          const stamp = { sequence, documentVersion, stateVector };
          const key = physicsKey(patch.value);
          const known = created.tables.get(key);
          if (known) counts.cachedTables++;
          else counts.workerComputes++;
          const table = known ? restampModeTable(known, stamp) : await worker.compute(patch.value, previewDurationS, stamp);
          created.tables.delete(key);
          created.tables.set(key, table);
          if (created.tables.size > TABLES_KEPT) created.tables.delete(created.tables.keys().next().value as string);
          const message: ModeTableMessage = { type: 'table', sessionId, table };
          return () => {
            created.latest = message;
            created.latestKey = key;
            counts.tablesSent++;
            io.to(roomOf(sessionId)).emit(COMPUTE_EVENTS.table, message);
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

  io.on('connection', (socket) => {
    const refuse = (sessionId: string, code: RefusedMessage['code'], message: string) =>
      socket.emit(COMPUTE_EVENTS.refused, { type: 'refused', sessionId, code, message } satisfies RefusedMessage);

    // Payloads are parsed, never trusted: a malformed one is refused with the field it got wrong.
    socket.on(COMPUTE_EVENTS.subscribe, async (payload: unknown) => {
      try {
        const request = parsePayload(subscribeRequestSchema, payload);
        if (!request.ok) return refuse(claimedId(payload, 'sessionId'), 'bad_request', payloadProblem(request.issues));
        const { sessionId, protocolVersion } = request.value;
        if (protocolVersion !== PROTOCOL_VERSION) return refuse(sessionId, 'protocol', `protocol version ${PROTOCOL_VERSION} is required`);
        const access = await new AccessLookup(context).sessionAccess(socketToken(socket), sessionId);
        if (!access.ok) return access.reason === 'signed-out' ? refuse(sessionId, 'unauthenticated', LIVE_ACCESS_MESSAGES['signed-out']) : refuse(sessionId, 'not_found', 'Session not found');
        await socket.join(roomOf(sessionId));
        subscribedOf(socket).set(sessionId, { studioId: access.studioId, readOnly: access.readOnly, role: access.role });
        socket.emit(COMPUTE_EVENTS.joined, { type: 'joined', sessionId, role: access.role, readOnly: access.readOnly, archived: access.archived } satisfies JoinedMessage);
        const entry = computeFor(sessionId);
        // The last table is sent at once when the patch's physics are still what it was computed for;
        // otherwise a fresh one follows. The patch is read again: it may have been replaced in storage
        // while no live document was open, which no document version shows.
        const latest = entry.latest;
        if (latest?.type === 'table' && !entry.scheduler.busy) {
          const patch = await currentPatch(sessionId);
          if (patch.ok && physicsKey(patch.value) === entry.latestKey && entry.latest === latest && !entry.scheduler.busy && subscribedOf(socket).has(sessionId)) {
            counts.tablesSent++;
            socket.emit(COMPUTE_EVENTS.table, latest);
            return;
          }
        }
        entry.scheduler.schedule();
      } catch (error) {
        context.log(`compute: subscribe failed: ${(error as Error).message}`);
      }
    });

    socket.on(COMPUTE_EVENTS.unsubscribe, (payload: unknown) => {
      const request = parsePayload(unsubscribeRequestSchema, payload);
      if (!request.ok) return refuse(claimedId(payload, 'sessionId'), 'bad_request', payloadProblem(request.issues));
      subscribedOf(socket).delete(request.value.sessionId);
      void socket.leave(roomOf(request.value.sessionId));
    });
  });

  const notify = (socket: AppSocket, notice: SessionNotice) => socket.emit(SESSION_NOTICE_EVENT, notice);
  const endAccess = (socket: AppSocket, sessionId: string, reason: LiveAccessEndReason) => {
    notify(socket, { kind: 'access-ended', sessionId, reason, message: LIVE_ACCESS_MESSAGES[reason] });
    subscribedOf(socket).delete(sessionId);
    void socket.leave(roomOf(sessionId));
  };

  /** The latest check of each socket; an older check finishing later is ignored. */
  const latestCheck = new WeakMap<AppSocket, number>();
  let checks = 0;

  /**
   * Decides again, for each socket, whether its token is still good and what it may do in each
   * session it follows; a void token ends with a notice per session and a disconnect.
   */
  async function recheckSockets(sockets: AppSocket[], userGone: boolean): Promise<void> {
    const lookup = new AccessLookup(context);
    await Promise.all(
      sockets.map(async (socket) => {
        const check = ++checks;
        latestCheck.set(socket, check);
        const subscribed = subscribedOf(socket);
        const user = await lookup.user(socketToken(socket));
        const decisions = user ? await Promise.all([...subscribed].map(async ([sessionId, known]) => ({ sessionId, known, access: await lookup.sessionAccess(socketToken(socket), sessionId, known.studioId) }))) : [];
        if (latestCheck.get(socket) !== check || !socket.connected) return;
        if (!user) {
          for (const sessionId of [...subscribed.keys()]) endAccess(socket, sessionId, userGone ? 'account-deleted' : 'signed-out');
          return void socket.disconnect(true);
        }
        for (const { sessionId, known, access } of decisions) {
          if (!subscribed.has(sessionId)) continue;
          if (!access.ok) {
            endAccess(socket, sessionId, access.reason === 'unknown' ? 'removed' : access.reason);
            continue;
          }
          if (access.readOnly === known.readOnly) continue;
          known.readOnly = access.readOnly;
          if (access.readOnly) {
            const reason = access.archived ? 'archived' : 'role';
            notify(socket, { kind: 'read-only', sessionId, reason, message: reason === 'archived' ? LIVE_ACCESS_MESSAGES.readOnlyArchived : LIVE_ACCESS_MESSAGES.readOnlyRole });
          } else {
            notify(socket, { kind: 'writable', sessionId, message: known.role === access.role ? LIVE_ACCESS_MESSAGES.writableRestored : LIVE_ACCESS_MESSAGES.writableRole });
          }
          known.role = access.role;
        }
      }),
    );
  }

  const report = (error: Error) => context.log(`compute: access check failed: ${error.message}`);
  const allSockets = () => [...io.of('/').sockets.values()];
  const stopAccess = context.access.subscribe((change) => {
    const userGone = change.kind === 'user' && change.reason === 'account-deleted';
    const concerned = allSockets().filter((socket) => {
      if (change.kind === 'user' || change.kind === 'membership') return socket.data.userId === change.userId;
      if (change.kind === 'session') return subscribedOf(socket).has(change.sessionId);
      return [...subscribedOf(socket).values()].some((known) => known.studioId === change.studioId);
    });
    if (change.kind === 'session' && change.reason === 'deleted') {
      for (const socket of concerned) endAccess(socket, change.sessionId, 'session-deleted');
      return;
    }
    recheckSockets(concerned, userGone).catch(report);
  });
  const sweep = setInterval(() => void recheckSockets(allSockets(), false).catch(report), LIVE_ACCESS_SWEEP_MS);
  sweep.unref();

  // Notices the document hub raises (edits not being stored, stored again) go to the session's subscribers.
  const onNotice = (notice: SessionNotice) => void io.to(roomOf(notice.sessionId)).emit(SESSION_NOTICE_EVENT, notice);
  hub.on('notice', onNotice);

  // Forget a session's compute state when its last subscriber leaves.
  io.of('/').adapter.on('delete-room', (room: string) => {
    if (room.startsWith('session:')) computes.delete(room.slice('session:'.length));
  });

  return {
    io,
    counts: counts as Readonly<ComputeCounts>,
    close: async () => {
      hub.off('change', onChange);
      hub.off('notice', onNotice);
      stopAccess();
      clearInterval(sweep);
      await new Promise<void>((resolve) => io.close(() => resolve()));
      await Promise.all(workers.map((worker) => worker.close()));
    },
  };
}
