/**
 * A simulated editor for load: the live document over a hand-spoken y-websocket protocol and the
 * compute channel over socket.io, as a browser tab holds them, without the web app's per-frame
 * patch validation, so a few hundred fit in the benchmark's process. It drags one point of the
 * displacement at 30 Hz exactly as the editor's drag does (movePoint: each edit sets the point's x
 * and y and nothing else), and records:
 * - propagation: how long a teammate's edit took to reach it. The sender notes, in this process,
 *   when it sent each value of its point's y; a teammate that sees a new y looks the time up. (With
 *   COLLAB_BENCH_STAMP=document the time travels in the document instead, as a pass-through field
 *   of the patch, set in the same edit: every edit is then no longer a pure drag, and the server
 *   checks the whole patch for each.)
 * - compute: how long its own edit took to come back as a mode table that covers it (the table's
 *   Yjs state vector includes the edit), decoded as the browser decodes it.
 */
import * as decoding from 'lib0/decoding';
import * as encoding from 'lib0/encoding';
import { io, type Socket } from 'socket.io-client';
import WebSocket from 'ws';
import * as syncProtocol from 'y-protocols/sync';
import * as Y from 'yjs';
import { movePoint } from '../../shared/collab/point-edits';
import { patchDoc } from '../../shared/collab/patch-doc';
import { COMPUTE_EVENTS, PROTOCOL_VERSION } from '../../shared/protocol/compute-protocol';
import { decodeModeTable } from '../../shared/protocol/mode-table-wire';
import type { ClientToServerEvents, ServerToClientEvents } from '../../shared/protocol/socket-events';

const MESSAGE_SYNC = 0;
const FROM_SERVER = 'server';

export interface LightEditorOptions {
  baseUrl: string;
  sessionId: string;
  token: string;
  /** This editor’s place in its session (0…editors−1): the interior point it drags (the supports are not in the document) and its stamp’s key. */
  index: number;
  editors: number;
}

/**
 * How far a table's state vector covers one client's edits (its next clock); 0 when the table came
 * with no state vector (computed from storage before the live document opened).
 */
export function coveredClock(stateVector: Uint8Array, clientId: number): number {
  return stateVector.length === 0 ? 0 : (Y.decodeStateVector(stateVector).get(clientId) ?? 0);
}

/** The stamp key of editor `index`: the time it made its latest edit, by this process's clock. */
export const stampKey = (index: number) => `bench-stamp-${index}`;

/**
 * Removes from `waiting` the edits a table covering clock `covered` shows (they are in clock order)
 * and, when `computeMs` is given, records how long each waited.
 */
export function settleCoveredEdits(waiting: Array<{ clock: number; at: number }>, covered: number, now: number, computeMs: number[] | null): void {
  let done = 0;
  while (done < waiting.length && waiting[done].clock <= covered) {
    computeMs?.push(now - waiting[done].at);
    done++;
  }
  waiting.splice(0, done);
}

/** Stamps travel in the document (a pass-through field set with each drag) rather than beside it. */
const STAMP_IN_DOCUMENT = process.env.COLLAB_BENCH_STAMP === 'document';

/** When each editor (by session and index) sent each y of its point, by this process's clock: its last few edits. */
const sentAt = new Map<string, Map<number, number>>();
const SENT_KEPT = 256;
const senderKey = (sessionId: string, index: number) => `${sessionId}:${index}`;

export class LightEditor {
  readonly doc = new Y.Doc();
  readonly propagationMs: number[] = [];
  readonly computeMs: number[] = [];
  readonly tableBytes: number[] = [];
  tables = 0;
  edits = 0;
  /** Tables that did not decode: 0 in a sound run. */
  badTables = 0;
  /** Drags whose point could not move: 0 in a sound run. */
  movesRefused = 0;
  /** Edits still waiting for a table that covers them: the document clock after each, and when it was made. */
  private readonly waiting: Array<{ clock: number; at: number }> = [];
  private readonly seenStamps = new Map<string, number>();
  private readonly socket: WebSocket;
  private readonly compute: Socket<ServerToClientEvents, ClientToServerEvents>;
  readonly synced: Promise<void>;
  readonly firstTable: Promise<void>;
  /** Measurements are kept only while recording (not during warm-up). */
  recording = false;

