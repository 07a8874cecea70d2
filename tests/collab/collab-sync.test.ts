import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { movePoint, setLengthM } from '../../shared/collab/point-edits';
import { patchDoc } from '../../shared/collab/patch-doc';
import { presenceColour } from '../../shared/collab/presence-colour';
import { as, registerUser, startLiveTestServer, type LiveTestServer } from '../support/test-server';
import { createStudioFixture, type StudioFixture } from '../support/studio-fixture';
import { eventually, openClient, waitForSnapshot } from '../support/collab-client';
import type { SessionConnection } from '../../src/lib/live-session/session-connection';
import { websocketUpgradeStatus } from '../support/websocket-upgrade';

let server: LiveTestServer;
let fixture: StudioFixture;
const clients: SessionConnection[] = [];

beforeAll(async () => {
  server = await startLiveTestServer();
  fixture = await createStudioFixture(server);
});
afterAll(async () => {
  for (const client of clients) client.destroy();
  await server.close();
});

function client(role: keyof StudioFixture['members'], sessionId = fixture.sessionId): SessionConnection {
  const opened = openClient(server.baseUrl, sessionId, fixture.members[role].token, role);
  clients.push(opened);
  return opened;
}

const docJson = (connection: SessionConnection) => JSON.stringify(connection.doc.toJSON());

/** Opens a raw websocket to the collaboration endpoint and reports how the upgrade ended. */
async function rawUpgrade(path: string, headers: Record<string, string> = {}): Promise<{ status: number } | { open: true }> {
  const status = await websocketUpgradeStatus(`${server.baseUrl.replace('http', 'ws')}${path}`, { headers });
  return status === 101 ? { open: true } : { status };
}

