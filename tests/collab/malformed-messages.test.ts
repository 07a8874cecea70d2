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
import type { SessionConnection } from '../../src/lib/live-session/session-connection';
import { eventually, openClient, waitForSnapshot } from '../support/collab-client';

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

/** A good result of `modeCount` modes, sent as typed arrays (so it arrives as binary). */
function goodResult(sequence: number, modeCount: number) {
  const f64 = () => new Float64Array(modeCount).map((_, i) => 98 * (i + 1));
  return {
    type: 'result' as const,
    sessionId: SESSION,
    sequence,
    f0Hz: 98,
    waveSpeedMPerS: 127.4,
    totalEnergyJ: 0.001,
    modeCount,
    frequencyHz: f64(),
    aM: f64(),
    vMPerS: f64(),
    energyJ: f64(),
    decayRatePerS: f64(),
    previewSampleRateHz: 48000,
    preview: new Float32Array(64).fill(0.5),
    previewPhysicalPeak: 0.002,
    computeMs: 1,
  };
}

describe('a client facing malformed messages', () => {
  it('the live session drops malformed results, notices and answers without throwing, and takes the good result after them', async () => {
    const warn = vi.spyOn(console, 'warn').mockImplementation(() => undefined);
    const subscribed: unknown[] = [];
    const baseUrl = await startPeer((socket) => {
      socket.on(COMPUTE_EVENTS.subscribe, (request) => {
        subscribed.push(request);
        // The event map is bypassed on purpose: a hostile or outdated server sends anything.
        const raw = socket as unknown as { emit: (event: string, payload?: unknown) => void };
        raw.emit(COMPUTE_EVENTS.result, { ...goodResult(1, 4), frequencyHz: 'not binary' });
        raw.emit(COMPUTE_EVENTS.result, { ...goodResult(2, 4), aM: new Float64Array(3) });
        raw.emit(COMPUTE_EVENTS.result, null);
        raw.emit(COMPUTE_EVENTS.joined, { type: 'joined', sessionId: SESSION, role: 'owner', readOnly: false, archived: false });
        raw.emit(COMPUTE_EVENTS.invalid, { type: 'invalid', sessionId: SESSION, sequence: 2, issues: 'everything' });
        raw.emit(SESSION_NOTICE_EVENT, { kind: 'access-ended', sessionId: SESSION });
        socket.emit(COMPUTE_EVENTS.result, goodResult(3, 4));
      });
    });
    const connection: SessionConnection = openClient(baseUrl, SESSION, 'no-token-needed-here');
    toClose.push(() => connection.destroy());

    const snapshot = await waitForSnapshot(connection, (s) => s.result !== null, 5000, 'the good result');
    expect(subscribed).toEqual([{ protocolVersion: PROTOCOL_VERSION, sessionId: SESSION }]);
    expect(snapshot.result!.sequence).toBe(3);
    expect(Array.from(snapshot.result!.frequencyHz)).toEqual([98, 196, 294, 392]);
    expect(snapshot.result!.preview).toBeInstanceOf(Float32Array);
    // Nothing malformed reached the snapshot: no role, no issues, access not ended.
    expect(snapshot.role).toBeNull();
    expect(snapshot.computeIssues).toEqual([]);
    expect(snapshot.accessEnded).toBeNull();
    await eventually(() => connection.malformed.count() === 6, 2000, 'six malformed messages counted');
    expect(connection.malformed.count(COMPUTE_EVENTS.result)).toBe(3);
    // Logged once per kind of message, not once per message.
    const lines = warn.mock.calls.map(([line]) => String(line));
    expect(lines.filter((line) => line.includes(COMPUTE_EVENTS.result))).toHaveLength(1);
    expect(lines.find((line) => line.includes(COMPUTE_EVENTS.result))).toContain('frequencyHz must be binary data of 8-byte numbers, got "not binary"');
    expect(lines).toHaveLength(4);
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