  constructor(private readonly options: LightEditorOptions) {
    const { baseUrl, sessionId, token } = options;
    const doc = this.doc;
    this.socket = new WebSocket(`${baseUrl.replace(/^http/, 'ws')}/collab/${sessionId}?token=${encodeURIComponent(token)}`);
    this.socket.binaryType = 'arraybuffer';
    let markSynced: () => void = () => {};
    this.synced = new Promise((resolve) => (markSynced = resolve));
    this.socket.on('open', () => {
      const encoder = encoding.createEncoder();
      encoding.writeVarUint(encoder, MESSAGE_SYNC);
      syncProtocol.writeSyncStep1(encoder, doc);
      this.socket.send(encoding.toUint8Array(encoder));
    });
    this.socket.on('message', (data: ArrayBuffer) => {
      const decoder = decoding.createDecoder(new Uint8Array(data));
      if (decoding.readVarUint(decoder) !== MESSAGE_SYNC) return; // presence: not needed here
      const encoder = encoding.createEncoder();
      encoding.writeVarUint(encoder, MESSAGE_SYNC);
      const kind = syncProtocol.readSyncMessage(decoder, encoder, doc, FROM_SERVER);
      if (encoding.length(encoder) > 1) this.socket.send(encoding.toUint8Array(encoder));
      if (kind === syncProtocol.messageYjsSyncStep2) markSynced();
    });
    doc.on('update', (update: Uint8Array, origin: unknown) => {
      if (origin === FROM_SERVER) return this.onRemote();
      // Our own edit: straight to the server, as y-websocket does.
      const encoder = encoding.createEncoder();
      encoding.writeVarUint(encoder, MESSAGE_SYNC);
      syncProtocol.writeUpdate(encoder, update);
      this.socket.send(encoding.toUint8Array(encoder));
    });

    this.compute = io(baseUrl, { path: '/socket.io/', transports: ['websocket'], auth: { token } });
    let markTable: () => void = () => {};
    this.firstTable = new Promise((resolve) => (markTable = resolve));
    this.compute.on('connect', () => this.compute.emit(COMPUTE_EVENTS.subscribe, { protocolVersion: PROTOCOL_VERSION, sessionId }));
    this.compute.on(COMPUTE_EVENTS.table, (message) => {
      const now = performance.now();
      const decoded = decodeModeTable(message.table);
      // Counted, not thrown: a throw here would end the benchmark's process and orphan the server.
      if (!decoded.ok) return void this.badTables++;
      markTable();
      const covered = coveredClock(decoded.table.stateVector, doc.clientID);
      settleCoveredEdits(this.waiting, covered, now, this.recording ? this.computeMs : null);
      if (!this.recording) return;
      this.tables++;
      this.tableBytes.push((message.table as { byteLength: number }).byteLength);
    });
  }

  private onRemote(): void {
    if (!this.recording) return;
    const now = performance.now();
    const parts = patchDoc(this.doc);
    for (let other = 0; other < this.options.editors; other++) {
      if (other === this.options.index) continue;
      const key = stampKey(other);
      let sent: number | undefined;
      if (STAMP_IN_DOCUMENT) sent = parts.extras.get(key) as number | undefined;
      else {
        const y = parts.displacement.get(other)?.get('y') as number | undefined;
        sent = y === undefined ? undefined : sentAt.get(senderKey(this.options.sessionId, other))?.get(y);
      }
      if (sent === undefined || this.seenStamps.get(key) === sent) continue;
      this.seenStamps.set(key, sent);
      this.propagationMs.push(now - sent);
    }
  }

  /** Moves this editor's point to phase `t` (seconds) of its drag, as one edit. */
  drag(t: number): void {
    const { index, editors } = this.options;
    const doc = this.doc;
    const parts = patchDoc(doc);
    const lengthM = parts.string.get('lengthM') as number;
    const centreM = (lengthM * (index + 1)) / (editors + 1);
    const at = performance.now();
    const y = 0.002 + 0.001 * Math.sin(t * 5 + index);
    if (!STAMP_IN_DOCUMENT) {
      const key = senderKey(this.options.sessionId, index);
      const sent = sentAt.get(key) ?? new Map<number, number>();
      sentAt.set(key, sent);
      sent.set(y, at);
      if (sent.size > SENT_KEPT) sent.delete(sent.keys().next().value as number);
    }
    doc.transact(() => {
      if (!movePoint(doc, 'displacement', index, centreM + 0.01 * Math.sin(t * 3 + index), y).ok) this.movesRefused++;
      if (STAMP_IN_DOCUMENT) parts.extras.set(stampKey(index), at);
    });
    this.edits++;
    this.waiting.push({ clock: Y.getState(doc.store, doc.clientID), at });
    // A table never came for very old edits (the gate refused one, say): forget them rather than grow.
    if (this.waiting.length > 256) this.waiting.splice(0, this.waiting.length - 256);
  }

  close(): void {
    this.compute.disconnect();
    this.socket.close();
    this.doc.destroy();
  }
}
