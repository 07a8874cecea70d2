import WebSocket from 'ws';
import { io as connectSocket, type Socket } from 'socket.io-client';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { patchDoc } from '../../shared/collab/patch-doc';
import { COMPUTE_EVENTS, PROTOCOL_VERSION } from '../../shared/protocol/compute-protocol';
import { decodeModeTable } from '../../shared/protocol/mode-table-wire';
import type { WireModeTableMessage } from '../../shared/protocol/socket-events';
import { LIVE_ACCESS_MESSAGES, LIVE_CLOSE_CODES, SESSION_NOTICE_EVENT, type SessionNotice } from '../../shared/protocol/live-access';
import { RENDER_EVENTS, type RenderProgressMessage, type RenderRefusedMessage } from '../../shared/protocol/render-protocol';
import { createTautlineServer, type TautlineServer } from '../../server/http-server';
import type { SessionConnection } from '../../src/lib/live-session/session-connection';
import { eventually, openClient, waitForSnapshot } from '../support/collab-client';
import { createStudioFixture, type StudioFixture } from '../support/studio-fixture';
import { as, startTestServer, TEST_PASSWORD, type TestServer } from '../support/test-server';
import { websocketUpgradeStatus } from '../support/websocket-upgrade';

/**
 * Live access follows every change of role and state: over real websockets and socket.io to the
 * in-process server, on a real SQLite file. "Within a second" is the brief's promise: each wait
 * after the change gives up after 1 s.
 */
const WITHIN_MS = 1000;

let server: TestServer;
let tautline: TautlineServer;
let baseUrl: string;
const logLines: string[] = [];
const clients: SessionConnection[] = [];
const sockets: Socket[] = [];
let fixtureCount = 0;

beforeAll(async () => {
  server = await startTestServer();
  // The server's log, kept: a deleted session must not leave a failed write behind.
  server.context.log = (line) => void logLines.push(line);
  tautline = createTautlineServer(server.context, { previewDurationS: 0.25 });
  baseUrl = `http://127.0.0.1:${await tautline.listen(0)}`;
});
afterEach(() => {
  for (const client of clients.splice(0)) client.destroy();
  for (const socket of sockets.splice(0)) socket.disconnect();
});
afterAll(async () => {
  await tautline.close();
  await server.close();
});

/** A fresh studio (one member per role) and session for each test, so no test sees another's changes. */
const freshStudio = () => createStudioFixture(server, `live${++fixtureCount}`);

function client(fixture: StudioFixture, role: keyof StudioFixture['members'], token = fixture.members[role].token): SessionConnection {
  const opened = openClient(baseUrl, fixture.sessionId, token, role);
  clients.push(opened);
  return opened;
}

const synced = (connection: SessionConnection, what: string) => waitForSnapshot(connection, (s) => s.synced && s.patch !== null && s.role !== null, 5000, what);

/** Writes to the document directly, past the client's own read-only check: what a modified client could send. */
function forceTension(connection: SessionConnection, tensionN: number): void {
  connection.doc.transact(() => patchDoc(connection.doc).string.set('tensionN', tensionN));
}

/**
 * Proves the server has handled everything `sender` sent so far: a presence change sent after it,
 * on the same websocket, has reached `observer`.
 */
async function afterAllSentBy(sender: SessionConnection, observer: SessionConnection, marker: number): Promise<void> {
  sender.setPresence({ pointerXM: marker });
  await waitForSnapshot(observer, (s) => s.peers.some((peer) => peer.pointerXM === marker), 5000, `presence marker ${marker}`);
}

/** The session's patch as the REST API serves it once the room has written (after a flush). */
async function storedTensionN(fixture: StudioFixture): Promise<number> {
  await tautline.hub.room(fixture.sessionId)?.flush();
  await new Promise((resolve) => setTimeout(resolve, 250)); // the patch column refreshes 200 ms after an edit
  const response = await as(server.app, fixture.members.lead.token).get(`/api/sessions/${fixture.sessionId}`);
  return response.body.session.patch.string.tensionN as number;
}

