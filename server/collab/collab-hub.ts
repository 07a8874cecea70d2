import { EventEmitter } from 'node:events';
import type { WebSocket } from 'ws';
import type { Patch } from '../../shared/patch/patch-schema';
import { LIVE_ACCESS_MESSAGES, LIVE_CLOSE_CODES, type SessionNotice } from '../../shared/protocol/live-access';
import { LIMITS } from '../../shared/limits';
import { CollabRoom, type Connection } from './collab-room';
import type { CollabStorage } from './collab-storage';

const HEARTBEAT_MS = 30_000;

/**
 * All live session documents. Opens a room on a session's first connection, frees it (after its
 * state is written) when the last one leaves. Emits `change` (sessionId) on every document edit.
 */
export class CollabHub extends EventEmitter {
  private readonly rooms = new Map<string, CollabRoom>();
  private readonly closing = new Map<string, Promise<void>>();
  private readonly heartbeat: NodeJS.Timeout;

  constructor(
    private readonly storage: CollabStorage,
    private readonly log: (line: string) => void,
  ) {
    super();
    this.heartbeat = setInterval(() => this.checkAlive(), HEARTBEAT_MS);
    this.heartbeat.unref();
  }

  private alive = new WeakMap<WebSocket, boolean>();

  private checkAlive(): void {
    for (const room of this.rooms.values()) {
      for (const connection of room.connections) {
        if (this.alive.get(connection.socket) === false) {
          connection.socket.terminate();
          room.removeConnection(connection);
          continue;
        }
        this.alive.set(connection.socket, false);
        connection.socket.ping();
      }
    }
  }

  /** Who is connected to each live session, by user id (each person once). */
  presence(): Map<string, string[]> {
    const result = new Map<string, string[]>();
    for (const [sessionId, room] of this.rooms) result.set(sessionId, [...new Set([...room.connections].map((connection) => connection.userId))]);
    return result;
  }

  /** The live room of a session, if anyone is connected. */
  room(sessionId: string): CollabRoom | undefined {
    return this.rooms.get(sessionId);
  }

  private async openRoom(sessionId: string): Promise<CollabRoom> {
    await this.closing.get(sessionId);
    let room = this.rooms.get(sessionId);
    if (!room) {
      room = new CollabRoom(sessionId, this.storage, this.log);
      this.rooms.set(sessionId, room);
      room.on('change', () => this.emit('change', sessionId));
      room.on('notice', (notice: SessionNotice) => this.emit('notice', notice));
      room.on('empty', () => void this.closeRoom(sessionId, room as CollabRoom));
      room.ready.catch(() => this.rooms.delete(sessionId));
    }
    await room.ready;
    return room;
  }

  private closeRoom(sessionId: string, room: CollabRoom): Promise<void> {
    if (this.rooms.get(sessionId) !== room || room.connections.size > 0) return Promise.resolve();
    this.rooms.delete(sessionId);
    const done = room
      .close()
      .catch((error: Error) => this.log(`collab: closing session ${sessionId}: ${error.message}`))
      .finally(() => this.closing.delete(sessionId));
    this.closing.set(sessionId, done);
    return done;
  }

