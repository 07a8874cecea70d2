import { io, type Socket } from 'socket.io-client';
import * as authProtocol from 'y-protocols/auth';
import { WebsocketProvider } from 'y-websocket';
import * as Y from 'yjs';
import { docSharedTypes, validatedPatchFromDoc } from '../../../shared/collab/patch-doc';
import type { FieldIssue } from '../../../shared/patch/field-issue';
import type { Patch } from '../../../shared/patch/patch-schema';
import type { Role } from '../../../shared/access/roles';
import { COMPUTE_EVENTS, PROTOCOL_VERSION, type RefusedMessage } from '../../../shared/protocol/compute-protocol';
import type { ModeTable } from '../../../shared/engine/mode-table';
import { modeTableFromWire } from '../../../shared/engine/table-synthesis';
import { decodeModeTable, type ModeTableWire } from '../../../shared/protocol/mode-table-wire';
import { LIVE_ACCESS_MESSAGES, LIVE_CLOSE_CODES, SESSION_NOTICE_EVENT, type LiveAccessEndReason, type SessionNotice } from '../../../shared/protocol/live-access';
import type { ClientToServerEvents, ServerToClientEvents } from '../../../shared/protocol/socket-events';
import { modeTableMessageSchema, invalidMessageSchema, joinedMessageSchema, refusedMessageSchema, sessionNoticeSchema } from '../../../shared/protocol/socket-payloads';
import { MalformedMessages } from '../socket-messages';
import { sharedStructure } from './shared-structure';

/** What a teammate shares about themselves while in a session. */
export interface Presence {
  name: string;
  /** Colour assigned by the app, as CSS. */
  colour: string;
  /** Where the pointer is along the string, metres; null when off the canvas. */
  pointerXM: number | null;
  /** The point being dragged, if any. */
  dragging: { layer: 'displacement' | 'velocity' | 'pickup'; index: number } | null;
  /** The role the server gave this person in the studio (shared once the compute channel has joined). */
  role?: Role | null;
}

export type ConnectionState = 'connecting' | 'connected' | 'reconnecting' | 'offline';

/**
 * The mode table as the client keeps it: every per-mode quantity rebuilt from the received table
 * (shared/engine/table-synthesis.ts), and the table itself, from which the preview is synthesised.
 */
export interface ComputeResult extends ModeTable {
  sessionId: string;
  sequence: number;
  /** The server document's version the table was computed for. */
  documentVersion: number;
  modeCount: number;
  computeMs: number;
  wire: ModeTableWire;
  /** Size of the table as it arrived, bytes. */
  byteLength: number;
}

/** Something the server told this person about the session that they should see (a change of rights, a refused edit, storage trouble). */
export interface LiveNotice {
  tone: 'info' | 'caution' | 'error';
  message: string;
}

/** Why the live session ended for this person; it does not reconnect by itself. */
export interface AccessEnded {
  /** The websocket close code (LIVE_CLOSE_CODES) or, from the compute channel, the matching one. */
  code: number;
  reason: LiveAccessEndReason | 'closed';
  message: string;
}

export interface SessionSnapshot {
  connection: ConnectionState;
  /** True once the document has synced with the server at least once. */
  synced: boolean;
  /** Edits made while offline wait here until the server has them. */
  hasPendingEdits: boolean;
  role: Role | null;
  readOnly: boolean;
  /** Why the server treats this connection as read-only, as it said (null when unsaid). */
  readOnlyReason: string | null;
  refused: RefusedMessage | null;
  patch: Patch | null;
  patchIssues: FieldIssue[];
  result: ComputeResult | null;
  computeIssues: FieldIssue[];
  peers: Array<Presence & { clientId: number }>;
  canUndo: boolean;
  canRedo: boolean;
  /** The latest thing the server told this person (null once there is nothing to say). */
  notice: LiveNotice | null;
  /** Set when the server ended this person's live access; the page shows why. */
  accessEnded: AccessEnded | null;
}

export interface SessionConnectionOptions {
  /** e.g. http://localhost:3000 (the page's origin in the browser). */
  baseUrl: string;
  sessionId: string;
  presence: Pick<Presence, 'name' | 'colour'>;
  /** A Bearer token for scripts and tests; the browser uses its cookie. */
  token?: string;
  /** A WebSocket class for Node (the `ws` package); the browser's own is used otherwise. */
  WebSocketPolyfill?: typeof WebSocket;
}