/** A raw collaboration websocket, to see the close frame itself. */
function rawCollab(fixture: StudioFixture, token: string): Promise<{ socket: WebSocket; closed: Promise<{ code: number; reason: string }> }> {
  return new Promise((resolve, reject) => {
    const socket = new WebSocket(`${baseUrl.replace('http', 'ws')}/collab/${fixture.sessionId}?token=${token}`);
    const closed = new Promise<{ code: number; reason: string }>((done) => socket.on('close', (code, reason) => done({ code, reason: reason.toString() })));
    socket.on('open', () => resolve({ socket, closed }));
    socket.on('error', reject);
  });
}

/** A raw socket.io client following a session's mode tables (and optionally a studio's renders). */
async function rawChannel(token: string): Promise<{ socket: Socket; notices: SessionNotice[]; results: WireModeTableMessage[]; progress: RenderProgressMessage[]; refused: RenderRefusedMessage[]; disconnected: () => boolean }> {
  const socket = connectSocket(baseUrl, { path: '/socket.io/', transports: ['websocket'], auth: { token } });
  sockets.push(socket);
  const notices: SessionNotice[] = [];
  const results: WireModeTableMessage[] = [];
  const progress: RenderProgressMessage[] = [];
  const refused: RenderRefusedMessage[] = [];
  let disconnected = false;
  socket.on(SESSION_NOTICE_EVENT, (notice: SessionNotice) => notices.push(notice));
  socket.on(COMPUTE_EVENTS.table, (message: WireModeTableMessage) => results.push(message));
  socket.on(RENDER_EVENTS.progress, (message: RenderProgressMessage) => progress.push(message));
  socket.on(RENDER_EVENTS.refused, (message: RenderRefusedMessage) => refused.push(message));
  socket.on('disconnect', () => (disconnected = true));
  await new Promise<void>((resolve, reject) => {
    socket.on('connect', () => resolve());
    socket.on('connect_error', reject);
  });
  return { socket, notices, results, progress, refused, disconnected: () => disconnected };
}

/** The document version a received table was computed for (it must decode). */
function tableVersion(message: WireModeTableMessage): number {
  const decoded = decodeModeTable(message.table);
  if (!decoded.ok) throw new Error(decoded.reason);
  return decoded.table.documentVersion;
}

async function subscribeCompute(channel: Awaited<ReturnType<typeof rawChannel>>, sessionId: string): Promise<void> {
  const joined = new Promise<void>((resolve) => channel.socket.once(COMPUTE_EVENTS.joined, () => resolve()));
  channel.socket.emit(COMPUTE_EVENTS.subscribe, { protocolVersion: PROTOCOL_VERSION, sessionId });
  await joined;
  await eventually(() => channel.results.length > 0, 10_000, 'a first mode table');
}