  /**
   * Takes a websocket that passed authentication. Messages are listened for at once and buffered
   * until the room has loaded, then replayed in order.
   */
  connect(sessionId: string, socket: WebSocket, who: { userId: string; readOnly: boolean } & Pick<Connection, 'token' | 'studioId' | 'role' | 'displayName'>): void {
    const connection: Connection = { ...who, socket, awarenessIds: new Set(), toldReadOnly: false };
    if (this.deleting.has(sessionId)) return void socket.close(LIVE_CLOSE_CODES.sessionDeleted, LIVE_ACCESS_MESSAGES['session-deleted']);
    const buffered: Uint8Array[] = [];
    let room: CollabRoom | null = null;
    this.alive.set(socket, true);
    socket.on('pong', () => this.alive.set(socket, true));
    let bufferedBytes = 0;
    // No message, however malformed, may throw past here: one connection's fault never stops the process.
    const handle = (target: CollabRoom, message: Uint8Array) => {
      try {
        target.handleMessage(connection, message);
      } catch (error) {
        this.log(`collab: bad message on session ${sessionId}: ${(error as Error).message}`);
        socket.close(1003, 'bad message');
      }
    };
    socket.on('message', (data: Buffer) => {
      const message = new Uint8Array(data.buffer, data.byteOffset, data.byteLength);
      if (room) return handle(room, message);
      bufferedBytes += message.byteLength;
      if (bufferedBytes > LIMITS.maxCollabMessageBytes) return void socket.close(LIVE_CLOSE_CODES.flooded, 'too much sent before the session had opened');
      buffered.push(message);
    });
    socket.on('close', () => room?.removeConnection(connection));
    socket.on('error', () => socket.terminate());
    this.openRoom(sessionId).then(
      (opened) => {
        if (this.deleting.has(sessionId)) socket.close(LIVE_CLOSE_CODES.sessionDeleted, LIVE_ACCESS_MESSAGES['session-deleted']);
        if (socket.readyState !== socket.OPEN) {
          if (opened.connections.size === 0) void this.closeRoom(sessionId, opened);
          return;
        }
        room = opened;
        opened.addConnection(connection);
        for (const message of buffered.splice(0)) handle(opened, message);
      },
      (error: Error) => {
        this.log(`collab: cannot open session ${sessionId}: ${error.message}`);
        socket.close(1011, 'session unavailable');
      },
    );
  }

  /**
   * Replaces a session's content with a patch (REST edit or preset loaded): in the live document when
   * someone is connected (everyone sees it at once), otherwise in storage so the next load starts from it.
   */
  async replacePatch(sessionId: string, patch: Patch, userId: string, resetStored: () => Promise<void>): Promise<void> {
    const room = this.rooms.get(sessionId);
    if (room) {
      room.replacePatch(patch, userId);
      await room.flush();
    } else {
      await this.closing.get(sessionId);
      await resetStored();
      // No live document: the compute channel's subscribers still get the new patch's table.
      this.emit('change', sessionId);
    }
  }

  /** Sessions being deleted: no room opens for them, and nothing of theirs is written. */
  private readonly deleting = new Set<string>();

  /** Every live connection, with its session, that `concerns` picks. */
  connectionsOf(concerns: (connection: Connection, sessionId: string) => boolean): Array<{ sessionId: string; room: CollabRoom; connection: Connection }> {
    const found: Array<{ sessionId: string; room: CollabRoom; connection: Connection }> = [];
    for (const [sessionId, room] of this.rooms) for (const connection of room.connections) if (concerns(connection, sessionId)) found.push({ sessionId, room, connection });
    return found;
  }

  /**
   * Before a session's rows are deleted: refuses new connections and stops writing its room, once
   * writes already under way have finished. `resume` undoes it when the deletion fails.
   */
  async stopStoring(sessionId: string): Promise<{ resume: () => void }> {
    this.deleting.add(sessionId);
    await this.closing.get(sessionId);
    const room = this.rooms.get(sessionId);
    await room?.stopStoring();
    return {
      resume: () => {
        this.deleting.delete(sessionId);
        room?.resumeStoring();
      },
    };
  }

  /**
   * Closes a deleted session's room: every connection is closed with `code` and `reason`, and the
   * document is freed without writing anything (the rows are gone).
   */
  async closeSession(sessionId: string, code: number, reason: string): Promise<void> {
    this.deleting.add(sessionId);
    const room = this.rooms.get(sessionId);
    if (!room) return;
    this.rooms.delete(sessionId);
    const stopped = room.stopStoring();
    for (const connection of [...room.connections]) room.disconnect(connection, code, reason);
    await stopped;
    await room.close();
  }

  /** Closes every connection and writes every room (server shutdown). */
  async close(): Promise<void> {
    clearInterval(this.heartbeat);
    for (const room of [...this.rooms.values()]) {
      for (const connection of [...room.connections]) {
        connection.socket.terminate();
        room.removeConnection(connection); // the last one empties the room, which starts its close
      }
    }
    await Promise.all(this.closing.values());
  }
}