/** The result of a received table, or why it was refused. */
export function computeResultFromTable(sessionId: string, bytes: unknown): { ok: true; result: ComputeResult } | { ok: false; reason: string } {
  const decoded = decodeModeTable(bytes);
  if (!decoded.ok) return decoded;
  const { table: wire } = decoded;
  const table = modeTableFromWire(wire);
  const byteLength = (bytes as { byteLength: number }).byteLength;
  return { ok: true, result: { ...table, sessionId, sequence: wire.sequence, documentVersion: wire.documentVersion, modeCount: table.count, computeMs: wire.computeMs, wire, byteLength } };
}

/** The empty issue list, shared so that a valid patch after a valid patch changes nothing that panels compare. */
const NO_ISSUES: FieldIssue[] = [];

/**
 * y-websocket relays every presence change it applies, teammates' included, back to the server,
 * which already sent it to everyone: with n people each move crossed the link n times and each page
 * encoded and sent n − 1 echoes. Only this person's own presence is sent from here.
 */
function relayOwnPresenceOnly(provider: WebsocketProvider, doc: Y.Doc): void {
  const relay = provider._awarenessUpdateHandler;
  provider.awareness.off('update', relay);
  provider._awarenessUpdateHandler = ({ added, updated, removed }: { added: number[]; updated: number[]; removed: number[] }, origin: unknown) => {
    const own = doc.clientID;
    if (added.includes(own) || updated.includes(own) || removed.includes(own)) relay({ added: [], updated: [own], removed: [] }, origin);
  };
  provider.awareness.on('update', provider._awarenessUpdateHandler);
}

/** y-websocket's message type for auth (permission denied). */
const MESSAGE_AUTH = 2;

/** Which way access ended, from a close reason's words (the close frame carries only text). */
function endReasonOf(reason: string): LiveAccessEndReason {
  const found = (Object.keys(LIVE_ACCESS_MESSAGES) as Array<keyof typeof LIVE_ACCESS_MESSAGES>).find((key) => LIVE_ACCESS_MESSAGES[key] === reason);
  return found === 'signed-out' || found === 'account-deleted' || found === 'session-deleted' ? found : 'removed';
}

/** Edits closer together than this become one undo step (typing a number, nudging with the keys). */
const CAPTURE_TIMEOUT_MS = 300;

/** Runs `work` at most once per display frame (requestAnimationFrame in the browser, 16 ms elsewhere). */
function frameCoalescer(work: () => void): { request: () => void; cancel: () => void } {
  let pending: ReturnType<typeof setTimeout> | number | null = null;
  const hasFrames = typeof requestAnimationFrame === 'function';
  const run = () => {
    pending = null;
    work();
  };
  return {
    request: () => {
      if (pending !== null) return;
      pending = hasFrames ? requestAnimationFrame(run) : setTimeout(run, 16);
    },
    cancel: () => {
      if (pending === null) return;
      if (hasFrames) cancelAnimationFrame(pending as number);
      else clearTimeout(pending as ReturnType<typeof setTimeout>);
      pending = null;
    },
  };
}

/**
 * A live session for the web app: the shared document over y-websocket, everyone's presence,
 * undo and redo of one's own edits only, the connection state, and the latest mode table and
 * preview from the compute channel. Framework-free; `useSessionConnection` wraps it for React.
 */
/** Close codes after which the provider must not simply reconnect: this class decides what follows. */
const HANDLED_CLOSE_CODES: ReadonlySet<number> = new Set(Object.values(LIVE_CLOSE_CODES));

export class SessionConnection {
  /** The document, its provider and undo manager are replaced when the server asks for a fresh start (see `resetDocument`). */
  doc!: Y.Doc;
  provider!: WebsocketProvider;
  readonly socket: Socket<ServerToClientEvents, ClientToServerEvents>;
  /** Messages from the compute channel that did not match their schema: dropped, counted, the first of each kind logged. */
  readonly malformed = new MalformedMessages();
  undoManager!: Y.UndoManager;
  /** The origin of this person's edits; only these are undone. */
  readonly localOrigin = Symbol('local-edit');
  private snapshot: SessionSnapshot;
  /** The document and presence changes of a frame, read once and announced together (one render per frame, however many updates arrived). */
  private readonly frame = frameCoalescer(() => this.flushFrame());
  private patchChanged = false;
  private peersChanged = false;
  private readonly listeners = new Set<() => void>();
  private everConnected = false;
  /** The sequence of the last table shown in this subscription (a fresh `joined` starts again at 0). */
  private lastSequence = 0;