describe('shared session document', () => {
  it('two clients converge after concurrent edits to different fields and points', async () => {
    const a = client('lead');
    const b = client('designer');
    await waitForSnapshot(a, (s) => s.synced && s.patch !== null, 5000, 'a synced');
    await waitForSnapshot(b, (s) => s.synced && s.patch !== null, 5000, 'b synced');
    a.edit((doc, origin) => movePoint(doc, 'displacement', 1, 0.17, 0.004, origin));
    b.edit((doc) => patchDoc(doc).damping.set('b1PerS', 2.5));
    // Each snapshot follows its document once per frame: wait for both, not only a's.
    await eventually(() => docJson(a) === docJson(b) && a.getSnapshot().patch?.damping.b1PerS === 2.5 && b.getSnapshot().patch?.excitation.displacementM[2]?.[0] === 0.17, 5000, 'convergence');
    const patchA = a.getSnapshot().patch;
    expect(patchA?.excitation.displacementM[2]).toEqual([0.17, 0.004]);
    expect(b.getSnapshot().patch).toEqual(patchA);
  });

  it('three clients converge, and the session patch JSON the REST API serves follows the document', async () => {
    const [a, b, c] = [client('lead'), client('designer'), client('lead')];
    for (const connection of [a, b, c]) await waitForSnapshot(connection, (s) => s.synced, 5000, 'synced');
    a.edit((doc) => patchDoc(doc).string.set('tensionN', 71.5));
    b.edit((doc) => patchDoc(doc).pickup.set('positionM', 0.12));
    c.edit((doc, origin) => setLengthM(doc, 0.7, origin));
    await eventually(
      () => docJson(a) === docJson(b) && docJson(b) === docJson(c) && a.getSnapshot().patch?.string.lengthM === 0.7 && a.getSnapshot().patch?.string.tensionN === 71.5,
      5000,
      'three-way convergence',
    );
    let served: { string: { tensionN: number; lengthM: number } } | null = null;
    for (let attempt = 0; attempt < 50; attempt++) {
      served = (await as(server.app, fixture.members.lead.token).get(`/api/sessions/${fixture.sessionId}`)).body.session.patch;
      if (served?.string.lengthM === 0.7 && served.string.tensionN === 71.5) break;
      await new Promise((resolve) => setTimeout(resolve, 50));
    }
    expect(served?.string).toMatchObject({ tensionN: 71.5, lengthM: 0.7 });
  });

  it('read-only roles receive every change but their own edits are refused and never reach anyone', async () => {
    const writer = client('designer');
    const listener = client('listener');
    const producer = client('producer');
    for (const connection of [writer, listener, producer]) await waitForSnapshot(connection, (s) => s.synced, 5000, 'synced');
    await waitForSnapshot(listener, (s) => s.readOnly && s.role === 'listener', 5000, 'listener told read-only');
    await waitForSnapshot(producer, (s) => s.readOnly && s.role === 'producer', 5000, 'producer told read-only');
    expect(listener.edit((doc) => patchDoc(doc).damping.set('b1PerS', 99))).toBe(false);
    // Bypass the client library's refusal: write straight into the local documents.
    listener.doc.transact(() => patchDoc(listener.doc).damping.set('b2M2PerS', 0.5));
    producer.doc.transact(() => patchDoc(producer.doc).string.set('tensionN', 1));
    writer.edit((doc) => patchDoc(doc).damping.set('b1PerS', 3.25));
    await waitForSnapshot(listener, (s) => s.patch?.damping.b1PerS === 3.25, 5000, 'listener sees the writer');
    await new Promise((resolve) => setTimeout(resolve, 300));
    expect(writer.getSnapshot().patch?.damping.b2M2PerS).not.toBe(0.5);
    expect(writer.getSnapshot().patch?.string.tensionN).not.toBe(1);
    const fresh = client('lead');
    await waitForSnapshot(fresh, (s) => s.synced && s.patch !== null, 5000, 'fresh synced');
    expect(fresh.getSnapshot().patch?.damping.b2M2PerS).not.toBe(0.5);
    expect(fresh.getSnapshot().patch?.string.tensionN).not.toBe(1);
  });

  it('shares presence: names, colours, pointer position and what each person drags', async () => {
    const a = client('lead');
    const b = client('designer');
    await waitForSnapshot(a, (s) => s.synced, 5000, 'synced');
    await waitForSnapshot(b, (s) => s.synced, 5000, 'synced');
    b.setPresence({ pointerXM: 0.31, dragging: { layer: 'displacement', index: 0 } });
    // Name and colour come from the server's records of the person, not from what the client sent ('designer', #d49a2a).
    const name = 'designer of kla';
    const seen = await waitForSnapshot(a, (s) => s.peers.some((peer) => peer.name === name && peer.pointerXM === 0.31), 5000, 'presence');
    const peer = seen.peers.find((candidate) => candidate.pointerXM === 0.31);
    expect(peer?.dragging).toEqual({ layer: 'displacement', index: 0 });
    expect(peer?.colour).toBe(presenceColour(name));
    expect(peer?.role).toBe('designer');
    b.destroy();
    await waitForSnapshot(a, (s) => !s.peers.some((candidate) => candidate.pointerXM === 0.31), 5000, 'presence removed on leave');
  });

  it('undoes and redoes only one’s own edits, never a teammate’s', async () => {
    const a = client('lead');
    const b = client('designer');
    for (const connection of [a, b]) await waitForSnapshot(connection, (s) => s.synced, 5000, 'synced');
    a.edit((doc) => patchDoc(doc).damping.set('b1PerS', 0.75));
    await waitForSnapshot(b, (s) => s.patch?.damping.b1PerS === 0.75, 5000, 'b sees a');
    b.edit((doc) => patchDoc(doc).string.set('tensionN', 64));
    await waitForSnapshot(a, (s) => s.patch?.string.tensionN === 64, 5000, 'a sees b');
    expect(a.getSnapshot().canUndo).toBe(true);
    a.undo();
    await waitForSnapshot(b, (s) => s.patch?.damping.b1PerS !== 0.75, 5000, 'undo reaches b');
    expect(a.getSnapshot().patch?.string.tensionN).toBe(64);
    a.redo();
    await waitForSnapshot(b, (s) => s.patch?.damping.b1PerS === 0.75, 5000, 'redo reaches b');
  });
});

