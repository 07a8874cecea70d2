import { io, type Socket as ClientSocket } from 'socket.io-client';
import type { Response } from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { LIMITS } from '../../shared/limits';
import { COMPUTE_EVENTS, PROTOCOL_VERSION } from '../../shared/protocol/compute-protocol';
import { SESSION_NOTICE_EVENT, type SessionNotice } from '../../shared/protocol/live-access';
import type { ClientToServerEvents, ServerToClientEvents } from '../../shared/protocol/socket-events';
import { readFactoryPresets } from '../../server/seed/demo-seed';
import { createStudioFixture, type StudioFixture } from '../support/studio-fixture';
import { testPatch } from '../support/patches';
import { as, rowCount, startLiveTestServer, type LiveTestServer } from '../support/test-server';

/**
 * Presets and sessions from the editor's side, through the real app on a real SQLite file:
 * a new studio's factory presets, save as preset, update preset (the version counts changes of the
 * sound only), duplicate session, and the notice everyone present gets when a preset is loaded.
 * Invented scenario: Kestrel Lantern Audio shapes the strings of its game "Saltglass Reach".
 */

let server: LiveTestServer;
let kestrel: StudioFixture;
let serial = 0;
const unique = (stem: string) => `${stem} ${++serial}`;
const lead = () => as(server.app, kestrel.members.lead.token);

function expectStatus(response: Response, status: number): void {
  expect(response.status, `${response.status} ${JSON.stringify(response.body)}`).toBe(status);
}

async function newSession(body: Record<string, unknown> = {}) {
  const response = await lead().post(`/api/studios/${kestrel.studioId}/sessions`).send({ name: unique('Bell-buoy wire'), ...body });
  expectStatus(response, 201);
  return response.body.session as { id: string; name: string; updatedAt: string; patch: Record<string, unknown>; sourcePreset: { id: string; name: string; version: number } | null };
}

async function readSession(sessionId: string) {
  const response = await lead().get(`/api/sessions/${sessionId}`);
  expectStatus(response, 200);
  return response.body.session;
}

async function readPreset(presetId: string) {
  const response = await lead().get(`/api/presets/${presetId}`);
  expectStatus(response, 200);
  return response.body.preset;
}

beforeAll(async () => {
  server = await startLiveTestServer();
  kestrel = await createStudioFixture(server, 'pfs');
});

afterAll(() => server?.close());

describe('a new studio', () => {
  it('starts with the factory presets of presets/*.json, patches, tags and descriptions as in the files, authored by its lead', async () => {
    const created = await as(server.app, kestrel.members.designer.token).post('/api/studios').send({ name: 'Gannet Rock Sound' });
    expectStatus(created, 201);
    const studioId = created.body.studio.id as string;
    const list = await as(server.app, kestrel.members.designer.token).get(`/api/studios/${studioId}/presets`);
    expectStatus(list, 200);
    const factory = readFactoryPresets();
    expect(factory.length).toBeGreaterThan(0);
    expect(list.body.presets.map((preset: { name: string }) => preset.name).sort()).toEqual(factory.map((preset) => preset.patch.name).sort());
    for (const summary of list.body.presets) {
      const detail = (await as(server.app, kestrel.members.designer.token).get(`/api/presets/${summary.id}`)).body.preset;
      const file = factory.find((preset) => preset.patch.name === detail.name)!;
      expect(detail.patch).toEqual(file.patch);
      expect(detail.tags).toEqual(file.tags);
      expect(detail.description).toBe(file.description);
      expect(detail.version).toBe(1);
      expect(detail.author.id).toBe(kestrel.members.designer.id);
    }
  });
});