  constructor(private readonly options: SessionConnectionOptions) {
    this.snapshot = {
      connection: 'connecting',
      synced: false,
      hasPendingEdits: false,
      role: null,
      readOnly: false,
      readOnlyReason: null,
      refused: null,
      patch: null,
      patchIssues: [],
      result: null,
      computeIssues: [],
      peers: [],
      canUndo: false,
      canRedo: false,
      notice: null,
      accessEnded: null,
    };
    this.openDocument();

    this.socket = io(options.baseUrl, {
      path: '/socket.io/',
      transports: ['websocket'],
      auth: options.token ? { token: options.token } : undefined,
      withCredentials: true,
    });
    this.socket.on('connect', () => this.socket.emit(COMPUTE_EVENTS.subscribe, { protocolVersion: PROTOCOL_VERSION, sessionId: options.sessionId }));
    // Every message is parsed before use: a malformed one is dropped and counted, never thrown on.
    const { malformed } = this;
    this.socket.on(COMPUTE_EVENTS.joined, malformed.listener(COMPUTE_EVENTS.joined, joinedMessageSchema, (message) => {
      if (this.snapshot.accessEnded) return;
      // A new subscription: the server may have started its sequence again (a restart, the session reopened).
      this.lastSequence = 0;
      this.update({ role: message.role, readOnly: message.readOnly, readOnlyReason: message.archived ? LIVE_ACCESS_MESSAGES.readOnlyArchived : null, refused: null });
      const current = this.provider.awareness.getLocalState() as Presence | null;
      if (current) this.provider.awareness.setLocalState({ ...current, role: message.role });
    }));
    this.socket.on(COMPUTE_EVENTS.refused, malformed.listener(COMPUTE_EVENTS.refused, refusedMessageSchema, (message) => this.update({ refused: message })));
    this.socket.on(COMPUTE_EVENTS.table, malformed.listener(COMPUTE_EVENTS.table, modeTableMessageSchema, (message) => this.onTable(message.sessionId, message.table)));
    this.socket.on(COMPUTE_EVENTS.invalid, malformed.listener(COMPUTE_EVENTS.invalid, invalidMessageSchema, (message) => {
      if (message.sessionId === options.sessionId) this.update({ computeIssues: message.issues });
    }));
    this.socket.on(SESSION_NOTICE_EVENT, malformed.listener(SESSION_NOTICE_EVENT, sessionNoticeSchema, (notice) => this.onNotice(notice)));
  }

  /**
   * A mode table from the server: refused (logged once, counted) when it does not decode or is
   * too large; ignored when older than the one shown, so a late table never replaces a newer one.
   */
  onTable(sessionId: string, bytes: unknown): void {
    if (sessionId !== this.options.sessionId) return;
    const received = computeResultFromTable(sessionId, bytes);
    if (!received.ok) return this.malformed.note(COMPUTE_EVENTS.table, [received.reason]);
    if (received.result.sequence <= this.lastSequence) return;
    this.lastSequence = received.result.sequence;
    this.update({ result: received.result, computeIssues: NO_ISSUES });
  }

