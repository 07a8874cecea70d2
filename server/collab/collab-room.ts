import { EventEmitter } from 'node:events';
import * as decoding from 'lib0/decoding';
import * as encoding from 'lib0/encoding';
import type { WebSocket } from 'ws';
import * as awarenessProtocol from 'y-protocols/awareness';
import * as authProtocol from 'y-protocols/auth';
import * as syncProtocol from 'y-protocols/sync';
import * as Y from 'yjs';
import { writePatchToDoc, validatedPatchFromDoc } from '../../shared/collab/patch-doc';
import type { Patch } from '../../shared/patch/patch-schema';
import type { Role } from '../../shared/access/roles';
import type { CollabStorage } from './collab-storage';
import { closeReason, LiveEditGate } from './live-edit-gate';
import { filterPresenceUpdate } from './presence-filter';
import { readStoredLog } from './stored-log-repair';
import { presenceColour } from '../../shared/collab/presence-colour';
import type { SessionNotice } from '../../shared/protocol/live-access';

/** y-websocket's message types. */
const MESSAGE_SYNC = 0;
const MESSAGE_AWARENESS = 1;
const MESSAGE_AUTH = 2;
const MESSAGE_QUERY_AWARENESS = 3;

/** Origin of updates the room applies itself (loading, REST edits); they are never echoed as user edits. */
export const STORAGE_ORIGIN = Symbol('storage');
export const SERVER_ORIGIN = Symbol('server');

const FLUSH_MS = 20;
const PATCH_REFRESH_MS = 200;
const COMPACT_EVERY_UPDATES = 500;

export interface Connection {
  socket: WebSocket;
  userId: string;
  readOnly: boolean;
  /** Awareness client ids this connection introduced, removed when it closes. */
  awarenessIds: Set<number>;
  toldReadOnly: boolean;
  /** The token the connection was opened with, checked again on every access change (live-access-guard.ts). */
  token?: string;
  /** The studio of the session, and the role the connection was given (or last checked with). */
  studioId?: string;
  role?: Role;
  /** The person's display name, from the server's records: what everyone sees as their presence. */
  displayName?: string;
}

/** How long to wait before trying again to store edits the database refused. */
const RETRY_STORE_MS = 1000;

/** JSON with every object's keys sorted, so two equal patches compare equal whatever order their fields were written in. */
function sortedJson(value: unknown): string {
  return JSON.stringify(value, (_key, inner: unknown) =>
    inner !== null && typeof inner === 'object' && !Array.isArray(inner)
      ? Object.fromEntries(Object.entries(inner as Record<string, unknown>).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)))
      : inner,
  );
}

/**
 * One session's live document: its connections, presence, and persistence. Every update is queued
 * for the database before it is broadcast, and written within FLUSH_MS; the session's patch JSON is
 * refreshed shortly after each change. Emits `change` (the last writer's user id) after each edit.
 */
export class CollabRoom extends EventEmitter {
  readonly doc = new Y.Doc({ gc: true });
  readonly awareness = new awarenessProtocol.Awareness(this.doc);
  readonly connections = new Set<Connection>();
  readonly ready: Promise<void>;
  private pending: Uint8Array[] = [];
  private flushTimer: NodeJS.Timeout | null = null;
  private writes: Promise<unknown> = Promise.resolve();
  private lastUpdateId = 0;
  /** Edits admitted since the room opened: the version a mode table is stamped with. */
  private admitted = 0;
  private updatesSinceCompact = 0;
  private patchTimer: NodeJS.Timeout | null = null;
  private lastWriter: string | null = null;
  /** The patch as last saved (or as loaded), in sorted-key JSON: only a real change refreshes it and the session's "last edited". */
  private savedPatchJson: string | null = null;
  private closed = false;
  /** Set once the session is being deleted: nothing more is written (see stopStoring). */
  private storingStopped = false;
  /** Checks every edit before the document takes it (created once the document has loaded). */
  private gate: LiveEditGate | null = null;
  /** True while an admitted edit is applied: the gate's probe has it already. */
  private applyingAdmitted = false;
  /** False while the database refuses this session's edits (people are told, and writes are retried). */
  private storing = true;
  private retryTimer: NodeJS.Timeout | null = null;