describe('who is in a session now', () => {
  it('lists the people connected to each of the studio’s sessions', async () => {
    const a = client('designer');
    await waitForSnapshot(a, (s) => s.synced, 5000, 'synced');
    const presence = await as(server.app, fixture.members.listener.token).get(`/api/studios/${fixture.studioId}/sessions/presence`);
    expect(presence.status).toBe(200);
    expect(presence.body.presence[fixture.sessionId].map((person: { id: string }) => person.id)).toContain(fixture.members.designer.id);
    const outsider = await registerUser(server.app, 'presence-outsider@gannet-rock.example', 'Outsider');
    expect((await as(server.app, outsider.token).get(`/api/studios/${fixture.studioId}/sessions/presence`)).status).toBe(404);
  });
});

describe('REST edits of a live session', () => {
  it('reach everyone connected at once: a preset loaded through the API replaces the live document', async () => {
    const a = client('designer');
    await waitForSnapshot(a, (s) => s.synced && s.patch !== null, 5000, 'synced');
    const presets = await as(server.app, fixture.members.lead.token).post(`/api/studios/${fixture.studioId}/presets`).send({ name: 'Quay lamp wire', sessionId: fixture.sessionId });
    const changed = { ...presets.body.preset.patch, damping: { b1PerS: 0.33, b2M2PerS: 0.0001 } };
    await as(server.app, fixture.members.lead.token).patch(`/api/presets/${presets.body.preset.id}`).send({ patch: changed });
    const loaded = await as(server.app, fixture.members.lead.token).post(`/api/sessions/${fixture.sessionId}/load-preset`).send({ presetId: presets.body.preset.id });
    expect(loaded.status).toBe(200);
    expect(loaded.body.session.patch.damping.b1PerS).toBe(0.33);
    await waitForSnapshot(a, (s) => s.patch?.damping.b1PerS === 0.33 && s.patch?.name === 'Quay lamp wire', 5000, 'live document replaced');
  });
});

describe('undo of a drag', () => {
  it('undoes a whole drag in one step, however long it lasted', async () => {
    const a = client('designer');
    await waitForSnapshot(a, (s) => s.synced && s.patch !== null, 5000, 'synced');
    const start = a.getSnapshot().patch!.damping.b1PerS;
    a.beginGesture();
    for (const value of [1.1, 1.2, 1.3]) {
      a.edit((doc) => patchDoc(doc).damping.set('b1PerS', value));
      await new Promise((resolve) => setTimeout(resolve, 350)); // longer than the 300 ms capture window
    }
    a.endGesture();
    a.undo();
    await waitForSnapshot(a, (s) => s.patch?.damping.b1PerS === start, 5000, 'whole drag undone');
  });
});

describe('who may connect', () => {
  it('refuses no token and bad tokens (401), foreign and unknown sessions (404); members connect, to archived sessions too (read-only)', async () => {
    expect(await rawUpgrade(`/collab/${fixture.sessionId}`)).toEqual({ status: 401 });
    expect(await rawUpgrade(`/collab/${fixture.sessionId}?token=forged.token.value`)).toEqual({ status: 401 });
    const outsider = await registerUser(server.app, 'gannet-lead@gannet-rock.example', 'Gannet Lead');
    expect(await rawUpgrade(`/collab/${fixture.sessionId}?token=${outsider.token}`)).toEqual({ status: 404 });
    expect(await rawUpgrade(`/collab/no-such-session?token=${fixture.members.lead.token}`)).toEqual({ status: 404 });
    const archived = await as(server.app, fixture.members.lead.token).post(`/api/studios/${fixture.studioId}/sessions`).send({ name: 'Old draft' });
    await as(server.app, fixture.members.lead.token).patch(`/api/sessions/${archived.body.session.id}`).send({ archived: true });
    expect(await rawUpgrade(`/collab/${archived.body.session.id}?token=${fixture.members.lead.token}`)).toEqual({ open: true });
    expect(await rawUpgrade(`/collab/${fixture.sessionId}?token=${fixture.members.listener.token}`)).toEqual({ open: true });
    expect(await rawUpgrade(`/collab/${fixture.sessionId}`, { Cookie: `tautline_token=${fixture.members.designer.token}` })).toEqual({ open: true });
    expect(await rawUpgrade(`/elsewhere?token=${fixture.members.lead.token}`)).toEqual({ status: 404 });
  });
});
