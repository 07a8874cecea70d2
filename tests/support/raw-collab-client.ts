import * as decoding from 'lib0/decoding';
import * as encoding from 'lib0/encoding';
import WebSocket from 'ws';
import * as syncProtocol from 'y-protocols/sync';
import * as Y from 'yjs';

const MESSAGE_SYNC = 0;
const MESSAGE_AWARENESS = 1;

/**
 * A client that speaks the y-websocket protocol by hand over a real websocket, with a document of
 * its own: it can send any update at all, as an attacker's script would, not only what the web app's
 * edit helpers produce.
 */
export interface RawCollabClient {
  doc: Y.Doc;
  socket: WebSocket;
  /** Resolves once the server's state has arrived (its sync step 2). */
  synced: Promise<void>;
  /** Resolves with the close code and reason when the server closes the socket. */
  closed: Promise<{ code: number; reason: string }>;
  /** Sends one Yjs update as a y-websocket update message. */
  sendUpdate(update: Uint8Array): void;
  /** Sends raw presence (awareness) entries: [clientId, clock, state]. */
  sendPresence(entries: Array<[number, number, unknown]>): void;
  /** Makes a change on the client's own document and returns the update it produced (not yet sent). */
  change(edit: (doc: Y.Doc) => void): Uint8Array;
}

export function openRawCollabClient(baseUrl: string, sessionId: string, token: string): RawCollabClient {
  const doc = new Y.Doc();
  const socket = new WebSocket(`${baseUrl.replace(/^http/, 'ws')}/collab/${sessionId}?token=${encodeURIComponent(token)}`);
  socket.binaryType = 'arraybuffer';
  let markSynced: () => void = () => {};
  const synced = new Promise<void>((resolve) => (markSynced = resolve));
  const closed = new Promise<{ code: number; reason: string }>((resolve) => socket.on('close', (code, reason) => resolve({ code, reason: reason.toString() })));
  socket.on('open', () => {
    const encoder = encoding.createEncoder();
    encoding.writeVarUint(encoder, MESSAGE_SYNC);
    syncProtocol.writeSyncStep1(encoder, doc);
    socket.send(encoding.toUint8Array(encoder));
  });
  socket.on('message', (data: ArrayBuffer) => {
    const decoder = decoding.createDecoder(new Uint8Array(data));
    if (decoding.readVarUint(decoder) !== MESSAGE_SYNC) return;
    const encoder = encoding.createEncoder();
    encoding.writeVarUint(encoder, MESSAGE_SYNC);
    const kind = syncProtocol.readSyncMessage(decoder, encoder, doc, 'server');
    if (encoding.length(encoder) > 1) socket.send(encoding.toUint8Array(encoder));
    if (kind === syncProtocol.messageYjsSyncStep2) markSynced();
  });
  return {
    doc,
    socket,
    synced,
    closed,
    sendUpdate(update) {
      const encoder = encoding.createEncoder();
      encoding.writeVarUint(encoder, MESSAGE_SYNC);
      syncProtocol.writeUpdate(encoder, update);
      socket.send(encoding.toUint8Array(encoder));
    },
    sendPresence(entries) {
      const inner = encoding.createEncoder();
      encoding.writeVarUint(inner, entries.length);
      for (const [clientId, clock, state] of entries) {
        encoding.writeVarUint(inner, clientId);
        encoding.writeVarUint(inner, clock);
        encoding.writeVarString(inner, JSON.stringify(state));
      }
      const encoder = encoding.createEncoder();
      encoding.writeVarUint(encoder, MESSAGE_AWARENESS);
      encoding.writeVarUint8Array(encoder, encoding.toUint8Array(inner));
      socket.send(encoding.toUint8Array(encoder));
    },
    change(edit) {
      let captured: Uint8Array | null = null;
      const listener = (update: Uint8Array, origin: unknown) => {
        if (origin !== 'server') captured = captured ? Y.mergeUpdates([captured, update]) : update;
      };
      doc.on('update', listener);
      doc.transact(() => edit(doc), 'attacker');
      doc.off('update', listener);
      if (!captured) throw new Error('the change produced no update');
      return captured;
    },
  };
}