  constructor(
    readonly sessionId: string,
    private readonly storage: CollabStorage,
    private readonly log: (line: string) => void,
  ) {
    super();
    this.awareness.setLocalState(null); // the server has no presence of its own
    this.ready = this.load().then(() => {
      this.gate = new LiveEditGate(this.doc);
    });
    this.doc.on('update', (update: Uint8Array, origin: unknown) => this.onUpdate(update, origin));
    this.awareness.on('update', ({ added, updated, removed }: { added: number[]; updated: number[]; removed: number[] }, origin: unknown) => {
      const changed = [...added, ...updated, ...removed];
      const connection = origin as Connection | null;
      if (connection && this.connections.has(connection)) {
        for (const id of added) connection.awarenessIds.add(id);
        for (const id of removed) connection.awarenessIds.delete(id);
      }
      const encoder = encoding.createEncoder();
      encoding.writeVarUint(encoder, MESSAGE_AWARENESS);
      encoding.writeVarUint8Array(encoder, awarenessProtocol.encodeAwarenessUpdate(this.awareness, changed));
      this.broadcast(encoding.toUint8Array(encoder), null);
    });
  }

  private async load(): Promise<void> {
    const stored = await this.storage.load(this.sessionId);
    if (!stored) throw new Error(`session ${this.sessionId} is gone`);
    this.lastUpdateId = stored.lastUpdateId;
    const updates = [...(stored.snapshot ? [stored.snapshot] : []), ...stored.updates];
    if (updates.length > 0) {
      const reading = readStoredLog(updates);
      if (reading.state) Y.applyUpdate(this.doc, reading.state, STORAGE_ORIGIN);
      if (reading.problem !== null) {
        // A log stored before live edits were checked: open from the last valid state and keep only that.
        if (!reading.state) writePatchToDoc(this.doc, stored.patch, STORAGE_ORIGIN);
        this.log(
          `collab: session ${this.sessionId}: stored edits hold an invalid patch (${reading.problem}); opened from ${reading.state ? `its last valid state (${reading.kept} of ${updates.length} stored updates)` : 'its saved patch'}`,
        );
        await this.storage.compact(this.sessionId, Y.encodeStateAsUpdate(this.doc), stored.lastUpdateId);
      }
    } else {
      // First time live: the document starts from the session's patch, written once and stored.
      writePatchToDoc(this.doc, stored.patch, SERVER_ORIGIN);
    }
    const opened = validatedPatchFromDoc(this.doc);
    if (opened.ok) this.savedPatchJson = sortedJson(opened.value);
  }

  private onUpdate(update: Uint8Array, origin: unknown): void {
    if (!this.applyingAdmitted) this.gate?.mirror(update);
    if (origin === STORAGE_ORIGIN) return;
    this.admitted++;
    // Persist first, then broadcast: the update is queued for the database before anyone sees it.
    this.pending.push(update);
    this.flushTimer ??= setTimeout(() => void this.flush(), FLUSH_MS);
    const encoder = encoding.createEncoder();
    encoding.writeVarUint(encoder, MESSAGE_SYNC);
    syncProtocol.writeUpdate(encoder, update);
    this.broadcast(encoding.toUint8Array(encoder), origin as Connection | null);
    const writer = (origin as Connection | null)?.userId ?? null;
    if (writer) this.lastWriter = writer;
    this.patchTimer ??= setTimeout(() => void this.refreshPatch(), PATCH_REFRESH_MS);
    this.emit('change', writer);
  }

  /** How many edits the document has taken since the room opened (a mode table's document version). */
  get version(): number {
    return this.admitted;
  }

  /** Writes queued updates in one transaction; writes run one after another, in order. */
  flush(): Promise<unknown> {
    if (this.flushTimer) clearTimeout(this.flushTimer);
    this.flushTimer = null;
    const batch = this.pending;
    this.pending = [];
    if (batch.length > 0 && !this.storingStopped) {
      this.writes = this.writes
        // One row per flush: the batch merged into a single update (Yjs merges without loss).
        .then(() => this.storage.append(this.sessionId, [batch.length === 1 ? batch[0] : Y.mergeUpdates(batch)]))
        .then((lastId) => {
          this.lastUpdateId = lastId;
          this.setStoring(true);
          this.updatesSinceCompact += batch.length;
          if (this.updatesSinceCompact >= COMPACT_EVERY_UPDATES) return this.compactNow();
        })
        .catch((error: Error) => {
          this.log(`collab: could not store updates of session ${this.sessionId}: ${error.message}`);
          // Keep the edits and try again; meanwhile everyone is told their edits are not being saved.
          this.pending = [Y.mergeUpdates([...batch, ...this.pending])];
          this.setStoring(false);
          if (!this.closed && !this.storingStopped) {
            this.retryTimer ??= setTimeout(() => {
              this.retryTimer = null;
              void this.flush();
            }, RETRY_STORE_MS);
          }
        });
    }
    return this.writes;
  }