  /** A fresh document, provider and undo manager, wired to the snapshot. */
  private openDocument(): void {
    const options = this.options;
    const doc = new Y.Doc();
    const wsBase = `${options.baseUrl.replace(/^http/, 'ws').replace(/\/$/, '')}/collab`;
    const provider = new WebsocketProvider(wsBase, options.sessionId, doc, {
      params: options.token ? { token: options.token } : {},
      WebSocketPolyfill: options.WebSocketPolyfill,
      disableBc: true,
      maxBackoffTime: 2500,
      // Our own close codes are decided here (onClosed); any other close reconnects as usual.
      shouldReconnect: (event) => !HANDLED_CLOSE_CODES.has(event.code) && !(event.code >= 4400 && event.code < 4500),
    });
    provider.awareness.setLocalState({ ...options.presence, pointerXM: null, dragging: null, role: this.snapshot.role } satisfies Presence);
    const undoManager = new Y.UndoManager(
      // Every part of the document's one layout (shared/collab/doc-layout.ts), so no section's edits escape undo.
      docSharedTypes(doc),
      { trackedOrigins: new Set([this.localOrigin]), captureTimeout: CAPTURE_TIMEOUT_MS },
    );
    this.doc = doc;
    this.provider = provider;
    this.undoManager = undoManager;

    provider.on('status', ({ status }: { status: string }) => {
      if (status === 'connected') this.everConnected = true;
      if (this.snapshot.accessEnded) return;
      const connection: ConnectionState = status === 'connected' ? 'connected' : this.everConnected ? 'reconnecting' : 'connecting';
      this.update({ connection });
    });
    provider.on('sync', (synced: boolean) => this.update({ synced: this.snapshot.synced || synced, hasPendingEdits: !synced && this.snapshot.hasPendingEdits }));
    provider.on('closed', ({ code, reason }: { code: number; reason: string }) => this.onClosed(code, reason));
    // y-websocket only logs "permission denied"; here it makes the page read-only and says why.
    provider.messageHandlers[MESSAGE_AUTH] = (_encoder, decoder) =>
      authProtocol.readAuthMessage(decoder, doc, (_doc, reason) => this.update({ readOnly: true, readOnlyReason: reason }));
    doc.on('update', (_update: Uint8Array, origin: unknown) => {
      const local = origin === this.localOrigin || origin === undoManager;
      if (local && this.snapshot.connection !== 'connected' && !this.snapshot.hasPendingEdits) this.update({ hasPendingEdits: true });
      // Reading and validating the patch once per frame is enough, however many updates arrive.
      this.patchChanged = true;
      this.frame.request();
    });
    undoManager.on('stack-item-added', () => this.updateUndo());
    undoManager.on('stack-item-popped', () => this.updateUndo());
    provider.awareness.on('change', () => {
      this.peersChanged = true;
      this.frame.request();
    });
    relayOwnPresenceOnly(provider, doc);
  }

  /** Announces the frame's document and presence changes in one snapshot. */
  private flushFrame(): void {
    const changes: Partial<SessionSnapshot> = {};
    if (this.patchChanged) Object.assign(changes, this.readPatch());
    if (this.peersChanged) changes.peers = this.readPeers();
    this.patchChanged = false;
    this.peersChanged = false;
    this.update(changes);
  }

  /**
   * Drops the local document (and any edits the server did not take) and starts again from the
   * server's state, with whatever rights the server now gives. The last good patch stays on screen
   * until the fresh document has synced.
   */
  private resetDocument(): void {
    const old = { doc: this.doc, provider: this.provider, undoManager: this.undoManager };
    this.openDocument();
    old.undoManager.destroy();
    old.provider.destroy();
    old.doc.destroy();
    this.update({ synced: false, hasPendingEdits: false, canUndo: false, canRedo: false, peers: [] });
  }

  /** The server closed the document's websocket with one of our codes. */
  private onClosed(code: number, reason: string): void {
    if (code === LIVE_CLOSE_CODES.accessRevoked || code === LIVE_CLOSE_CODES.sessionDeleted) {
      return this.endAccess({ code, reason: code === LIVE_CLOSE_CODES.sessionDeleted ? 'session-deleted' : endReasonOf(reason), message: reason || 'Your access to this session ended' });
    }
    if (code === LIVE_CLOSE_CODES.roleChanged) {
      this.update({ notice: { tone: 'info', message: reason || 'Your rights in this session changed' } });
      this.resubscribe();
      return this.resetDocument();
    }
    if (code === LIVE_CLOSE_CODES.editRefused || code === LIVE_CLOSE_CODES.flooded) {
      this.update({ notice: { tone: 'error', message: `Your last edit was refused: ${reason || 'the server could not take it'}. The session shows the server's copy again.` } });
      return this.resetDocument();
    }
    // Any other permanent close (4400-4499) from a server we do not know better.
    this.endAccess({ code, reason: 'closed', message: reason || `The server closed the session (code ${code})` });
  }