describe('save as preset, then update preset', () => {
  it('saving a session as a preset links the session to it, without changing "last edited"', async () => {
    const session = await newSession({ patch: testPatch({ name: 'Quay chain' }) });
    const saved = await lead().post(`/api/studios/${kestrel.studioId}/presets`).send({ name: unique('Quay chain, dry'), tags: ['steel', 'dry'], description: 'A short, dry chain rattle.', sessionId: session.id });
    expectStatus(saved, 201);
    expect(saved.body.preset).toMatchObject({ version: 1, tags: ['steel', 'dry'], description: 'A short, dry chain rattle.' });
    expect({ ...saved.body.preset.patch, name: '' }).toEqual({ ...session.patch, name: '' });
    const after = await readSession(session.id);
    expect(after.sourcePreset).toEqual({ id: saved.body.preset.id, name: saved.body.preset.name, version: 1 });
    expect(after.updatedAt).toBe(session.updatedAt);
  });

  it("update preset raises the version only when the session's patch changed, and writes that patch", async () => {
    const session = await newSession({ patch: testPatch({ name: 'Lamp wire' }) });
    const presetId = (await lead().post(`/api/studios/${kestrel.studioId}/presets`).send({ name: unique('Lamp wire'), sessionId: session.id })).body.preset.id as string;

    const same = await lead().post(`/api/sessions/${session.id}/update-preset`);
    expectStatus(same, 200);
    expect(same.body).toMatchObject({ changed: false, preset: { id: presetId, version: 1 } });

    const tighter = testPatch({ name: 'Lamp wire', string: { lengthM: 0.65, tensionN: 90, linearDensityKgPerM: 6e-4, inharmonicityB: 0 } });
    expectStatus(await lead().patch(`/api/sessions/${session.id}`).send({ patch: tighter }), 200);
    const changed = await lead().post(`/api/sessions/${session.id}/update-preset`);
    expectStatus(changed, 200);
    expect(changed.body).toMatchObject({ changed: true, preset: { id: presetId, version: 2 } });
    const preset = await readPreset(presetId);
    expect(preset.version).toBe(2);
    expect(preset.patch.string.tensionN).toBe(90);
    // The preset keeps its own name; the session's name is not the sound.
    expect(preset.patch.name).toBe(preset.name);

    const again = await lead().post(`/api/sessions/${session.id}/update-preset`);
    expect(again.body).toMatchObject({ changed: false, preset: { version: 2 } });
  });

  it('update preset on a session that came from no preset is refused (409) and changes nothing', async () => {
    const session = await newSession();
    const before = await server.dataSource.query(`SELECT * FROM "presets" ORDER BY id`);
    const response = await lead().post(`/api/sessions/${session.id}/update-preset`);
    expectStatus(response, 409);
    expect(response.body.error.message).toMatch(/save it as a new preset/);
    expect(await server.dataSource.query(`SELECT * FROM "presets" ORDER BY id`)).toEqual(before);
  });

  it('a session started from a preset can update it; deleting the preset unlinks the session', async () => {
    const presetId = (await lead().post(`/api/studios/${kestrel.studioId}/presets`).send({ name: unique('Rope locker'), patch: testPatch() })).body.preset.id as string;
    const session = await newSession({ presetId });
    expect(session.sourcePreset).toMatchObject({ id: presetId, version: 1 });
    expectStatus(await lead().delete(`/api/presets/${presetId}`), 204);
    expect((await readSession(session.id)).sourcePreset).toBeNull();
    expectStatus(await lead().post(`/api/sessions/${session.id}/update-preset`), 409);
  });

  it('a designer may not update a preset (403) and the preset stays', async () => {
    const session = await newSession({ patch: testPatch({ name: 'Gull wire' }) });
    const presetId = (await lead().post(`/api/studios/${kestrel.studioId}/presets`).send({ name: unique('Gull wire'), sessionId: session.id })).body.preset.id as string;
    expectStatus(await lead().patch(`/api/sessions/${session.id}`).send({ patch: testPatch({ name: 'Gull wire', string: { lengthM: 0.65, tensionN: 70, linearDensityKgPerM: 6e-4, inharmonicityB: 0 } }) }), 200);
    const refused = await as(server.app, kestrel.members.designer.token).post(`/api/sessions/${session.id}/update-preset`);
    expectStatus(refused, 403);
    expect(refused.body.error.message).toBe('Not allowed: only leads can save, edit or delete presets');
    expect((await readPreset(presetId)).version).toBe(1);
  });
});