  private compactNow(): Promise<void> {
    this.updatesSinceCompact = 0;
    return this.storage.compact(this.sessionId, Y.encodeStateAsUpdate(this.doc), this.lastUpdateId);
  }

  /** Folds the log into one snapshot (after everything queued is written). */
  async compact(): Promise<void> {
    await this.flush();
    this.writes = this.writes.then(() => this.compactNow());
    await this.writes;
  }

  /** Tells everyone in the session when storing stops or starts working again (SessionNotice, relayed by the compute channel). */
  private setStoring(storing: boolean): void {
    if (this.storing === storing) return;
    this.storing = storing;
    const notice: SessionNotice = storing
      ? { kind: 'saving', sessionId: this.sessionId }
      : { kind: 'not-saving', sessionId: this.sessionId, message: 'The server cannot save this session right now. Your edits are kept here and saved once it can.' };
    this.emit('notice', notice);
  }

  /** Never rejects: a failure here is logged, and must not end the process. */
  private async refreshPatch(): Promise<void> {
    this.patchTimer = null;
    if (this.storingStopped) return;
    try {
      const result = validatedPatchFromDoc(this.doc);
      if (!result.ok) return;
      // Opening, syncing and closing change nothing: the patch and "last edited" are written only when the patch differs.
      const json = sortedJson(result.value);
      if (json === this.savedPatchJson) return;
      await this.storage.savePatch(this.sessionId, result.value, this.lastWriter);
      this.savedPatchJson = json;
    } catch (error) {
      this.log(`collab: could not refresh the patch of session ${this.sessionId}: ${(error as Error).message}`);
    }
  }

  /** Replaces the whole document content with a patch (REST edits, a preset loaded). */
  replacePatch(patch: Patch, userId: string): void {
    this.lastWriter = userId;
    writePatchToDoc(this.doc, patch, SERVER_ORIGIN);
  }

  private broadcast(message: Uint8Array, except: Connection | null): void {
    for (const connection of this.connections) if (connection !== except) this.send(connection, message);
  }

  send(connection: Connection, message: Uint8Array): void {
    if (connection.socket.readyState !== connection.socket.OPEN) return;
    connection.socket.send(message, (error) => {
      if (error) this.removeConnection(connection);
    });
  }

  /** Starts a connection's sync: sync step 1 from the server, and everyone's presence. */
  addConnection(connection: Connection): void {
    this.connections.add(connection);
    const encoder = encoding.createEncoder();
    encoding.writeVarUint(encoder, MESSAGE_SYNC);
    syncProtocol.writeSyncStep1(encoder, this.doc);
    this.send(connection, encoding.toUint8Array(encoder));
    const states = [...this.awareness.getStates().keys()];
    if (states.length > 0) {
      const awarenessEncoder = encoding.createEncoder();
      encoding.writeVarUint(awarenessEncoder, MESSAGE_AWARENESS);
      encoding.writeVarUint8Array(awarenessEncoder, awarenessProtocol.encodeAwarenessUpdate(this.awareness, states));
      this.send(connection, encoding.toUint8Array(awarenessEncoder));
    }
  }

  /**
   * Handles one y-websocket message. Writers' updates are applied; a read-only connection's
   * document writes (sync step 2 and updates) are dropped and it is told once that it is read-only.
   * Sync step 1 and presence are always answered.
   */
  handleMessage(connection: Connection, data: Uint8Array): void {
    const decoder = decoding.createDecoder(data);
    const encoder = encoding.createEncoder();
    const type = decoding.readVarUint(decoder);
    if (type === MESSAGE_SYNC) {
      const subtype = decoding.peekVarUint(decoder);
      if (subtype !== syncProtocol.messageYjsSyncStep1 && connection.readOnly) {
        if (!connection.toldReadOnly) {
          connection.toldReadOnly = true;
          const denied = encoding.createEncoder();
          encoding.writeVarUint(denied, MESSAGE_AUTH);
          authProtocol.writePermissionDenied(denied, 'read-only: your role may view this session but not edit it');
          this.send(connection, encoding.toUint8Array(denied));
        }
        return;
      }
      decoding.readVarUint(decoder);
      if (subtype === syncProtocol.messageYjsSyncStep1) {
        encoding.writeVarUint(encoder, MESSAGE_SYNC);
        syncProtocol.readSyncStep1(decoder, encoder, this.doc);
        this.send(connection, encoding.toUint8Array(encoder));
      } else if (subtype === syncProtocol.messageYjsSyncStep2 || subtype === syncProtocol.messageYjsUpdate) {
        this.applyEdit(connection, decoding.readVarUint8Array(decoder));
      } else {
        throw new Error(`unknown sync message ${subtype}`);
      }
    } else if (type === MESSAGE_AWARENESS) {
      const identity = { name: connection.displayName ?? 'someone', colour: presenceColour(connection.displayName ?? 'someone'), role: connection.role ?? null };
      const mayUse = (clientId: number) => ![...this.connections].some((other) => other !== connection && other.userId !== connection.userId && other.awarenessIds.has(clientId));
      const update = filterPresenceUpdate(decoding.readVarUint8Array(decoder), identity, mayUse);
      if (update) awarenessProtocol.applyAwarenessUpdate(this.awareness, update, connection);
    } else if (type === MESSAGE_QUERY_AWARENESS) {
      encoding.writeVarUint(encoder, MESSAGE_AWARENESS);
      encoding.writeVarUint8Array(encoder, awarenessProtocol.encodeAwarenessUpdate(this.awareness, [...this.awareness.getStates().keys()]));
      this.send(connection, encoding.toUint8Array(encoder));
    }
  }