describe('live access follows changes of role and state', () => {
  it('close reasons fit a websocket close frame (at most 123 bytes, RFC 6455 §5.5.1)', () => {
    for (const message of Object.values(LIVE_ACCESS_MESSAGES)) expect(Buffer.byteLength(message), message).toBeLessThanOrEqual(123);
  });

  it('a designer demoted to listener is told read-only within a second; later writes reach no one and are not stored', async () => {
    const fixture = await freshStudio();
    const [designer, lead, producer] = [client(fixture, 'designer'), client(fixture, 'lead'), client(fixture, 'producer')];
    for (const [connection, name] of [[designer, 'designer'], [lead, 'lead'], [producer, 'producer']] as const) await synced(connection, name);
    const before = designer.getSnapshot().patch?.string.tensionN;
    expect(designer.getSnapshot().readOnly).toBe(false);

    await as(server.app, fixture.members.lead.token).patch(`/api/studios/${fixture.studioId}/members/${fixture.members.designer.id}`).send({ role: 'listener' }).expect(200);
    const told = await waitForSnapshot(designer, (s) => s.readOnly && s.notice?.message === LIVE_ACCESS_MESSAGES.readOnlyRole, WITHIN_MS, 'designer told read-only');
    expect(told.notice?.tone).toBe('caution');
    await waitForSnapshot(designer, (s) => s.role === 'listener', WITHIN_MS, 'the new role from the compute channel');

    forceTension(designer, 33.3);
    await afterAllSentBy(designer, producer, 0.271);
    expect(producer.getSnapshot().patch?.string.tensionN).toBe(before);
    expect(lead.getSnapshot().patch?.string.tensionN).toBe(before);
    expect(await storedTensionN(fixture)).toBe(before);
  });

  it('a listener raised to designer is told it may edit within a second, and its edits then reach everyone', async () => {
    const fixture = await freshStudio();
    const [listener, lead] = [client(fixture, 'listener'), client(fixture, 'lead')];
    await synced(listener, 'listener');
    await synced(lead, 'lead');
    expect(listener.getSnapshot().readOnly).toBe(true);

    await as(server.app, fixture.members.lead.token).patch(`/api/studios/${fixture.studioId}/members/${fixture.members.listener.id}`).send({ role: 'designer' }).expect(200);
    const oldDoc = listener.doc;
    await waitForSnapshot(listener, (s) => s.notice?.message === LIVE_ACCESS_MESSAGES.writableRole, WITHIN_MS, 'listener told it may edit');
    await waitForSnapshot(listener, (s) => listener.doc !== oldDoc && s.synced && !s.readOnly && s.role === 'designer', 5000, 'fresh document with the new role');
    expect(listener.edit((doc) => patchDoc(doc).string.set('tensionN', 71.25))).toBe(true);
    await waitForSnapshot(lead, (s) => s.patch?.string.tensionN === 71.25, 5000, 'lead sees the promoted edit');
    expect(await storedTensionN(fixture)).toBe(71.25);
  });

  it('a removed member is disconnected with the reason and receives no further edits or results', async () => {
    const fixture = await freshStudio();
    const [designer, lead] = [client(fixture, 'designer'), client(fixture, 'lead')];
    await synced(designer, 'designer');
    await synced(lead, 'lead');
    const raw = await rawCollab(fixture, fixture.members.designer.token);
    const channel = await rawChannel(fixture.members.designer.token);
    await subscribeCompute(channel, fixture.sessionId);
    const watcher = await rawChannel(fixture.members.lead.token);
    await subscribeCompute(watcher, fixture.sessionId);

    await as(server.app, fixture.members.lead.token).delete(`/api/studios/${fixture.studioId}/members/${fixture.members.designer.id}`).expect(204);
    const ended = await waitForSnapshot(designer, (s) => s.accessEnded !== null, WITHIN_MS, 'designer told of removal');
    expect(ended.accessEnded).toMatchObject({ reason: 'removed', code: LIVE_CLOSE_CODES.accessRevoked, message: LIVE_ACCESS_MESSAGES.removed });
    expect(ended.readOnly).toBe(true);
    expect(await raw.closed).toEqual({ code: LIVE_CLOSE_CODES.accessRevoked, reason: LIVE_ACCESS_MESSAGES.removed });
    await eventually(() => channel.notices.some((notice) => notice.kind === 'access-ended' && notice.reason === 'removed'), WITHIN_MS, 'compute notice of removal');

    const resultsBefore = channel.results.length;
    const watcherBefore = watcher.results.length;
    const versionBefore = Math.max(...watcher.results.map(tableVersion));
    const tensionBefore = designer.getSnapshot().patch?.string.tensionN;
    lead.edit((doc) => patchDoc(doc).string.set('tensionN', 58.5));
    // A table computed after the edit: it decodes, and it is for a document version past the one before.
    await eventually(() => watcher.results.some((result, index) => index >= watcherBefore && tableVersion(result) > versionBefore), 10_000, 'the lead still gets tables');
    await waitForSnapshot(lead, (s) => s.patch?.string.tensionN === 58.5, 5000, 'lead edit applied');
    expect(channel.results.length).toBe(resultsBefore);
    expect(designer.getSnapshot().patch?.string.tensionN).toBe(tensionBefore);
    expect(designer.provider.wsconnected).toBe(false);
  });

  it('archiving makes everyone read-only within a second (writes dropped); restoring makes editors writable again', async () => {
    const fixture = await freshStudio();
    const [designer, lead] = [client(fixture, 'designer'), client(fixture, 'lead')];
    await synced(designer, 'designer');
    await synced(lead, 'lead');
    const before = lead.getSnapshot().patch?.string.tensionN;

    await as(server.app, fixture.members.lead.token).patch(`/api/sessions/${fixture.sessionId}`).send({ archived: true }).expect(200);
    for (const connection of [designer, lead]) {
      await waitForSnapshot(connection, (s) => s.readOnly && s.notice?.message === LIVE_ACCESS_MESSAGES.readOnlyArchived, WITHIN_MS, 'told archived');
    }
    forceTension(designer, 12.5);
    await afterAllSentBy(designer, lead, 0.333);
    expect(lead.getSnapshot().patch?.string.tensionN).toBe(before);
    expect(await storedTensionN(fixture)).toBe(before);
    // Someone opening the archived session now (or reconnecting) can watch and listen, read-only.
    const late = client(fixture, 'designer');
    const opened = await waitForSnapshot(late, (s) => s.synced && s.readOnly && s.patch !== null, 5000, 'late visitor reads the archived session');
    expect(opened.patch?.string.tensionN).toBe(before);
    late.destroy();

    await as(server.app, fixture.members.lead.token).patch(`/api/sessions/${fixture.sessionId}`).send({ archived: false }).expect(200);
    const archivedDoc = designer.doc;
    await waitForSnapshot(designer, (s) => s.notice?.message === LIVE_ACCESS_MESSAGES.writableRestored, WITHIN_MS, 'designer told restored');
    await waitForSnapshot(designer, (s) => designer.doc !== archivedDoc && s.synced && !s.readOnly, 5000, 'designer synced again, writable');
    // The refused write was dropped with the old document: the designer shows the server's copy.
    await waitForSnapshot(designer, (s) => s.patch?.string.tensionN === before, 5000, 'designer back on the server copy');
    expect(designer.edit((doc) => patchDoc(doc).string.set('tensionN', 66.5))).toBe(true);
    await waitForSnapshot(lead, (s) => s.patch?.string.tensionN === 66.5, 5000, 'lead sees the edit after restore');
  });

  it('a password change disconnects live connections opened with the old token', async () => {
    const fixture = await freshStudio();
    const designer = client(fixture, 'designer');
    await synced(designer, 'designer');
    const channel = await rawChannel(fixture.members.designer.token);
    await subscribeCompute(channel, fixture.sessionId);

    const changed = await as(server.app, fixture.members.designer.token).post('/api/me/password').send({ currentPassword: TEST_PASSWORD, newPassword: 'amber-lighthouse-77' });
    expect(changed.status, JSON.stringify(changed.body)).toBe(200);
    const ended = await waitForSnapshot(designer, (s) => s.accessEnded !== null, WITHIN_MS, 'old-token connection closed');
    expect(ended.accessEnded).toMatchObject({ reason: 'signed-out', code: LIVE_CLOSE_CODES.accessRevoked });
    await eventually(() => channel.disconnected(), WITHIN_MS, 'compute socket disconnected');
    expect(channel.notices).toContainEqual(expect.objectContaining({ kind: 'access-ended', reason: 'signed-out' }));

    // The new token opens the session as before.
    const again = client(fixture, 'designer', changed.body.token as string);
    await synced(again, 'new token');
    expect(again.getSnapshot().readOnly).toBe(false);
  });

  it('signing out (token on the deny-list) closes that token’s live connections at once (the sign-out route publishes the change)', async () => {
    const fixture = await freshStudio();
    const designer = client(fixture, 'designer');
    await synced(designer, 'designer');
    await as(server.app, fixture.members.designer.token).post('/api/auth/logout').expect(204);
    const ended = await waitForSnapshot(designer, (s) => s.accessEnded !== null, WITHIN_MS, 'signed-out connection closed');
    expect(ended.accessEnded).toMatchObject({ reason: 'signed-out', code: LIVE_CLOSE_CODES.accessRevoked });
  });

  it('deleting an account disconnects its live connections with the reason', async () => {
    const fixture = await freshStudio();
    const producer = client(fixture, 'producer');
    await synced(producer, 'producer');
    const raw = await rawCollab(fixture, fixture.members.producer.token);
    await as(server.app, fixture.members.producer.token).delete('/api/me').send({ password: TEST_PASSWORD }).expect(204);
    const ended = await waitForSnapshot(producer, (s) => s.accessEnded !== null, WITHIN_MS, 'deleted account disconnected');
    expect(ended.accessEnded).toMatchObject({ reason: 'account-deleted', code: LIVE_CLOSE_CODES.accessRevoked });
    expect(await raw.closed).toEqual({ code: LIVE_CLOSE_CODES.accessRevoked, reason: LIVE_ACCESS_MESSAGES['account-deleted'] });
  });

  it('deleting a session closes its room: everyone is told, and nothing is written after the rows are gone', async () => {
    const fixture = await freshStudio();
    const [designer, lead] = [client(fixture, 'designer'), client(fixture, 'lead')];
    await synced(designer, 'designer');
    await synced(lead, 'lead');
    const raw = await rawCollab(fixture, fixture.members.listener.token);
    const linesBefore = logLines.length;
    // An edit still waiting for its write (flushed every 20 ms) when the session goes.
    designer.edit((doc) => patchDoc(doc).string.set('tensionN', 44.4));
    await waitForSnapshot(lead, (s) => s.patch?.string.tensionN === 44.4, 5000, 'edit reached the lead');
    await as(server.app, fixture.members.lead.token).delete(`/api/sessions/${fixture.sessionId}`).expect(204);
    for (const connection of [designer, lead]) {
      const ended = await waitForSnapshot(connection, (s) => s.accessEnded !== null, WITHIN_MS, 'told of deletion');
      expect(ended.accessEnded).toMatchObject({ reason: 'session-deleted', code: LIVE_CLOSE_CODES.sessionDeleted });
    }
    expect(await raw.closed).toEqual({ code: LIVE_CLOSE_CODES.sessionDeleted, reason: LIVE_ACCESS_MESSAGES['session-deleted'] });
    expect(tautline.hub.room(fixture.sessionId)).toBeUndefined();
    await new Promise((resolve) => setTimeout(resolve, 300)); // past the flush and patch-refresh timers
    expect(logLines.slice(linesBefore).filter((line) => /session|FOREIGN|constraint/i.test(line))).toEqual([]);
    expect(await server.dataSource.query(`SELECT COUNT(*) AS n FROM session_updates WHERE "sessionId" = ?`, [fixture.sessionId])).toEqual([{ n: 0 }]);
    // A late connection is refused like any unknown session.
    const late = await websocketUpgradeStatus(`${baseUrl.replace('http', 'ws')}/collab/${fixture.sessionId}?token=${fixture.members.lead.token}`);
    expect(late).toBe(404);
  });

  it('a member removed from the studio stops receiving render progress on the renders channel', async () => {
    const fixture = await freshStudio();
    const designer = await rawChannel(fixture.members.designer.token);
    const lead = await rawChannel(fixture.members.lead.token);
    for (const channel of [designer, lead]) {
      const joined = new Promise<void>((resolve) => channel.socket.once(RENDER_EVENTS.joined, () => resolve()));
      channel.socket.emit(RENDER_EVENTS.subscribe, { studioId: fixture.studioId });
      await joined;
    }
    await as(server.app, fixture.members.lead.token).delete(`/api/studios/${fixture.studioId}/members/${fixture.members.designer.id}`).expect(204);
    await eventually(() => designer.refused.some((message) => message.studioId === fixture.studioId && message.code === 'not_found'), WITHIN_MS, 'renders refused after removal');

    const output = { sampleRateHz: 48000, format: 'pcm24', channels: { kind: 'mono' }, length: { kind: 'fixed', durationS: 0.25 }, normalization: { kind: 'peak', ceilingDbfs: -1 } };
    const started = await as(server.app, fixture.members.lead.token).post(`/api/studios/${fixture.studioId}/renders`).send({ kind: 'single', source: { kind: 'session', sessionId: fixture.sessionId }, output });
    expect(started.status, JSON.stringify(started.body)).toBe(202);
    await server.context.renders?.idle();
    await eventually(() => lead.progress.some((message) => message.renderId === started.body.render.id && message.state === 'done'), 10_000, 'lead sees the render finish');
    expect(designer.progress).toEqual([]);
  });
});
