import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { io, type Socket as ClientSocket } from 'socket.io-client';
import * as Y from 'yjs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { patchDoc } from '../../shared/collab/patch-doc';
import { modeWavenumber } from '../../shared/engine/mode-frequencies';
import { COMPUTE_EVENTS, PROTOCOL_VERSION, type JoinedMessage, type RefusedMessage } from '../../shared/protocol/compute-protocol';
import { decodeModeTable, wireBytes, type ModeTableWire } from '../../shared/protocol/mode-table-wire';
import { RENDER_EVENTS } from '../../shared/protocol/render-protocol';
import type { ClientToServerEvents, ServerToClientEvents } from '../../shared/protocol/socket-events';
import type { ComputeResult, SessionConnection } from '../../src/lib/live-session/session-connection';
import { eventually, openClient, waitForSnapshot } from '../support/collab-client';
import { openRawCollabClient } from '../support/raw-collab-client';
import { runCli } from '../support/run-cli';
import { createStudioFixture, type StudioFixture } from '../support/studio-fixture';
import { as, registerUser, startLiveTestServer, type LiveTestServer } from '../support/test-server';

let server: LiveTestServer;
let fixture: StudioFixture;
const clients: SessionConnection[] = [];

beforeAll(async () => {
  server = await startLiveTestServer({ previewDurationS: 0.5 });
  fixture = await createStudioFixture(server);
});
afterAll(async () => {
  for (const client of clients) client.destroy();
  for (const watch of watches) watch.socket.close();
  await server.close();
});

function client(role: keyof StudioFixture['members']): SessionConnection {
  const opened = openClient(server.baseUrl, fixture.sessionId, fixture.members[role].token, role);
  clients.push(opened);
  return opened;
}

