import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { io, type Socket as ClientSocket } from 'socket.io-client';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { patchDoc } from '../../shared/collab/patch-doc';
import { modeWavenumber } from '../../shared/engine/mode-frequencies';
import { COMPUTE_EVENTS, PROTOCOL_VERSION, type JoinedMessage, type RefusedMessage } from '../../shared/protocol/compute-protocol';
import { RENDER_EVENTS } from '../../shared/protocol/render-protocol';
import type { ClientToServerEvents, ServerToClientEvents } from '../../shared/protocol/socket-events';
import type { ComputeResult, SessionConnection } from '../../src/lib/live-session/session-connection';
import { openClient, waitForSnapshot } from '../support/collab-client';
import { openRawCollabClient } from '../support/raw-collab-client';
import { runCli } from '../support/run-cli';
import { createStudioFixture, type StudioFixture } from '../support/studio-fixture';
import { registerUser, startLiveTestServer, type LiveTestServer } from '../support/test-server';

let server: LiveTestServer;
let fixture: StudioFixture;
const clients: SessionConnection[] = [];

beforeAll(async () => {
  server = await startLiveTestServer({ previewDurationS: 0.5 });
  fixture = await createStudioFixture(server);
});
afterAll(async () => {
  for (const client of clients) client.destroy();
  await server.close();
});

function client(role: keyof StudioFixture['members']): SessionConnection {
  const opened = openClient(server.baseUrl, fixture.sessionId, fixture.members[role].token, role);
  clients.push(opened);
  return opened;
}

