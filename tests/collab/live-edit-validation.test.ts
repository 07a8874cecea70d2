import request from 'supertest';
import * as Y from 'yjs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { patchDoc } from '../../shared/collab/patch-doc';
import { presenceColour } from '../../shared/collab/presence-colour';
import { LIMITS } from '../../shared/limits';
import { LIVE_CLOSE_CODES, type SessionNotice } from '../../shared/protocol/live-access';
import { SessionUpdate } from '../../server/db/entities/session-update';
import { eventually, openClient, waitForSnapshot } from '../support/collab-client';
import { openRawCollabClient } from '../support/raw-collab-client';
import { createStudioFixture, type StudioFixture } from '../support/studio-fixture';
import { as, startLiveTestServer, type LiveTestServer } from '../support/test-server';

/**
 * Live edits are checked before the document takes them. An attacker's script speaking the
 * y-websocket protocol by hand once stopped the whole server with one update (a non-point in the
 * displacement list threw inside a timer), and the bad update, already stored, crashed it again on
 * every restart. Here every such edit must be refused for its sender, never reach anyone else or
 * the database, and never stop the process.
 */

let server: LiveTestServer;
let fixture: StudioFixture;

beforeAll(async () => {
  server = await startLiveTestServer();
  fixture = await createStudioFixture(server, 'gate');
});

afterAll(async () => {
  await server?.close();
});

async function storedPatch(sessionId = fixture.sessionId) {
  return (await as(server.app, fixture.members.lead.token).get(`/api/sessions/${sessionId}`)).body.session.patch;
}

async function newSession(name: string): Promise<string> {
  return (await as(server.app, fixture.members.lead.token).post(`/api/studios/${fixture.studioId}/sessions`).send({ name })).body.session.id;
}

/** Waits until nobody is connected and the room has written and freed its document. */
async function roomClosed(sessionId: string): Promise<void> {
  await eventually(() => server.tautline.hub.room(sessionId) === undefined, 5000, 'room closed');
  await new Promise((resolve) => setTimeout(resolve, 50));
}

const poisons: Array<[string, (doc: Y.Doc) => void, string]> = [
  ['a string in the displacement list', (doc) => doc.getArray('displacement').insert(0, ['not a point']), 'excitation.displacementM[1]'],
  ['null in the displacement list', (doc) => doc.getArray('displacement').insert(0, [null]), 'excitation.displacementM[1]'],
  ['a number in the velocity list', (doc) => doc.getArray('velocity').insert(0, [42]), 'excitation.velocityMPerS[1]'],
  ['shared text in the displacement list', (doc) => doc.getArray('displacement').insert(0, [new Y.Text('x')]), 'excitation.displacementM[1]'],
  ['a point whose x is NaN', (doc) => (doc.getArray('displacement').get(0) as Y.Map<number>).set('x', Number.NaN), 'excitation.displacementM[1][0]'],
  ['NaN tension', (doc) => doc.getMap('string').set('tensionN', Number.NaN), 'string.tensionN'],
  ['a string length', (doc) => doc.getMap('string').set('lengthM', 'long'), 'string.lengthM'],
  ['the render settings emptied', (doc) => { const render = doc.getMap('render'); for (const key of [...render.keys()]) render.delete(key); }, 'render.'],
  ['a part the patch does not have', (doc) => doc.getMap('junk').set('a', 1), 'junk'],
  [`notes past ${LIMITS.maxPassThroughBytes / 1024} KiB`, (doc) => doc.getMap('extras').set('design', { notes: 'x'.repeat(3_900_000) }), 'design'],
];