describe('duplicate session', () => {
  it('copies the patch and the source preset, names the copy "… (copy)", and leaves the original alone', async () => {
    const presetId = (await lead().post(`/api/studios/${kestrel.studioId}/presets`).send({ name: unique('Breakwater'), patch: testPatch() })).body.preset.id as string;
    const original = await newSession({ presetId });
    const sessionsBefore = await rowCount(server.dataSource, 'sessions');
    const copy = await as(server.app, kestrel.members.designer.token).post(`/api/sessions/${original.id}/duplicate`);
    expectStatus(copy, 201);
    expect(copy.body.session.id).not.toBe(original.id);
    expect(copy.body.session.name).toBe(`${original.name} (copy)`);
    expect(copy.body.session.patch).toEqual(original.patch);
    expect(copy.body.session.sourcePreset).toMatchObject({ id: presetId });
    expect(copy.body.session.createdBy.id).toBe(kestrel.members.designer.id);
    expect(await rowCount(server.dataSource, 'sessions')).toBe(sessionsBefore + 1);
    expect(await readSession(original.id)).toMatchObject({ name: original.name, updatedAt: original.updatedAt });
  });

  it('a name at the length limit stays within it', async () => {
    const original = await newSession({ name: 'W'.repeat(LIMITS.maxLabelLength) });
    const copy = await lead().post(`/api/sessions/${original.id}/duplicate`);
    expectStatus(copy, 201);
    expect(copy.body.session.name).toHaveLength(LIMITS.maxLabelLength);
    expect(copy.body.session.name.endsWith(' (copy)')).toBe(true);
  });

  it('a listener may not duplicate (403) and nothing is added', async () => {
    const original = await newSession();
    const before = await rowCount(server.dataSource, 'sessions');
    const refused = await as(server.app, kestrel.members.listener.token).post(`/api/sessions/${original.id}/duplicate`);
    expectStatus(refused, 403);
    expect(await rowCount(server.dataSource, 'sessions')).toBe(before);
  });
});

describe('a preset loaded into an open session', () => {
  function follow(token: string, sessionId: string): Promise<ClientSocket<ServerToClientEvents, ClientToServerEvents>> {
    const socket: ClientSocket<ServerToClientEvents, ClientToServerEvents> = io(server.baseUrl, { path: '/socket.io/', transports: ['websocket'], auth: { token }, reconnection: false });
    return new Promise((resolve, reject) => {
      socket.on('connect_error', reject);
      socket.on(COMPUTE_EVENTS.joined, () => resolve(socket));
      socket.on('connect', () => socket.emit(COMPUTE_EVENTS.subscribe, { protocolVersion: PROTOCOL_VERSION, sessionId }));
    });
  }

  function nextNotice(socket: ClientSocket<ServerToClientEvents, ClientToServerEvents>): Promise<SessionNotice> {
    return new Promise((resolve, reject) => {
      const timer = setTimeout(() => reject(new Error('no notice within 5 s')), 5000);
      socket.once(SESSION_NOTICE_EVENT, (notice) => {
        clearTimeout(timer);
        resolve(notice);
      });
    });
  }

  it('everyone following the session is told who loaded which preset, and the session remembers it', async () => {
    const session = await newSession();
    const presetId = (await lead().post(`/api/studios/${kestrel.studioId}/presets`).send({ name: 'Tidepool hammer wire', patch: testPatch() })).body.preset.id as string;
    const listener = await follow(kestrel.members.listener.token, session.id);
    const producer = await follow(kestrel.members.producer.token, session.id);
    try {
      const heard = [nextNotice(listener), nextNotice(producer)];
      const response = await as(server.app, kestrel.members.designer.token).post(`/api/sessions/${session.id}/preset-loaded`).send({ presetId });
      expectStatus(response, 200);
      expect(response.body.session.sourcePreset).toMatchObject({ id: presetId, name: 'Tidepool hammer wire' });
      for (const notice of await Promise.all(heard)) {
        expect(notice).toEqual({ kind: 'preset-loaded', sessionId: session.id, presetId, presetName: 'Tidepool hammer wire', byName: 'designer of pfs', message: 'designer of pfs loaded the preset “Tidepool hammer wire” into this session' });
      }
    } finally {
      listener.close();
      producer.close();
    }
  });

  it('a listener cannot announce a load (403), and nobody is told', async () => {
    const session = await newSession();
    const presetId = (await lead().post(`/api/studios/${kestrel.studioId}/presets`).send({ name: unique('Mooring cable'), patch: testPatch() })).body.preset.id as string;
    const notices: SessionNotice[] = [];
    const onNotice = (notice: SessionNotice) => notices.push(notice);
    server.tautline.hub.on('notice', onNotice);
    try {
      const refused = await as(server.app, kestrel.members.listener.token).post(`/api/sessions/${session.id}/preset-loaded`).send({ presetId });
      expectStatus(refused, 403);
      expect(notices).toEqual([]);
      expect((await readSession(session.id)).sourcePreset).toBeNull();
    } finally {
      server.tautline.hub.off('notice', onNotice);
    }
  });
});