  private onNotice(notice: SessionNotice): void {
    if (notice.sessionId !== this.options.sessionId || this.snapshot.accessEnded) return;
    switch (notice.kind) {
      case 'read-only':
        this.update({ readOnly: true, notice: { tone: 'caution', message: notice.message } });
        return this.resubscribe();
      case 'writable':
        // The server closes the document's socket (roleChanged) and the document starts afresh; the
        // compute channel's `joined` answer then lifts read-only. Lifting it here would let an edit
        // land in the old document, which the server still treats as read-only.
        this.update({ readOnlyReason: null, notice: { tone: 'info', message: notice.message } });
        return this.resubscribe();
      case 'not-saving':
        return this.update({ notice: { tone: 'caution', message: notice.message } });
      case 'saving':
        return this.update({ notice: null });
      case 'preset-loaded':
        return this.update({ notice: { tone: 'info', message: notice.message } });
      case 'access-ended':
        return this.endAccess({ code: notice.reason === 'session-deleted' ? LIVE_CLOSE_CODES.sessionDeleted : LIVE_CLOSE_CODES.accessRevoked, reason: notice.reason, message: notice.message });
    }
  }

  /** Asks the compute channel again, so its `joined` answer brings the role the server now gives. */
  private resubscribe(): void {
    if (this.socket.connected) this.socket.emit(COMPUTE_EVENTS.subscribe, { protocolVersion: PROTOCOL_VERSION, sessionId: this.options.sessionId });
  }

  /** Access ended for good: stop reconnecting, keep what is on screen, and say why. */
  private endAccess(ended: AccessEnded): void {
    if (this.snapshot.accessEnded) return;
    this.provider.shouldConnect = false;
    this.provider.disconnect();
    this.socket.disconnect();
    this.update({ accessEnded: ended, readOnly: true, connection: 'offline', notice: null });
  }

  private readPatch(): Pick<SessionSnapshot, 'patch' | 'patchIssues'> {
    const result = validatedPatchFromDoc(this.doc);
    // Parts that did not change keep their identity, so a memoised panel whose section is the same skips its render.
    return result.ok ? { patch: sharedStructure(this.snapshot.patch, result.value), patchIssues: NO_ISSUES } : { patch: this.snapshot.patch, patchIssues: result.issues };
  }

  private updateUndo(): void {
    this.update({ canUndo: this.undoManager.canUndo(), canRedo: this.undoManager.canRedo() });
  }

  private readPeers(): SessionSnapshot['peers'] {
    const peers: SessionSnapshot['peers'] = [];
    this.provider.awareness.getStates().forEach((state, clientId) => {
      if (clientId !== this.doc.clientID && state && typeof state.name === 'string') peers.push({ ...(state as Presence), clientId });
    });
    return peers;
  }

  private update(changes: Partial<SessionSnapshot>): void {
    this.snapshot = { ...this.snapshot, ...changes };
    for (const listener of this.listeners) listener();
  }

  /** Runs an edit of the document as this person's (undoable) change. Refused when read-only. */
  edit(change: (doc: Y.Doc, origin: symbol) => void): boolean {
    // Before the first sync (and after a fresh start) the document is empty: there is nothing to edit yet.
    if (this.snapshot.readOnly || !this.snapshot.synced) return false;
    this.doc.transact(() => change(this.doc, this.localOrigin), this.localOrigin);
    return true;
  }

  /** Starts a gesture (a drag): everything until `endGesture` is one undo step. */
  beginGesture(): void {
    this.undoManager.stopCapturing();
    this.undoManager.captureTimeout = Number.POSITIVE_INFINITY;
  }

  endGesture(): void {
    this.undoManager.captureTimeout = CAPTURE_TIMEOUT_MS;
    this.undoManager.stopCapturing();
  }

  undo(): void {
    if (!this.snapshot.readOnly) this.undoManager.undo();
  }

  redo(): void {
    if (!this.snapshot.readOnly) this.undoManager.redo();
  }

  setPresence(changes: Partial<Pick<Presence, 'pointerXM' | 'dragging'>>): void {
    const current = this.provider.awareness.getLocalState() as Presence;
    this.provider.awareness.setLocalState({ ...current, ...changes });
  }

  subscribe = (listener: () => void): (() => void) => {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  };

  getSnapshot = (): SessionSnapshot => this.snapshot;

  destroy(): void {
    this.frame.cancel();
    this.listeners.clear();
    this.socket.disconnect();
    this.undoManager.destroy();
    this.provider.destroy();
    this.doc.destroy();
  }
}