describe('edits that would make the patch invalid', () => {
  it.each(poisons)('refuses %s for its sender only; nobody else sees it and nothing is stored', async (_what, poison, field) => {
    const before = await storedPatch();
    const watcher = openClient(server.baseUrl, fixture.sessionId, fixture.members.lead.token, 'watcher');
    await waitForSnapshot(watcher, (s) => s.synced && s.patch !== null, 5000, 'watcher synced');
    const attacker = openRawCollabClient(server.baseUrl, fixture.sessionId, fixture.members.designer.token);
    await attacker.synced;
    attacker.sendUpdate(attacker.change(poison));
    const closed = await attacker.closed;
    expect(closed.code).toBe(LIVE_CLOSE_CODES.editRefused);
    expect(closed.reason).toContain(field);
    // A valid edit after it still goes through, for everyone: the room is healthy.
    watcher.edit((doc) => patchDoc(doc).damping.set('b1PerS', 0.5 + Math.random()));
    const wanted = watcher.getSnapshot().patch?.damping.b1PerS;
    await eventually(() => server.tautline.hub.room(fixture.sessionId)?.doc.getMap('damping').get('b1PerS') === wanted, 5000, 'valid edit reaches the server');
    expect(watcher.getSnapshot().patchIssues).toEqual([]);
    expect((await request(server.app).get('/api/health')).body).toEqual({ ok: true });
    watcher.destroy();
    await roomClosed(fixture.sessionId);
    const after = await storedPatch();
    expect({ ...after, damping: before.damping }).toEqual(before);
    // Reopened from storage, the session reads as a valid patch: nothing of the poison was kept.
    const reader = openClient(server.baseUrl, fixture.sessionId, fixture.members.listener.token, 'reader');
    await waitForSnapshot(reader, (s) => s.synced && s.patch !== null, 5000, 'reader synced');
    expect(reader.getSnapshot().patchIssues).toEqual([]);
    expect(JSON.stringify(reader.doc.toJSON())).not.toContain('not a point');
    expect(reader.doc.share.has('junk')).toBe(false);
    reader.destroy();
    await roomClosed(fixture.sessionId);
    const rows = await server.dataSource.getRepository(SessionUpdate).findBy({ sessionId: fixture.sessionId });
    for (const row of rows) expect(Buffer.from(row.update).includes(Buffer.from('not a point'))).toBe(false);
  });
});

describe('edits that build on changes the server never saw', () => {
  it('drops the connection that sends them and keeps nothing pending', async () => {
    const attacker = openRawCollabClient(server.baseUrl, fixture.sessionId, fixture.members.designer.token);
    await attacker.synced;
    attacker.change((doc) => doc.getMap('damping').set('b1PerS', 0.9)); // never sent
    const orphan = attacker.change((doc) => doc.getMap('damping').set('b1PerS', 0.8));
    attacker.sendUpdate(orphan);
    const closed = await attacker.closed;
    expect(closed.code).toBe(LIVE_CLOSE_CODES.flooded);
    const room = server.tautline.hub.room(fixture.sessionId);
    if (room) {
      expect(room.doc.store.pendingStructs).toBeNull();
      expect(room.doc.getMap('damping').get('b1PerS')).not.toBe(0.8);
    }
    await roomClosed(fixture.sessionId);
  });
});

describe('a session whose stored edits are already poisoned', () => {
  it('opens from its last valid state, and keeps only that', async () => {
    const sessionId = await newSession('Poisoned breakwater wire');
    const writer = openClient(server.baseUrl, sessionId, fixture.members.designer.token, 'writer');
    await waitForSnapshot(writer, (s) => s.synced && s.patch !== null, 5000, 'synced');
    writer.edit((doc) => patchDoc(doc).damping.set('b1PerS', 1.25));
    await eventually(() => server.tautline.hub.room(sessionId)?.doc.getMap('damping').get('b1PerS') === 1.25, 5000, 'edit stored');
    // The bad update as an older server stored it, straight into the log, built on the session's state.
    const copy = new Y.Doc();
    Y.applyUpdate(copy, Y.encodeStateAsUpdate(writer.doc));
    let poison: Uint8Array | null = null;
    copy.on('update', (update: Uint8Array) => (poison = update));
    copy.getArray('displacement').insert(0, ['not a point']);
    writer.destroy();
    await roomClosed(sessionId);
    await server.dataSource.getRepository(SessionUpdate).insert({ sessionId, update: Buffer.from(poison as unknown as Uint8Array) });

    const reader = openClient(server.baseUrl, sessionId, fixture.members.lead.token, 'reader');
    const opened = await waitForSnapshot(reader, (s) => s.synced && s.patch !== null, 5000, 'reader synced');
    expect(opened.patchIssues).toEqual([]);
    expect(opened.patch?.damping.b1PerS).toBe(1.25); // the last valid state, not the session's first
    expect(reader.doc.getArray('displacement').toArray().every((point) => point instanceof Y.Map)).toBe(true);
    reader.destroy();
    await roomClosed(sessionId);
    const rows = await server.dataSource.getRepository(SessionUpdate).findBy({ sessionId });
    for (const row of rows) expect(Buffer.from(row.update).includes(Buffer.from('not a point'))).toBe(false);
  });
});