describe('compute channel', () => {
  it('sends a mode table equal to the command line’s for the same patch, and a binary preview', async () => {
    const listener = client('listener');
    const snapshot = await waitForSnapshot(listener, (s) => s.synced && s.patch !== null && s.result !== null, 10_000, 'first result');
    const result = snapshot.result as ComputeResult;
    expect(result.frequencyHz).toBeInstanceOf(Float64Array);
    expect(result.preview).toBeInstanceOf(Float32Array);

    const dir = mkdtempSync(join(tmpdir(), 'tautline-compute-'));
    const patchPath = join(dir, 'patch.json');
    writeFileSync(patchPath, JSON.stringify(snapshot.patch));
    const cli = await runCli(['modes', patchPath]);
    expect(cli.code).toBe(0);
    const expected = JSON.parse(cli.stdout);
    expect(result.f0Hz).toBe(expected.f0Hz);
    expect(result.waveSpeedMPerS).toBe(expected.waveSpeedMPerS);
    expect(result.totalEnergyJ).toBe(expected.totalEnergyJ);
    expect(result.modeCount).toBe(expected.modes.length);
    expected.modes.forEach((mode: { n: number; frequencyHz: number; aM: number; vMPerS: number; energyJ: number; t60S: number | null }, m: number) => {
      expect(result.frequencyHz[m]).toBe(mode.frequencyHz);
      expect(result.aM[m]).toBe(mode.aM);
      expect(result.vMPerS[m]).toBe(mode.vMPerS);
      expect(result.energyJ[m]).toBe(mode.energyJ);
      expect((3 * Math.LN10) / result.decayRatePerS[m]).toBeCloseTo(mode.t60S as number, 9);
    });

    const rate = result.previewSampleRateHz;
    expect(rate).toBeLessThanOrEqual(48000);
    expect(result.preview.length).toBe(Math.round(Math.min(0.5, snapshot.patch!.render.durationS) * rate));
    expect(Math.max(...Array.from(result.preview, Math.abs))).toBeCloseTo(1, 6);
    expect(result.previewPhysicalPeak).toBeGreaterThan(0);
  });

  it('coalesces a burst of 100 edits into a handful of results, the last one for the final state', async () => {
    const writer = client('designer');
    const watcher = client('lead');
    for (const connection of [writer, watcher]) await waitForSnapshot(connection, (s) => s.synced && s.result !== null, 10_000, 'first result');
    const before = watcher.getSnapshot().result!.sequence;
    const received: ComputeResult[] = [];
    const stop = watcher.subscribe(() => {
      const result = watcher.getSnapshot().result;
      if (result && result.sequence > before && received.at(-1) !== result) received.push(result);
    });
    for (let i = 1; i <= 100; i++) writer.edit((doc) => patchDoc(doc).damping.set('b1PerS', i / 25));
    const patch = await waitForSnapshot(watcher, (s) => s.patch?.damping.b1PerS === 4, 10_000, 'final edit arrives');
    const lengthM = patch.patch!.string.lengthM;
    const k1 = modeWavenumber(lengthM, 1);
    const finalSigma = 4 + patch.patch!.damping.b2M2PerS * k1 * k1;
    await waitForSnapshot(watcher, (s) => Math.abs((s.result?.decayRatePerS[0] ?? 0) - finalSigma) < 1e-12, 10_000, 'result for the final state');
    await new Promise((resolve) => setTimeout(resolve, 300));
    stop();
    expect(received.length).toBeGreaterThanOrEqual(1);
    expect(received.length).toBeLessThanOrEqual(6);
    expect(received.at(-1)!.decayRatePerS[0]).toBeCloseTo(finalSigma, 12);
    const sequences = received.map((result) => result.sequence);
    expect([...sequences].sort((a, b) => a - b)).toEqual(sequences);
  });

  it('never computes a patch that breaks its rules: the live document refuses the edit, and results go on', async () => {
    const watcher = client('listener');
    const first = await waitForSnapshot(watcher, (s) => s.synced && s.result !== null, 10_000, 'first result');
    const attacker = openRawCollabClient(server.baseUrl, fixture.sessionId, fixture.members.designer.token);
    await attacker.synced;
    attacker.sendUpdate(attacker.change((doc) => doc.getMap('string').set('tensionN', -5)));
    expect((await attacker.closed).reason).toContain('string.tensionN must be > 0');
    const writer = client('designer');
    await waitForSnapshot(writer, (s) => s.synced && s.patch !== null, 10_000, 'writer synced');
    writer.edit((doc) => patchDoc(doc).string.set('tensionN', 61));
    const next = await waitForSnapshot(watcher, (s) => s.result !== null && s.result.sequence > (first.result?.sequence ?? 0) && s.patch?.string.tensionN === 61, 10_000, 'next result');
    expect(next.computeIssues).toEqual([]);
    expect(next.patch?.string.tensionN).toBe(61);
  });

  it('refuses sockets without a valid token, and subscriptions to a foreign session', async () => {
    const anonymous = io(server.baseUrl, { path: '/socket.io/', transports: ['websocket'], reconnection: false });
    const error = await new Promise<Error>((resolve) => anonymous.on('connect_error', resolve));
    expect(error.message).toBe('unauthenticated');
    anonymous.close();

    const outsider = await registerUser(server.app, 'compute-outsider@gannet-rock.example', 'Outsider');
    const socket = io(server.baseUrl, { path: '/socket.io/', transports: ['websocket'], auth: { token: outsider.token }, reconnection: false });
    const refused = await new Promise<RefusedMessage>((resolve) => {
      socket.on(COMPUTE_EVENTS.refused, resolve);
      socket.on('connect', () => socket.emit(COMPUTE_EVENTS.subscribe, { protocolVersion: PROTOCOL_VERSION, sessionId: fixture.sessionId }));
    });
    expect(refused).toMatchObject({ code: 'not_found', sessionId: fixture.sessionId });
    const wrongVersion = await new Promise<RefusedMessage>((resolve) => {
      socket.once(COMPUTE_EVENTS.refused, resolve);
      socket.emit(COMPUTE_EVENTS.subscribe, { protocolVersion: 0, sessionId: fixture.sessionId });
    });
    expect(wrongVersion.code).toBe('protocol');
    socket.close();
  });
});