describe('compute channel', () => {
  it('sends a mode table equal to the command line’s for the same patch (amplitudes as float32), a few KB of binary and no audio', async () => {
    const listener = client('listener');
    const snapshot = await waitForSnapshot(listener, (s) => s.synced && s.patch !== null && s.result !== null, 10_000, 'first table');
    const result = snapshot.result as ComputeResult;
    expect(result.frequencyHz).toBeInstanceOf(Float64Array);
    expect(result.wire.aM).toBeInstanceOf(Float32Array);

    const dir = mkdtempSync(join(tmpdir(), 'tautline-compute-'));
    const patchPath = join(dir, 'patch.json');
    writeFileSync(patchPath, JSON.stringify(snapshot.patch));
    const cli = await runCli(['modes', patchPath]);
    expect(cli.code).toBe(0);
    const expected = JSON.parse(cli.stdout);
    // Rebuilt in the browser from the string with the same closed forms: equal to the bit.
    expect(result.f0Hz).toBe(expected.f0Hz);
    expect(result.waveSpeedMPerS).toBe(expected.waveSpeedMPerS);
    expect(result.totalEnergyJ).toBe(expected.totalEnergyJ);
    expect(result.modeCount).toBe(expected.modes.length);
    expected.modes.forEach((mode: { n: number; frequencyHz: number; aM: number; vMPerS: number; energyJ: number; t60S: number | null }, m: number) => {
      expect(result.frequencyHz[m]).toBe(mode.frequencyHz);
      // a_n and v_n travel as float32: the CLI's double rounded to the nearest float32 (IEEE 754 round to nearest).
      expect(result.aM[m]).toBe(Math.fround(mode.aM));
      expect(result.vMPerS[m]).toBe(Math.fround(mode.vMPerS));
      // E_n is quadratic in the amplitudes: within 2·2⁻²⁴ relative of the CLI's (float32 unit roundoff 2⁻²⁴).
      expect(Math.abs(result.energyJ[m] - mode.energyJ)).toBeLessThanOrEqual(2 * 2 ** -24 * mode.energyJ + 1e-300);
      expect((3 * Math.LN10) / result.decayRatePerS[m]).toBeCloseTo(mode.t60S as number, 9);
    });

    // What the browser synthesises: the patch's length up to the server's 0.5 s, at the patch's rate (≤ 48 kHz).
    expect(result.wire.preview.sampleRateHz).toBe(Math.min(48000, snapshot.patch!.render.sampleRateHz));
    expect(result.wire.preview.durationS).toBe(Math.min(0.5, snapshot.patch!.render.durationS));
    // 132 header bytes, the state vector (padded to 4) and 8 bytes per mode: nothing else travels.
    expect(result.byteLength).toBe(132 + Math.ceil(result.wire.stateVector.length / 4) * 4 + 8 * result.modeCount);
    expect(result.byteLength).toBeLessThanOrEqual(16 * 1024);
  });

  it('coalesces a burst of 100 edits into a handful of tables, the last one for the final state', async () => {
    const writer = client('designer');
    const watcher = client('lead');
    for (const connection of [writer, watcher]) await waitForSnapshot(connection, (s) => s.synced && s.result !== null, 10_000, 'first table');
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

  it('never computes a patch that breaks its rules: the live document refuses the edit, and tables go on', async () => {
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

/** A raw socket.io client keeping every table it receives: the bytes as they arrived (copied) and decoded. */
interface TableWatch {
  socket: ClientSocket<ServerToClientEvents, ClientToServerEvents>;
  tables: Array<{ bytes: Buffer; wire: ModeTableWire }>;
  /** Index into `tables` of the first table after `joined`, and how many messages came between. */
  joinedAt: number;
}

const watches: TableWatch[] = [];

async function watchTables(token: string, sessionId = fixture.sessionId): Promise<TableWatch> {
  const socket: ClientSocket<ServerToClientEvents, ClientToServerEvents> = io(server.baseUrl, { path: '/socket.io/', transports: ['websocket'], auth: { token }, reconnection: false });
  const watch: TableWatch = { socket, tables: [], joinedAt: -1 };
  watches.push(watch);
  socket.on(COMPUTE_EVENTS.table, (message) => {
    const decoded = decodeModeTable(message.table);
    if (!decoded.ok) throw new Error(decoded.reason);
    watch.tables.push({ bytes: Buffer.from(wireBytes(message.table)!), wire: decoded.table });
  });
  const joined = new Promise<void>((resolve) => socket.once(COMPUTE_EVENTS.joined, () => resolve()));
  socket.once('connect', () => socket.emit(COMPUTE_EVENTS.subscribe, { protocolVersion: PROTOCOL_VERSION, sessionId }));
  await joined;
  watch.joinedAt = watch.tables.length;
  return watch;
}

/** The first table `watch` received (after index `from`) that satisfies `test`. */
async function tableWhere(watch: TableWatch, test: (wire: ModeTableWire) => boolean, what: string, from = 0): Promise<{ bytes: Buffer; wire: ModeTableWire }> {
  await eventually(() => watch.tables.slice(from).some((table) => test(table.wire)), 10_000, what);
  return watch.tables.slice(from).find((table) => test(table.wire))!;
}

/** The per-mode part of a table's bytes (a_n then v_n, float32), after its header and state vector. */
const modeBytes = (table: { bytes: Buffer; wire: ModeTableWire }) => table.bytes.subarray(132 + Math.ceil(table.wire.stateVector.length / 4) * 4);

const counts = () => ({ ...server.tautline.computeCounts });

describe('one table per change, shared by every subscriber and kept for undo', () => {
  it('every subscriber receives the same bytes for a change, from one worker compute', async () => {
    const writer = client('designer');
    await waitForSnapshot(writer, (s) => s.synced && s.result !== null, 10_000, 'writer synced');
    const [lead, designer, listener] = [await watchTables(fixture.members.lead.token), await watchTables(fixture.members.designer.token), await watchTables(fixture.members.listener.token)];
    for (const watch of [lead, designer, listener]) await eventually(() => watch.tables.length > 0, 10_000, 'a table on subscribing');
    const before = counts();
    writer.edit((doc) => patchDoc(doc).string.set('tensionN', 63.5));
    const seen = await Promise.all([lead, designer, listener].map((watch) => tableWhere(watch, (wire) => wire.string.tensionN === 63.5, 'the table for T = 63.5 N')));
    expect(seen[1].bytes.equals(seen[0].bytes)).toBe(true);
    expect(seen[2].bytes.equals(seen[0].bytes)).toBe(true);
    expect(seen[0].bytes.byteLength).toBeGreaterThan(132);
    expect(counts().workerComputes - before.workerComputes).toBe(1);
  });

  it('a rename, and an undo back to an earlier patch, re-send a kept table with a new stamp and no worker compute', async () => {
    const writer = client('designer');
    await waitForSnapshot(writer, (s) => s.synced && s.result !== null, 10_000, 'writer synced');
    const watch = await watchTables(fixture.members.lead.token);
    const first = await tableWhere(watch, () => true, 'a table on subscribing');

    const beforeRename = counts();
    writer.edit((doc) => patchDoc(doc).meta.set('name', 'Harbour bell-wire study, take 2'));
    const renamed = await tableWhere(watch, (wire) => wire.sequence > first.wire.sequence, 'a table after the rename');
    expect(counts().workerComputes).toBe(beforeRename.workerComputes);
    expect(counts().cachedTables).toBe(beforeRename.cachedTables + 1);
    expect(modeBytes(renamed).equals(modeBytes(first))).toBe(true);
    expect(renamed.wire.documentVersion).toBeGreaterThan(first.wire.documentVersion);

    // A new step: the tension edit is undone on its own, not together with the rename.
    writer.undoManager.stopCapturing();
    const tensionBefore = renamed.wire.string.tensionN;
    writer.edit((doc) => patchDoc(doc).string.set('tensionN', 64.25));
    const edited = await tableWhere(watch, (wire) => wire.string.tensionN === 64.25, 'the table for T = 64.25 N');
    const afterEdit = counts();
    expect(afterEdit.workerComputes).toBe(beforeRename.workerComputes + 1);

    writer.undo();
    const undone = await tableWhere(watch, (wire) => wire.sequence > edited.wire.sequence && wire.string.tensionN === tensionBefore, 'the table after undo');
    expect(counts().workerComputes).toBe(afterEdit.workerComputes);
    expect(counts().cachedTables).toBe(afterEdit.cachedTables + 1);
    expect(modeBytes(undone).equals(modeBytes(first))).toBe(true);
    expect(modeBytes(edited).equals(modeBytes(first))).toBe(false);
    expect(undone.wire.documentVersion).toBeGreaterThan(edited.wire.documentVersion);
  });

  it('a late subscriber gets the last table at once when the document has not changed, without a compute', async () => {
    const watcher = await watchTables(fixture.members.lead.token);
    const latest = await tableWhere(watcher, () => true, 'a table on subscribing');
    // Quiet: nothing edits the session while the late one joins.
    await new Promise((resolve) => setTimeout(resolve, 100));
    const before = counts();
    const late = await watchTables(fixture.members.producer.token);
    // The table came with the join, before any compute could have run (the joined answer precedes it on one socket).
    const got = await tableWhere(late, () => true, 'the cached table');
    expect(got.bytes.equals(watcher.tables.at(-1)!.bytes)).toBe(true);
    expect(got.wire.sequence).toBe(watcher.tables.at(-1)!.wire.sequence);
    expect(got.wire.sequence).toBeGreaterThanOrEqual(latest.wire.sequence);
    expect(counts().workerComputes).toBe(before.workerComputes);
    expect(counts().cachedTables).toBe(before.cachedTables);
  });

  it('a late subscriber never gets the last table when the patch was replaced while no live document was open', async () => {
    const lead = as(server.app, fixture.members.lead.token);
    const created = await lead.post(`/api/studios/${fixture.studioId}/sessions`).send({ name: 'Tide-bell wire, no one editing' }).expect(201);
    const sessionId = created.body.session.id as string;
    // Only the compute channel follows this session: no live document is open for it.
    const first = await tableWhere(await watchTables(fixture.members.lead.token, sessionId), () => true, 'a table from the stored patch');
    expect(server.tautline.hub.room(sessionId)).toBeUndefined();
    const patch = created.body.session.patch;
    await lead.patch(`/api/sessions/${sessionId}`).send({ patch: { ...patch, string: { ...patch.string, tensionN: first.wire.string.tensionN + 5 } } }).expect(200);
    const late = await tableWhere(await watchTables(fixture.members.designer.token, sessionId), () => true, 'a table for the late subscriber');
    expect(late.wire.string.tensionN).toBe(first.wire.string.tensionN + 5);
  });

  it('a subscriber with no live document open gets the new table when the patch is replaced through the API', async () => {
    const lead = as(server.app, fixture.members.lead.token);
    const created = await lead.post(`/api/studios/${fixture.studioId}/sessions`).send({ name: 'Harbour-chain wire, watched only' }).expect(201);
    const sessionId = created.body.session.id as string;
    const watch = await watchTables(fixture.members.listener.token, sessionId);
    const first = await tableWhere(watch, () => true, 'a table from the stored patch');
    expect(server.tautline.hub.room(sessionId)).toBeUndefined();
    const patch = created.body.session.patch;
    const tensionN = first.wire.string.tensionN + 7;
    await lead.patch(`/api/sessions/${sessionId}`).send({ patch: { ...patch, string: { ...patch.string, tensionN } } }).expect(200);
    const next = await tableWhere(watch, (wire) => wire.string.tensionN === tensionN, 'the replaced patch’s table', watch.tables.indexOf(first) + 1);
    expect(next.wire.sequence).toBeGreaterThan(first.wire.sequence);
  });

  it('a table is stamped with a document version and state vector at or past the edit it shows', async () => {
    const writer = client('designer');
    await waitForSnapshot(writer, (s) => s.synced && s.result !== null, 10_000, 'writer synced');
    const watch = await watchTables(fixture.members.listener.token);
    await tableWhere(watch, () => true, 'a table on subscribing');
    const room = server.tautline.hub.room(fixture.sessionId)!;
    let editVersion = -1;
    room.once('change', () => (editVersion = room.version));
    const from = watch.tables.length;
    writer.edit((doc) => patchDoc(doc).damping.set('b1PerS', 2.75));
    const clock = Y.decodeStateVector(Y.encodeStateVector(writer.doc)).get(writer.doc.clientID)!;
    const shown = await tableWhere(watch, (wire) => wire.damping.b1PerS === 2.75, 'the table for b1 = 2.75', from);
    expect(editVersion).toBeGreaterThan(0);
    expect(shown.wire.documentVersion).toBeGreaterThanOrEqual(editVersion);
    // The table's state vector covers the writer's edit (Yjs: clock = the next expected operation of that client).
    expect(Y.decodeStateVector(shown.wire.stateVector).get(writer.doc.clientID)).toBeGreaterThanOrEqual(clock);
    // Tables before it were for earlier versions.
    for (const earlier of watch.tables.slice(0, watch.tables.indexOf(shown))) expect(earlier.wire.documentVersion).toBeLessThan(shown.wire.documentVersion);
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

    // The same socket, then a fresh client, still subscribe and get tables.
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