  /**
   * One edit from a writer: admitted by the gate, then applied (stored and sent to everyone); or
   * refused: nothing of it is applied or stored, and the sender's connection is closed with the
   * reason, so that its browser starts again from the session's real state.
   */
  private applyEdit(connection: Connection, update: Uint8Array): void {
    this.gate ??= new LiveEditGate(this.doc);
    const verdict = this.gate.admit(update);
    if (!verdict.ok) {
      this.log(`collab: session ${this.sessionId}: refused an edit from user ${connection.userId}: ${verdict.reason}`);
      this.disconnect(connection, verdict.code, closeReason(verdict.reason));
      return;
    }
    this.applyingAdmitted = true;
    try {
      Y.applyUpdate(this.doc, update, connection);
    } finally {
      this.applyingAdmitted = false;
    }
  }

  removeConnection(connection: Connection): void {
    if (!this.connections.delete(connection)) return;
    awarenessProtocol.removeAwarenessStates(this.awareness, [...connection.awarenessIds], null);
    if (connection.socket.readyState === connection.socket.OPEN) connection.socket.close();
    if (this.connections.size === 0) this.emit('empty');
  }

  /** Writes everything, refreshes the patch, folds the log into the snapshot and frees the document. */
  async close(): Promise<void> {
    if (this.closed) return;
    this.closed = true;
    if (this.patchTimer) clearTimeout(this.patchTimer);
    if (this.retryTimer) clearTimeout(this.retryTimer);
    await this.ready.catch(() => undefined);
    if (!this.storingStopped) {
      await this.refreshPatch();
      await this.compact();
    }
    this.awareness.destroy();
    this.gate?.destroy();
    this.doc.destroy();
  }

  /**
   * Makes a connection read-only (or writable) from now on. Going read-only, it is sent the
   * y-websocket auth message `permission denied` with the reason, and its later writes are dropped.
   */
  setReadOnly(connection: Connection, readOnly: boolean, reason: string): void {
    if (connection.readOnly === readOnly) return;
    connection.readOnly = readOnly;
    connection.toldReadOnly = readOnly;
    if (!readOnly) return;
    const denied = encoding.createEncoder();
    encoding.writeVarUint(denied, MESSAGE_AUTH);
    authProtocol.writePermissionDenied(denied, reason);
    this.send(connection, encoding.toUint8Array(denied));
  }

  /** Closes one connection with an application close code and a reason (at most 123 bytes). */
  disconnect(connection: Connection, code: number, reason: string): void {
    if (connection.socket.readyState === connection.socket.OPEN) connection.socket.close(code, reason);
    this.removeConnection(connection);
  }

  /**
   * Stops writing this session for good (it is about to be deleted): pending edits are dropped, and
   * the returned promise settles once any write already under way has finished, so no write reaches
   * the database after the session's rows are gone. `resume` undoes it if the deletion fails.
   */
  async stopStoring(): Promise<void> {
    this.storingStopped = true;
    if (this.flushTimer) clearTimeout(this.flushTimer);
    if (this.patchTimer) clearTimeout(this.patchTimer);
    this.flushTimer = null;
    this.patchTimer = null;
    this.pending = [];
    await this.writes;
  }

  resumeStoring(): void {
    this.storingStopped = false;
  }
}
