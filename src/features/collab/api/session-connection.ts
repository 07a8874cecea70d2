import { io, type Socket } from 'socket.io-client';
import { WebsocketProvider } from 'y-websocket';
import * as Y from 'yjs';
import { validatedPatchFromDoc } from '../../../../shared/collab/patch-doc';
import type { FieldIssue } from '../../../../shared/patch/field-issue';
import type { Patch } from '../../../../shared/patch/patch-schema';
import type { Role } from '../../../../shared/access/roles';
import {
  COMPUTE_EVENTS,
  PROTOCOL_VERSION,
  type ComputeResultMessage,
  type InvalidMessage,
  type JoinedMessage,
  type RefusedMessage,
} from '../../../../shared/protocol/compute-protocol';

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

/** The mode table and preview as the client keeps them (binary arrays as typed arrays). */
export type ComputeResult = ComputeResultMessage<Float64Array, Float32Array>;

export interface SessionSnapshot {
  connection: ConnectionState;
  /** True once the document has synced with the server at least once. */
  synced: boolean;
  /** Edits made while offline wait here until the server has them. */
  hasPendingEdits: boolean;
  role: Role | null;
  readOnly: boolean;
  refused: RefusedMessage | null;
  patch: Patch | null;
  patchIssues: FieldIssue[];
  result: ComputeResult | null;
  computeIssues: FieldIssue[];
  peers: Array<Presence & { clientId: number }>;
  canUndo: boolean;
  canRedo: boolean;
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

/** Socket.io delivers binary as ArrayBuffer in the browser and as Buffer in Node; copy into aligned typed arrays. */
function toFloat64(value: ArrayBuffer | ArrayBufferView): Float64Array {
  if (value instanceof ArrayBuffer) return new Float64Array(value.slice(0));
  return new Float64Array(value.buffer.slice(value.byteOffset, value.byteOffset + value.byteLength));
}
function toFloat32(value: ArrayBuffer | ArrayBufferView): Float32Array {
  if (value instanceof ArrayBuffer) return new Float32Array(value.slice(0));
  return new Float32Array(value.buffer.slice(value.byteOffset, value.byteOffset + value.byteLength));
}

export function decodeComputeResult(message: ComputeResultMessage<ArrayBuffer | ArrayBufferView, ArrayBuffer | ArrayBufferView>): ComputeResult {
  return {
    ...message,
    frequencyHz: toFloat64(message.frequencyHz),
    aM: toFloat64(message.aM),
    vMPerS: toFloat64(message.vMPerS),
    energyJ: toFloat64(message.energyJ),
    decayRatePerS: toFloat64(message.decayRatePerS),
    preview: toFloat32(message.preview),
  };
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
export class SessionConnection {
  readonly doc = new Y.Doc();
  readonly provider: WebsocketProvider;
  readonly socket: Socket;
  readonly undoManager: Y.UndoManager;
  /** The origin of this person's edits; only these are undone. */
  readonly localOrigin = Symbol('local-edit');
  private snapshot: SessionSnapshot;
  private readonly patchFrame = frameCoalescer(() => this.update(this.readPatch()));
  private readonly peersFrame = frameCoalescer(() => this.updatePeers());
  private readonly listeners = new Set<() => void>();
  private everConnected = false;

  constructor(private readonly options: SessionConnectionOptions) {
    this.snapshot = {
      connection: 'connecting',
      synced: false,
      hasPendingEdits: false,
      role: null,
      readOnly: false,
      refused: null,
      patch: null,
      patchIssues: [],
      result: null,
      computeIssues: [],
      peers: [],
      canUndo: false,
      canRedo: false,
    };
    const wsBase = `${options.baseUrl.replace(/^http/, 'ws').replace(/\/$/, '')}/collab`;
    this.provider = new WebsocketProvider(wsBase, options.sessionId, this.doc, {
      params: options.token ? { token: options.token } : {},
      WebSocketPolyfill: options.WebSocketPolyfill,
      disableBc: true,
      maxBackoffTime: 2500,
    });
    this.provider.awareness.setLocalState({ ...options.presence, pointerXM: null, dragging: null } satisfies Presence);
    this.undoManager = new Y.UndoManager(
      ['meta', 'string', 'damping', 'pickup', 'render', 'displacement', 'velocity', 'extras'].map((key) =>
        key === 'displacement' || key === 'velocity' ? this.doc.getArray(key) : this.doc.getMap(key),
      ),
      { trackedOrigins: new Set([this.localOrigin]), captureTimeout: CAPTURE_TIMEOUT_MS },
    );

    this.provider.on('status', ({ status }: { status: string }) => {
      if (status === 'connected') this.everConnected = true;
      const connection: ConnectionState = status === 'connected' ? 'connected' : this.everConnected ? 'reconnecting' : 'connecting';
      this.update({ connection });
    });
    this.provider.on('sync', (synced: boolean) => this.update({ synced: this.snapshot.synced || synced, hasPendingEdits: !synced && this.snapshot.hasPendingEdits }));
    this.doc.on('update', (_update: Uint8Array, origin: unknown) => {
      const local = origin === this.localOrigin || origin === this.undoManager;
      if (local && this.snapshot.connection !== 'connected' && !this.snapshot.hasPendingEdits) this.update({ hasPendingEdits: true });
      // Reading and validating the patch once per frame is enough, however many updates arrive.
      this.patchFrame.request();
    });
    this.undoManager.on('stack-item-added', () => this.updateUndo());
    this.undoManager.on('stack-item-popped', () => this.updateUndo());
    this.provider.awareness.on('change', () => this.peersFrame.request());

    this.socket = io(options.baseUrl, {
      path: '/socket.io/',
      transports: ['websocket'],
      auth: options.token ? { token: options.token } : undefined,
      withCredentials: true,
    });
    this.socket.on('connect', () => this.socket.emit(COMPUTE_EVENTS.subscribe, { protocolVersion: PROTOCOL_VERSION, sessionId: options.sessionId }));
    this.socket.on(COMPUTE_EVENTS.joined, (message: JoinedMessage) => {
      this.update({ role: message.role, readOnly: message.readOnly, refused: null });
      const current = this.provider.awareness.getLocalState() as Presence | null;
      if (current) this.provider.awareness.setLocalState({ ...current, role: message.role });
    });
    this.socket.on(COMPUTE_EVENTS.refused, (message: RefusedMessage) => this.update({ refused: message }));
    this.socket.on(COMPUTE_EVENTS.result, (message: ComputeResultMessage<ArrayBuffer, ArrayBuffer>) => {
      if (this.snapshot.result && message.sequence <= this.snapshot.result.sequence) return;
      this.update({ result: decodeComputeResult(message), computeIssues: [] });
    });
    this.socket.on(COMPUTE_EVENTS.invalid, (message: InvalidMessage) => this.update({ computeIssues: message.issues }));
  }

  private readPatch(): Pick<SessionSnapshot, 'patch' | 'patchIssues'> {
    const result = validatedPatchFromDoc(this.doc);
    return result.ok ? { patch: result.value, patchIssues: [] } : { patch: this.snapshot.patch, patchIssues: result.issues };
  }

  private updateUndo(): void {
    this.update({ canUndo: this.undoManager.canUndo(), canRedo: this.undoManager.canRedo() });
  }

  private updatePeers(): void {
    const peers: SessionSnapshot['peers'] = [];
    this.provider.awareness.getStates().forEach((state, clientId) => {
      if (clientId !== this.doc.clientID && state && typeof state.name === 'string') peers.push({ ...(state as Presence), clientId });
    });
    this.update({ peers });
  }

  private update(changes: Partial<SessionSnapshot>): void {
    this.snapshot = { ...this.snapshot, ...changes };
    for (const listener of this.listeners) listener();
  }

  /** Runs an edit of the document as this person's (undoable) change. Refused when read-only. */
  edit(change: (doc: Y.Doc, origin: symbol) => void): boolean {
    if (this.snapshot.readOnly) return false;
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
    this.patchFrame.cancel();
    this.peersFrame.cancel();
    this.listeners.clear();
    this.socket.disconnect();
    this.undoManager.destroy();
    this.provider.destroy();
    this.doc.destroy();
  }
}