describe('payloads that arrive over the socket are parsed, never trusted', () => {
  /** A signed-in raw socket.io client, typed by the app's one event map. */
  async function rawSocket(token: string): Promise<ClientSocket<ServerToClientEvents, ClientToServerEvents>> {
    const socket: ClientSocket<ServerToClientEvents, ClientToServerEvents> = io(server.baseUrl, { path: '/socket.io/', transports: ['websocket'], auth: { token }, reconnection: false });
    await new Promise<void>((resolve, reject) => {
      socket.once('connect', resolve);
      socket.once('connect_error', reject);
    });
    return socket;
  }

  /** Sends a raw payload (the event map is bypassed on purpose) and waits for the channel's answer. */
  function answerTo<E extends 'compute:refused' | 'renders:refused'>(socket: ClientSocket<ServerToClientEvents, ClientToServerEvents>, send: string, answer: E, payload: unknown) {
    return new Promise<Parameters<ServerToClientEvents[E]>[0]>((resolve) => {
      (socket as unknown as { once: (event: string, listener: (message: unknown) => void) => void }).once(answer, (message) => resolve(message as Parameters<ServerToClientEvents[E]>[0]));
      (socket as unknown as { emit: (event: string, payload: unknown) => void }).emit(send, payload);
    });
  }

  it('refuses a subscribe of the wrong shape with bad_request naming the field, and keeps serving the same socket and others', async () => {
    const socket = await rawSocket(fixture.members.designer.token);
    const numberId = await answerTo(socket, COMPUTE_EVENTS.subscribe, COMPUTE_EVENTS.refused, { protocolVersion: PROTOCOL_VERSION, sessionId: 42 });
    expect(numberId).toEqual({ type: 'refused', sessionId: '', code: 'bad_request', message: 'sessionId must be a string, got 42' });

    const noVersion = await answerTo(socket, COMPUTE_EVENTS.subscribe, COMPUTE_EVENTS.refused, { sessionId: fixture.sessionId });
    expect(noVersion).toEqual({ type: 'refused', sessionId: fixture.sessionId, code: 'bad_request', message: 'protocolVersion is required' });

    // 40,000 characters: under socket.io's 64 KB message cap, so it reaches the handler.
    const huge = 'x'.repeat(40_000);
    const extra = await answerTo(socket, COMPUTE_EVENTS.subscribe, COMPUTE_EVENTS.refused, { protocolVersion: PROTOCOL_VERSION, sessionId: fixture.sessionId, note: huge });
    expect(extra.code).toBe('bad_request');
    expect(extra.message).toBe(`note is not part of this message, got "${'x'.repeat(40)}…"`);
    const hugeId = await answerTo(socket, COMPUTE_EVENTS.subscribe, COMPUTE_EVENTS.refused, { protocolVersion: PROTOCOL_VERSION, sessionId: huge });
    expect(hugeId).toMatchObject({ sessionId: '', code: 'bad_request' });
    expect(hugeId.message).toMatch(/^sessionId must be at most 64 characters, got "x{40}…"$/);

    const notAnObject = await answerTo(socket, COMPUTE_EVENTS.subscribe, COMPUTE_EVENTS.refused, 'subscribe me');
    expect(notAnObject).toMatchObject({ code: 'bad_request', message: 'payload must be an object, got "subscribe me"' });
    const badUnsubscribe = await answerTo(socket, COMPUTE_EVENTS.unsubscribe, COMPUTE_EVENTS.refused, { sessionId: null });
    expect(badUnsubscribe).toMatchObject({ code: 'bad_request', message: 'sessionId must be a string, got null' });

    // The same socket, then a fresh client, still subscribe and get results.
    expect(socket.connected).toBe(true);
    const joined = new Promise<JoinedMessage>((resolve) => socket.once(COMPUTE_EVENTS.joined, resolve));
    socket.emit(COMPUTE_EVENTS.subscribe, { protocolVersion: PROTOCOL_VERSION, sessionId: fixture.sessionId });
    expect(await joined).toMatchObject({ sessionId: fixture.sessionId, role: 'designer' });
    socket.close();
    const other = client('producer');
    await waitForSnapshot(other, (s) => s.role === 'producer' && s.result !== null, 10_000, 'another client still served');
    expect(other.malformed.count()).toBe(0);
  });

  it('refuses a renders subscribe of the wrong shape with bad_request naming studioId', async () => {
    const socket = await rawSocket(fixture.members.lead.token);
    const refused = await answerTo(socket, RENDER_EVENTS.subscribe, RENDER_EVENTS.refused, { studioId: ['not', 'an', 'id'] });
    expect(refused).toEqual({ type: 'refused', studioId: '', code: 'bad_request', message: 'studioId must be a string, got an array of 3 items' });
    const joined = new Promise<unknown>((resolve) => socket.once(RENDER_EVENTS.joined, resolve));
    socket.emit(RENDER_EVENTS.subscribe, { studioId: fixture.studioId });
    expect(await joined).toEqual({ type: 'joined', studioId: fixture.studioId });
    socket.close();
  });
});
