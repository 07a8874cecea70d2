import { createServer, type Server as HttpServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import { Server } from 'socket.io';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { COMPUTE_EVENTS, PROTOCOL_VERSION } from '../../shared/protocol/compute-protocol';
import { SESSION_NOTICE_EVENT } from '../../shared/protocol/live-access';
import { RENDER_EVENTS, type RenderProgressMessage } from '../../shared/protocol/render-protocol';
import type { AppSocket, AppSocketServer } from '../../server/compute/socket-server';
import { openRenderProgressChannel } from '../../src/features/renders/api/render-progress-channel';
import { MalformedMessages } from '../../src/lib/socket-messages';
import { modeTableMessage } from '../../shared/engine/mode-table-message';
import { LIMITS } from '../../shared/limits';
import { encodeModeTable, MODE_TABLE_FORMAT_VERSION, MODE_TABLE_HEADER_BYTES } from '../../shared/protocol/mode-table-wire';
import type { SessionConnection } from '../../src/lib/live-session/session-connection';
import { eventually, openClient, waitForSnapshot } from '../support/collab-client';
import { testPatch, validPatch } from '../support/patches';

/**
 * The browser's side of the protocol against a real socket.io server (on a free port) that plays a
 * broken or hostile peer: whatever it sends, the client drops what does not match its schema, counts
 * it, logs the first of each kind once, and goes on taking good messages.
 */
const SESSION = '0b6f7c1e-2a94-4d38-b5e0-9c1d3f8a7e25';
const STUDIO = 'c7d2e4a1-58b3-4f06-9e7a-1b2c3d4e5f60';

let http: HttpServer | null = null;
let io: AppSocketServer | null = null;
const toClose: Array<() => void> = [];

afterEach(async () => {
  for (const close of toClose.splice(0)) close();
  vi.restoreAllMocks();
  await new Promise<void>((resolve) => (io ? io.close(() => resolve()) : resolve()));
  io = null;
  http = null;
});

async function startPeer(onConnection: (socket: AppSocket) => void): Promise<string> {
  http = createServer();
  io = new Server(http, { path: '/socket.io/', serveClient: false });
  io.on('connection', onConnection);
  await new Promise<void>((resolve) => http!.listen(0, '127.0.0.1', resolve));
  return `http://127.0.0.1:${(http.address() as AddressInfo).port}`;
}

/** The table the server would send for the test string (its 91 modes), with a given sequence and pickup position. */
function goodTable(sequence: number, pickupM = 0.1): Uint8Array<ArrayBuffer> {
  const patch = validPatch(testPatch({ pickup: { positionM: pickupM, output: 'displacement' } }));
  return encodeModeTable(modeTableMessage(patch, 0.5, { sequence, documentVersion: sequence, stateVector: new Uint8Array([1, 2, 3]) }));
}

/** A copy of `bytes` changed by `change` (through a DataView over the copy). */
function altered(bytes: Uint8Array, change: (view: DataView, copy: Uint8Array) => void): Uint8Array<ArrayBuffer> {
  const copy = Uint8Array.from(bytes);
  change(new DataView(copy.buffer), copy);
  return copy;
}

/** Where a table's a_n start: after the header and the state vector padded to 4 bytes. */
const amplitudesAt = (bytes: Uint8Array) => MODE_TABLE_HEADER_BYTES + Math.ceil(new DataView(bytes.buffer, bytes.byteOffset).getUint32(128, true) / 4) * 4;

/** Each malformed table a broken or hostile server could send, and the reason the client logs for it. */
const MALFORMED_TABLES: Array<[string, () => unknown, string]> = [
  ['that is not binary', () => 'TLMT', 'table must be binary data, got "TLMT"'],
  ['with the wrong magic', () => altered(goodTable(2), (view) => view.setUint32(0, 0x46464952, true)), 'the block is not a mode table (wrong magic)'],
  ['of another format version', () => altered(goodTable(2), (view) => view.setUint16(4, MODE_TABLE_FORMAT_VERSION + 1, true)), `mode table format ${MODE_TABLE_FORMAT_VERSION + 1} is not the supported format ${MODE_TABLE_FORMAT_VERSION}`],
  ['cut short by 4 bytes', () => goodTable(2).slice(0, -4), `a table of 91 modes is ${goodTable(2).byteLength} bytes, this one is ${goodTable(2).byteLength - 4}`],
  [
    'over LIMITS.modeTableMaxBytes',
    () => {
      const big = new Uint8Array(LIMITS.modeTableMaxBytes + 8);
      big.set(goodTable(2));
      return big;
    },
    `the mode table is ${LIMITS.modeTableMaxBytes + 8} bytes, more than the ${LIMITS.modeTableMaxBytes} allowed`,
  ],
  ['with a NaN amplitude', () => altered(goodTable(2), (view, copy) => view.setFloat32(amplitudesAt(copy) + 4 * 5, Number.NaN, true)), 'mode 6 has an amplitude that is not a finite number'],
];

describe('a client facing malformed messages', () => {
  it('the live session drops malformed tables, notices and answers without throwing, and takes the good table after them', async () => {
    const warn = vi.spyOn(console, 'warn').mockImplementation(() => undefined);
    const subscribed: unknown[] = [];
    const baseUrl = await startPeer((socket) => {
      socket.on(COMPUTE_EVENTS.subscribe, (request) => {
        subscribed.push(request);
        // The event map is bypassed on purpose: a hostile or outdated server sends anything.
        const raw = socket as unknown as { emit: (event: string, payload?: unknown) => void };
        raw.emit(COMPUTE_EVENTS.table, { type: 'table', sessionId: SESSION, table: 'not binary' });
        raw.emit(COMPUTE_EVENTS.table, { type: 'table', sessionId: SESSION, table: altered(goodTable(2), (view) => view.setUint32(0, 0, true)) });
        raw.emit(COMPUTE_EVENTS.table, null);
        raw.emit(COMPUTE_EVENTS.joined, { type: 'joined', sessionId: SESSION, role: 'owner', readOnly: false, archived: false });
        raw.emit(COMPUTE_EVENTS.invalid, { type: 'invalid', sessionId: SESSION, sequence: 2, issues: 'everything' });
        raw.emit(SESSION_NOTICE_EVENT, { kind: 'access-ended', sessionId: SESSION });
        socket.emit(COMPUTE_EVENTS.table, { type: 'table', sessionId: SESSION, table: goodTable(3) });
      });
    });
    const connection: SessionConnection = openClient(baseUrl, SESSION, 'no-token-needed-here');
    toClose.push(() => connection.destroy());

    const snapshot = await waitForSnapshot(connection, (s) => s.result !== null, 5000, 'the good table');
    expect(subscribed).toEqual([{ protocolVersion: PROTOCOL_VERSION, sessionId: SESSION }]);
    expect(snapshot.result!.sequence).toBe(3);
    // f_n = n·f0 for the test string (B = 0), f0 = √(70/6e-4)/1.3 (Mersenne's law).
    const f0Hz = Math.sqrt(70 / 6e-4) / 1.3;
    expect(snapshot.result!.modeCount).toBe(91);
    expect(snapshot.result!.frequencyHz[3]).toBeCloseTo(4 * f0Hz, 9);
    // Nothing malformed reached the snapshot: no role, no issues, access not ended.
    expect(snapshot.role).toBeNull();
    expect(snapshot.computeIssues).toEqual([]);
    expect(snapshot.accessEnded).toBeNull();
    await eventually(() => connection.malformed.count() === 6, 2000, 'six malformed messages counted');
    expect(connection.malformed.count(COMPUTE_EVENTS.table)).toBe(3);
    // Logged once per kind of message, not once per message.
    const lines = warn.mock.calls.map(([line]) => String(line));
    expect(lines.filter((line) => line.includes(COMPUTE_EVENTS.table))).toHaveLength(1);
    expect(lines.find((line) => line.includes(COMPUTE_EVENTS.table))).toContain('table must be binary data, got "not binary"');
    expect(lines).toHaveLength(4);
  });

  it.each(MALFORMED_TABLES)('a table %s is refused with its reason logged, and the table shown stays as it was', async (_kind, malformed, reason) => {
    const logged: string[] = [];
    const warn = vi.spyOn(console, 'warn').mockImplementation((line: unknown) => void logged.push(String(line)));
    const baseUrl = await startPeer((socket) => {
      socket.on(COMPUTE_EVENTS.subscribe, () => {
        socket.emit(COMPUTE_EVENTS.table, { type: 'table', sessionId: SESSION, table: goodTable(1) });
        (socket as unknown as { emit: (event: string, payload?: unknown) => void }).emit(COMPUTE_EVENTS.table, { type: 'table', sessionId: SESSION, table: malformed() });
      });
    });
    const connection: SessionConnection = openClient(baseUrl, SESSION, 'no-token-needed-here');
    toClose.push(() => connection.destroy());
    const first = await waitForSnapshot(connection, (s) => s.result !== null, 5000, 'the good table');
    await eventually(() => connection.malformed.count(COMPUTE_EVENTS.table) === 1, 2000, 'the malformed table counted');
    expect(logged).toEqual([`Tautline: ignored a malformed ${COMPUTE_EVENTS.table} message from the server (${reason}); later ones are counted, not logged`]);
    expect(connection.getSnapshot().result).toBe(first.result);
    expect(connection.getSnapshot().result!.sequence).toBe(1);
    warn.mockRestore();
  });

  it('out-of-order delivery: table 2 arriving after table 3 never replaces it; after a fresh joined, table 1 is taken again', async () => {
    const joined = { type: 'joined', sessionId: SESSION, role: 'designer', readOnly: false, archived: false } as const;
    // A notice the page shows: a marker that the client has handled everything sent before it.
    const marker = (message: string) => ({ kind: 'not-saving', sessionId: SESSION, message }) as const;
    const baseUrl = await startPeer((socket) => {
      socket.on(COMPUTE_EVENTS.subscribe, () => {
        // One socket delivers in order, so this is exactly the order the client handles them in.
        socket.emit(COMPUTE_EVENTS.joined, joined);
        socket.emit(COMPUTE_EVENTS.table, { type: 'table', sessionId: SESSION, table: goodTable(3, 0.3) });
        socket.emit(COMPUTE_EVENTS.table, { type: 'table', sessionId: SESSION, table: goodTable(2, 0.2) });
        socket.emit(COMPUTE_EVENTS.table, { type: 'table', sessionId: SESSION, table: goodTable(3, 0.25) });
        socket.emit(SESSION_NOTICE_EVENT, marker('after the stale tables'));
        // A new subscription (the server restarted, the session reopened) starts its sequence again.
        socket.emit(COMPUTE_EVENTS.joined, joined);
        socket.emit(COMPUTE_EVENTS.table, { type: 'table', sessionId: SESSION, table: goodTable(1, 0.1) });
        socket.emit(SESSION_NOTICE_EVENT, marker('after the fresh subscription'));
      });
    });
    const connection: SessionConnection = openClient(baseUrl, SESSION, 'no-token-needed-here');
    toClose.push(() => connection.destroy());
    // Every table the page showed, in order, with the pickup it was computed for.
    const shown: Array<{ sequence: number; pickupM: number; notice: string | undefined }> = [];
    connection.subscribe(() => {
      const { result, notice } = connection.getSnapshot();
      if (result && shown.at(-1)?.sequence !== result.sequence) shown.push({ sequence: result.sequence, pickupM: result.wire.pickup.positionM, notice: notice?.message });
    });
    const atFirstMarker = await waitForSnapshot(connection, (s) => s.notice?.message === 'after the stale tables', 5000, 'the first marker');
    expect(atFirstMarker.result).toMatchObject({ sequence: 3 });
    expect(atFirstMarker.result!.wire.pickup.positionM).toBe(0.3);
    await waitForSnapshot(connection, (s) => s.notice?.message === 'after the fresh subscription', 5000, 'the second marker');
    expect(shown).toEqual([
      { sequence: 3, pickupM: 0.3, notice: undefined },
      { sequence: 1, pickupM: 0.1, notice: 'after the stale tables' },
    ]);
    expect(connection.malformed.count()).toBe(0);
  });

  it('the renders channel drops malformed progress and passes on the good', async () => {
    const baseUrl = await startPeer((socket) => {
      socket.on(RENDER_EVENTS.subscribe, (request) => {
        const raw = socket as unknown as { emit: (event: string, payload?: unknown) => void };
        raw.emit(RENDER_EVENTS.joined, { type: 'joined', studioId: request.studioId });
        raw.emit(RENDER_EVENTS.progress, { type: 'progress', studioId: STUDIO, renderId: 'r1', state: 'rendering', progressPercent: '40%', error: null });
        raw.emit(RENDER_EVENTS.progress, 'progress');
        socket.emit(RENDER_EVENTS.progress, { type: 'progress', studioId: STUDIO, renderId: 'r1', state: 'rendering', progressPercent: 40, error: null });
      });
    });
    const logged: string[] = [];
    const malformed = new MalformedMessages((line) => logged.push(line));
    const received: RenderProgressMessage[] = [];
    const states: string[] = [];
    const channel = openRenderProgressChannel({ baseUrl, studioId: STUDIO, malformed, onProgress: (message) => received.push(message), onState: (state) => states.push(state) });
    toClose.push(channel.close);
    await eventually(() => received.length === 1 && malformed.count() === 2, 5000, 'one good message and two dropped');
    expect(received[0]).toEqual({ type: 'progress', studioId: STUDIO, renderId: 'r1', state: 'rendering', progressPercent: 40, error: null });
    expect(states).toContain('live');
    expect(logged).toEqual([`Tautline: ignored a malformed ${RENDER_EVENTS.progress} message from the server (progressPercent must be a number, got "40%"); later ones are counted, not logged`]);
  });
});