describe('presence', () => {
  it('shows the name, colour and role the server knows, whatever the browser claims, and no one can speak for another', async () => {
    const lead = openClient(server.baseUrl, fixture.sessionId, fixture.members.lead.token, 'Wren');
    await waitForSnapshot(lead, (s) => s.synced, 5000, 'lead synced');
    const listener = openRawCollabClient(server.baseUrl, fixture.sessionId, fixture.members.listener.token);
    await listener.synced;
    const watcher = openClient(server.baseUrl, fixture.sessionId, fixture.members.producer.token, 'watcher');
    await waitForSnapshot(watcher, (s) => s.peers.some((peer) => peer.clientId === lead.doc.clientID), 5000, 'lead visible');
    listener.sendPresence([
      [listener.doc.clientID, 1, { name: 'Studio owner', colour: '#000000', role: 'lead', pointerXM: 0.2, dragging: null }],
      [lead.doc.clientID, 99, { name: 'Wren (hijacked)', colour: '#000000', pointerXM: 0, dragging: null }],
    ]);
    const seen = await waitForSnapshot(watcher, (s) => s.peers.some((peer) => peer.clientId === listener.doc.clientID), 5000, 'listener visible');
    const spoofer = seen.peers.find((peer) => peer.clientId === listener.doc.clientID);
    expect(spoofer).toMatchObject({ name: 'listener of gate', colour: presenceColour('listener of gate'), role: 'listener', pointerXM: 0.2 });
    await new Promise((resolve) => setTimeout(resolve, 100));
    const leadSeen = watcher.getSnapshot().peers.find((peer) => peer.clientId === lead.doc.clientID);
    expect(leadSeen?.name).toBe('Wren Halloway');
    listener.socket.close();
    lead.destroy();
    watcher.destroy();
    await roomClosed(fixture.sessionId);
  });
});

describe('when the database refuses writes', () => {
  it('tells everyone edits are not being saved, keeps them, and saves them once it can', async () => {
    const notices: SessionNotice[] = [];
    server.tautline.hub.on('notice', (notice: SessionNotice) => notices.push(notice));
    const writer = openClient(server.baseUrl, fixture.sessionId, fixture.members.designer.token, 'writer');
    await waitForSnapshot(writer, (s) => s.synced && s.patch !== null, 5000, 'synced');
    await server.dataSource.query('PRAGMA query_only = 1');
    writer.edit((doc) => patchDoc(doc).damping.set('b1PerS', 2.5));
    await eventually(() => notices.some((notice) => notice.kind === 'not-saving' && notice.sessionId === fixture.sessionId), 5000, 'not-saving notice');
    await server.dataSource.query('PRAGMA query_only = 0');
    await eventually(() => notices.some((notice) => notice.kind === 'saving'), 5000, 'saving notice');
    writer.destroy();
    await roomClosed(fixture.sessionId);
    expect((await storedPatch()).damping.b1PerS).toBe(2.5);
  });
});
