import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import type { Response } from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { computeModeTable, modeTableReport } from '../../shared/engine/mode-table';
import { LIMITS } from '../../shared/limits';
import { defaultPatch } from '../../shared/patch/default-patch';
import type { Patch, PatchInput } from '../../shared/patch/patch-schema';
import { validatePatch } from '../../shared/patch/validate-patch';
import { PROJECT_ROOT, runCli } from '../support/run-cli';
import { testPatch } from '../support/patches';
import { TEST_PASSWORD, as, registerUser, rowCount, startTestServer, type TestServer } from '../support/test-server';

/**
 * Sessions and presets through the real app: happy paths and bad input. Invented scenario: the
 * studio "Kestrel Lantern Audio" builds the string palette of its game "Saltglass Reach".
 */

let server: TestServer;
let leadToken: string;
let studioId: string;
let tmp: string;
let serial = 0;

const unique = (stem: string) => `${stem} ${++serial}`;
const lead = () => as(server.app, leadToken);

function expectStatus(response: Response, status: number): void {
  expect(response.status, `${response.status} ${JSON.stringify(response.body)}`).toBe(status);
}

/** A patch file of the factory palette, as JSON. */
function factoryPatch(file: string): PatchInput & { description?: string; tags?: string[] } {
  return JSON.parse(readFileSync(join(PROJECT_ROOT, 'presets', file), 'utf8'));
}

function validated(input: unknown): Patch {
  const result = validatePatch(input);
  if (!result.ok) throw new Error(`test patch is invalid: ${result.issues[0].message}`);
  return result.value;
}

/** What the command line prints for `modes`, as parsed JSON (JSON.stringify, as the CLI does). */
function expectedModes(patch: Patch) {
  return JSON.parse(JSON.stringify(modeTableReport(computeModeTable(patch))));
}

async function createSession(body: Record<string, unknown>, inStudio = studioId) {
  return lead().post(`/api/studios/${inStudio}/sessions`).send(body);
}

async function newSession(body: Record<string, unknown> = {}): Promise<{ id: string; name: string; patch: Patch }> {
  const response = await createSession({ name: unique('Harbour bell wire'), ...body });
  expectStatus(response, 201);
  return response.body.session;
}

async function newPreset(body: Record<string, unknown> = {}, inStudio = studioId, token = leadToken) {
  const name = unique('Quayside lamp wire');
  const response = await as(server.app, token)
    .post(`/api/studios/${inStudio}/presets`)
    .send({ name, tags: ['steel'], patch: testPatch({ name }), ...body });
  expectStatus(response, 201);
  return response.body.preset;
}

async function getSession(id: string) {
  const response = await lead().get(`/api/sessions/${id}`);
  expectStatus(response, 200);
  return response.body.session;
}

async function getPreset(id: string) {
  const response = await lead().get(`/api/presets/${id}`);
  expectStatus(response, 200);
  return response.body.preset;
}

function upload(json: string | Buffer, fields: Record<string, string> = {}, fileName = 'x.json') {
  let test = lead()
    .post(`/api/studios/${studioId}/presets/upload`)
    .attach('file', Buffer.isBuffer(json) ? json : Buffer.from(json), fileName);
  for (const [key, value] of Object.entries(fields)) test = test.field(key, value);
  return test;
}

/** Counts of every table a session or preset request could write. */
async function counts() {
  const out: Record<string, number> = {};
  for (const table of ['sessions', 'presets', 'studios', 'memberships']) out[table] = await rowCount(server.dataSource, table);
  return out;
}

beforeAll(async () => {
  server = await startTestServer();
  tmp = mkdtempSync(join(tmpdir(), 'tautline-sessions-'));
  leadToken = (await registerUser(server.app, 'wren.halloway@kestrel-lantern.test', 'Wren Halloway')).token;
  const response = await lead().post('/api/studios').send({ name: 'Kestrel Lantern Audio' });
  expectStatus(response, 201);
  studioId = response.body.studio.id;
});

afterAll(async () => {
  await server?.close();
  if (tmp) rmSync(tmp, { recursive: true, force: true });
});

describe('creating sessions', () => {
  it('without a patch: 201 with the default patch, named after the session', async () => {
    const before = await rowCount(server.dataSource, 'sessions');
    const response = await createSession({ name: '  Saltglass Reach: lighthouse stair  ' });
    expectStatus(response, 201);
    const { session } = response.body;
    expect(session.name).toBe('Saltglass Reach: lighthouse stair');
    expect(session.patch).toEqual(defaultPatch('Saltglass Reach: lighthouse stair'));
    expect(session).toMatchObject({ studioId, archived: false, createdBy: { displayName: 'Wren Halloway' }, updatedBy: { displayName: 'Wren Halloway' } });
    expect(validatePatch(session.patch).ok).toBe(true);
    expect(await rowCount(server.dataSource, 'sessions')).toBe(before + 1);
    expect((await getSession(session.id)).patch).toEqual(defaultPatch('Saltglass Reach: lighthouse stair'));
  });

  it('with a valid patch: 201 with that patch, defaults filled in and extra fields kept', async () => {
    const input = factoryPatch('breakwater-bass.json');
    const response = await createSession({ name: 'Storm-surge bass', patch: input });
    expectStatus(response, 201);
    expect(response.body.session.patch).toEqual(validated(input));
    const withoutB = testPatch({ string: { lengthM: 0.65, tensionN: 70, linearDensityKgPerM: 6e-4 } });
    const second = await createSession({ name: 'No stiffness given', patch: withoutB });
    expectStatus(second, 201);
    expect(second.body.session.patch.string.inharmonicityB).toBe(0);
    expect((await getSession(second.body.session.id)).patch).toEqual(validated(withoutB));
  });

  it('from a preset: 201 with a copy of the preset patch', async () => {
    const preset = await newPreset({ patch: factoryPatch('kelp-line-nylon.json') });
    const response = await createSession({ name: 'Kelp line, take 2', presetId: preset.id });
    expectStatus(response, 201);
    expect(response.body.session.patch).toEqual(preset.patch);
    expect((await getSession(response.body.session.id)).patch).toEqual(preset.patch);
  });

  it('with a bad patch: 422 naming patch.… and no row', async () => {
    const before = await counts();
    const response = await createSession({ name: 'Slack', patch: testPatch({ pickup: { positionM: 0.9, output: 'displacement' } }) });
    expectStatus(response, 422);
    expect(response.body.error.code).toBe('invalid_patch');
    expect(response.body.error.field).toBe('patch.pickup.positionM');
    expect(response.body.error.message).toMatch(/^patch\.pickup\.positionM must be < string\.lengthM \(0\.65\)/);
    expect(await counts()).toEqual(before);
  });

  it('with an unknown presetId: 404 and no row', async () => {
    const before = await counts();
    const response = await createSession({ name: 'Nowhere', presetId: '00000000-0000-4000-8000-000000000000' });
    expectStatus(response, 404);
    expect(response.body.error).toMatchObject({ code: 'not_found', message: 'Preset not found' });
    expect(await counts()).toEqual(before);
  });

  it('without a name, or with a name of the wrong type: 400 naming name, no row', async () => {
    const before = await counts();
    for (const body of [{}, { name: 42 }, { name: '   ' }, { name: 'x'.repeat(LIMITS.maxLabelLength + 1) }]) {
      const response = await createSession(body);
      expectStatus(response, 400);
      expect(response.body.error.code).toBe('invalid');
      expect(response.body.error.field).toBe('name');
      expect(response.body.error.message).toMatch(/^name /);
    }
    expect(await counts()).toEqual(before);
  });
});

describe('GET /api/sessions/:id/modes', () => {
  it('returns the same JSON as computeModeTable + modeTableReport on the default patch', async () => {
    const session = await newSession();
    const response = await lead().get(`/api/sessions/${session.id}/modes`);
    expectStatus(response, 200);
    expect(response.body).toEqual(expectedModes(validated(session.patch)));
    expect(Object.keys(response.body)).toEqual(['f0Hz', 'waveSpeedMPerS', 'totalEnergyJ', 'modes']);
    expect(response.body.modes.length).toBeGreaterThan(50);
  });

  it('returns exactly what `cli modes` prints for the same patch (a velocity pluck at 96 kHz)', async () => {
    const input = factoryPatch('glasswing-quill.json');
    const session = await newSession({ patch: input });
    const response = await lead().get(`/api/sessions/${session.id}/modes`);
    expectStatus(response, 200);
    expect(response.body).toEqual(expectedModes(validated(input)));
    const path = join(tmp, 'glasswing.json');
    writeFileSync(path, JSON.stringify(input));
    const cli = await runCli(['modes', path]);
    expect(cli.stderr).toBe('');
    expect(cli.code).toBe(0);
    expect(response.body).toEqual(JSON.parse(cli.stdout));
  });

  it('follows the session patch after an edit', async () => {
    const session = await newSession();
    const tighter = testPatch({ string: { lengthM: 0.65, tensionN: 90, linearDensityKgPerM: 6e-4, inharmonicityB: 1e-4 } });
    expectStatus(await lead().patch(`/api/sessions/${session.id}`).send({ patch: tighter }), 200);
    const response = await lead().get(`/api/sessions/${session.id}/modes`);
    expect(response.body).toEqual(expectedModes(validated(tighter)));
  });
});

describe('PATCH /api/sessions/:id', () => {
  it('renames and edits the patch, and records who edited', async () => {
    const session = await newSession();
    const patch = testPatch({ name: 'Lamp wire', damping: { b1PerS: 0.8, b2M2PerS: 2e-4 } });
    const response = await lead().patch(`/api/sessions/${session.id}`).send({ name: 'Lamp wire, damped', patch });
    expectStatus(response, 200);
    expect(response.body.session).toMatchObject({ name: 'Lamp wire, damped', patch: validated(patch), updatedBy: { displayName: 'Wren Halloway' } });
    expect(await getSession(session.id)).toMatchObject({ name: 'Lamp wire, damped', patch: validated(patch) });
  });

  it('a rename alone keeps the patch', async () => {
    const session = await newSession({ patch: testPatch({ name: 'Kept' }) });
    const response = await lead().patch(`/api/sessions/${session.id}`).send({ name: 'Only the name changes' });
    expectStatus(response, 200);
    expect((await getSession(session.id)).patch).toEqual(session.patch);
  });

  it('a bad patch (tensionN = -5): 422 naming patch.string.tensionN; the stored session is unchanged', async () => {
    const session = await newSession();
    const before = await getSession(session.id);
    const bad = testPatch({ string: { lengthM: 0.65, tensionN: -5, linearDensityKgPerM: 6e-4, inharmonicityB: 0 } });
    const response = await lead().patch(`/api/sessions/${session.id}`).send({ name: 'Should not stick', patch: bad });
    expectStatus(response, 422);
    expect(response.body.error).toEqual({
      code: 'invalid_patch',
      field: 'patch.string.tensionN',
      message: 'patch.string.tensionN must be > 0, got -5',
      issues: [{ field: 'patch.string.tensionN', problem: 'must be > 0', got: '-5', message: 'patch.string.tensionN must be > 0, got -5' }],
    });
    expect(await getSession(session.id)).toEqual(before);
  });

  it('a patch with several problems lists every one under issues', async () => {
    const session = await newSession();
    const before = await getSession(session.id);
    const bad = { ...testPatch(), pickup: { positionM: -1, output: 'magnetic' } };
    const response = await lead().patch(`/api/sessions/${session.id}`).send({ patch: bad });
    expectStatus(response, 422);
    expect(response.body.error.issues.map((issue: { field: string }) => issue.field).sort()).toEqual(['patch.pickup.output', 'patch.pickup.positionM']);
    expect(response.body.error.message).toMatch(/\(and 1 more\)$/);
    expect(await getSession(session.id)).toEqual(before);
  });

  it('wrong body types: 400 naming the field, nothing stored', async () => {
    const session = await newSession();
    const before = await getSession(session.id);
    const name = await lead().patch(`/api/sessions/${session.id}`).send({ name: 42 });
    expectStatus(name, 400);
    expect(name.body.error).toMatchObject({ code: 'invalid', field: 'name', message: 'name must be a string, got 42' });
    const archived = await lead().patch(`/api/sessions/${session.id}`).send({ archived: 'yes' });
    expectStatus(archived, 400);
    expect(archived.body.error.field).toBe('archived');
    expect(await getSession(session.id)).toEqual(before);
  });

  it('an empty body {}: 400, nothing stored', async () => {
    const session = await newSession();
    const before = await getSession(session.id);
    const response = await lead().patch(`/api/sessions/${session.id}`).send({});
    expectStatus(response, 400);
    expect(response.body.error.code).toBe('invalid');
    expect(response.body.error.message).toMatch(/must change name, patch or archived/);
    expect(await getSession(session.id)).toEqual(before);
  });

  it('a body-level error does not blame a field called "(patch)"', async () => {
    // "(patch)" is validatePatch's name for the root of a patch; a request body is not a patch.
    const session = await newSession();
    const empty = await lead().patch(`/api/sessions/${session.id}`).send({});
    expectStatus(empty, 400);
    expect(empty.body.error.field).not.toBe('(patch)');
    expect(empty.body.error.message).not.toMatch(/\(patch\)/);
    const array = await lead().patch(`/api/sessions/${session.id}`).send([1, 2]);
    expectStatus(array, 400);
    expect(array.body.error.field).not.toBe('(patch)');
    expect(array.body.error.message).not.toMatch(/\(patch\)/);
  });

  it('archiving hides a session from the default list; ?archived=true shows it; restoring brings it back', async () => {
    const session = await newSession();
    const ids = async (query = '') => (await lead().get(`/api/studios/${studioId}/sessions${query}`)).body.sessions.map((s: { id: string }) => s.id);
    expect(await ids()).toContain(session.id);
    const archived = await lead().patch(`/api/sessions/${session.id}`).send({ archived: true });
    expectStatus(archived, 200);
    expect(archived.body.session.archived).toBe(true);
    expect(await ids()).not.toContain(session.id);
    expect(await ids('?archived=true')).toContain(session.id);
    const listed = (await lead().get(`/api/studios/${studioId}/sessions?archived=true`)).body.sessions.find((s: { id: string }) => s.id === session.id);
    expect(listed).toMatchObject({ archived: true, name: session.name });
    expect(listed.patch).toBeUndefined();
    expectStatus(await lead().patch(`/api/sessions/${session.id}`).send({ archived: false }), 200);
    expect(await ids()).toContain(session.id);
  });
});

describe('listing sessions', () => {
  it('lists newest first, without patches', async () => {
    const studio = await lead().post('/api/studios').send({ name: 'Saltglass Reach sketches' });
    expectStatus(studio, 201);
    const sketchesId = studio.body.studio.id;
    const made: string[] = [];
    for (const name of ['Pier bell', 'Net winch', 'Gull wire']) {
      const response = await createSession({ name }, sketchesId);
      expectStatus(response, 201);
      made.push(response.body.session.id);
    }
    // Timestamps have whole-second resolution; give each session its own update time.
    const stamps = ['2026-11-02 10:00:00', '2026-11-03 10:00:00', '2026-11-01 10:00:00'];
    for (const [index, id] of made.entries()) await server.dataSource.query('UPDATE sessions SET "updatedAt" = ? WHERE id = ?', [stamps[index], id]);
    const response = await lead().get(`/api/studios/${sketchesId}/sessions`);
    expectStatus(response, 200);
    expect(response.body.sessions.map((s: { name: string }) => s.name)).toEqual(['Net winch', 'Pier bell', 'Gull wire']);
    for (const session of response.body.sessions) expect(session.patch).toBeUndefined();
  });
});

describe('load-preset copies', () => {
  it('the session gets a copy: editing the preset afterwards leaves the session, and editing the session leaves the preset', async () => {
    const preset = await newPreset({ patch: factoryPatch('lantern-room-harp.json') });
    const session = await newSession();
    const loaded = await lead().post(`/api/sessions/${session.id}/load-preset`).send({ presetId: preset.id });
    expectStatus(loaded, 200);
    expect(loaded.body.session.patch).toEqual(preset.patch);
    const sessionPatch = (await getSession(session.id)).patch;
    expect(sessionPatch).toEqual(preset.patch);

    const presetEdit = testPatch({ name: 'Harp, retuned', string: { lengthM: 0.65, tensionN: 95, linearDensityKgPerM: 6e-4, inharmonicityB: 0 } });
    expectStatus(await lead().patch(`/api/presets/${preset.id}`).send({ patch: presetEdit }), 200);
    expect((await getPreset(preset.id)).patch.string.tensionN).toBe(95);
    expect((await getSession(session.id)).patch).toEqual(sessionPatch);

    const presetNow = await getPreset(preset.id);
    const sessionEdit = testPatch({ name: 'Session only', damping: { b1PerS: 3, b2M2PerS: 1e-3 } });
    expectStatus(await lead().patch(`/api/sessions/${session.id}`).send({ patch: sessionEdit }), 200);
    expect(await getPreset(preset.id)).toEqual(presetNow);
  });

  it('an unknown preset: 404, session unchanged; a missing presetId: 400', async () => {
    const session = await newSession();
    const before = await getSession(session.id);
    const unknown = await lead().post(`/api/sessions/${session.id}/load-preset`).send({ presetId: '00000000-0000-4000-8000-000000000000' });
    expectStatus(unknown, 404);
    expect(unknown.body.error.code).toBe('not_found');
    const missing = await lead().post(`/api/sessions/${session.id}/load-preset`).send({});
    expectStatus(missing, 400);
    expect(missing.body.error.field).toBe('presetId');
    expect(await getSession(session.id)).toEqual(before);
  });
});

describe('saving presets', () => {
  it('from a patch: 201, version 1, tags lower-cased and de-duplicated, patch named after the preset', async () => {
    const response = await lead()
      .post(`/api/studios/${studioId}/presets`)
      .send({ name: 'Gull wire shimmer', tags: ['Steel', 'steel', ' bright '], description: 'High shimmer over the harbour', patch: testPatch({ name: 'Whatever' }) });
    expectStatus(response, 201);
    expect(response.body.preset).toMatchObject({
      name: 'Gull wire shimmer',
      tags: ['steel', 'bright'],
      description: 'High shimmer over the harbour',
      version: 1,
      author: { displayName: 'Wren Halloway' },
      patch: { ...validated(testPatch()), name: 'Gull wire shimmer' },
    });
  });

  it('from a session: the session patch under the preset name, and it outlives the session', async () => {
    const session = await newSession({ patch: factoryPatch('tidepool-hammer-wire.json') });
    const response = await lead().post(`/api/studios/${studioId}/presets`).send({ name: 'Tidepool hammer, kept', sessionId: session.id });
    expectStatus(response, 201);
    expect(response.body.preset.patch).toEqual({ ...session.patch, name: 'Tidepool hammer, kept' });
    expectStatus(await lead().delete(`/api/sessions/${session.id}`), 204);
    expect((await getPreset(response.body.preset.id)).patch).toEqual({ ...session.patch, name: 'Tidepool hammer, kept' });
  });

  it('with both a patch and a sessionId, or neither: 400, no row', async () => {
    const session = await newSession();
    const before = await counts();
    for (const body of [{ name: 'Both', patch: testPatch(), sessionId: session.id }, { name: 'Neither' }]) {
      const response = await lead().post(`/api/studios/${studioId}/presets`).send(body);
      expectStatus(response, 400);
      expect(response.body.error.message).toMatch(/must give either a patch or a sessionId/);
    }
    expect(await counts()).toEqual(before);
  });

  it('with a bad patch: 422 naming patch.…, no row', async () => {
    const before = await counts();
    const response = await lead()
      .post(`/api/studios/${studioId}/presets`)
      .send({ name: 'Bad', patch: testPatch({ render: { sampleRateHz: 22050, durationS: 1, maxModes: 4096 } }) });
    expectStatus(response, 422);
    expect(response.body.error.field).toBe('patch.render.sampleRateHz');
    expect(await counts()).toEqual(before);
  });
});

describe('preset versions', () => {
  it('goes 1 → 2 when the patch changes, not when only tags, name or description change', async () => {
    const preset = await newPreset();
    expect(preset.version).toBe(1);
    const tags = await lead().patch(`/api/presets/${preset.id}`).send({ tags: ['steel', 'warm'] });
    expectStatus(tags, 200);
    expect(tags.body.preset).toMatchObject({ version: 1, tags: ['steel', 'warm'] });
    const words = await lead().patch(`/api/presets/${preset.id}`).send({ name: 'Lamp wire, warm', description: 'Softer' });
    expectStatus(words, 200);
    expect(words.body.preset).toMatchObject({ version: 1, name: 'Lamp wire, warm', description: 'Softer' });
    expect(words.body.preset.patch.name).toBe('Lamp wire, warm');

    const patch = testPatch({ damping: { b1PerS: 0.9, b2M2PerS: 1e-4 } });
    const changed = await lead().patch(`/api/presets/${preset.id}`).send({ patch });
    expectStatus(changed, 200);
    expect(changed.body.preset.version).toBe(2);
    expect(changed.body.preset.patch).toEqual({ ...validated(patch), name: 'Lamp wire, warm' });
    expect((await getPreset(preset.id)).version).toBe(2);
  });

  it('stays put when a save sends the unchanged patch back along with new tags', async () => {
    // An edit form that always sends the whole preset must not raise the version for a tag edit.
    const preset = await newPreset();
    const response = await lead().patch(`/api/presets/${preset.id}`).send({ tags: ['steel', 'lamp'], patch: preset.patch });
    expectStatus(response, 200);
    expect(response.body.preset.tags).toEqual(['steel', 'lamp']);
    expect(response.body.preset.version).toBe(1);
  });

  it('a bad patch: 422, the preset (and its version) unchanged', async () => {
    const preset = await newPreset();
    const before = await getPreset(preset.id);
    const response = await lead().patch(`/api/presets/${preset.id}`).send({ tags: ['x'], patch: { ...testPatch(), damping: { b1PerS: -1, b2M2PerS: 0 } } });
    expectStatus(response, 422);
    expect(response.body.error).toMatchObject({ field: 'patch.damping.b1PerS', message: 'patch.damping.b1PerS must be >= 0, got -1' });
    expect(await getPreset(preset.id)).toEqual(before);
  });

  it('an empty body: 400, unchanged', async () => {
    const preset = await newPreset();
    const before = await getPreset(preset.id);
    const response = await lead().patch(`/api/presets/${preset.id}`).send({});
    expectStatus(response, 400);
    expect(await getPreset(preset.id)).toEqual(before);
  });
});

describe('listing presets', () => {
  let libraryId: string;
  let secondLeadToken: string;
  const names = (response: Response) => response.body.presets.map((p: { name: string }) => p.name);

  beforeAll(async () => {
    const studio = await lead().post('/api/studios').send({ name: 'Saltglass Reach library' });
    expectStatus(studio, 201);
    libraryId = studio.body.studio.id;
    // A new studio starts with the factory presets; these listings are about five presets of their own.
    for (const factory of (await lead().get(`/api/studios/${libraryId}/presets`)).body.presets) expectStatus(await lead().delete(`/api/presets/${factory.id}`), 204);
    // A second lead, so that presets have two authors.
    const email = 'ansel.brack@kestrel-lantern.test';
    expectStatus(await lead().post(`/api/studios/${libraryId}/invitations`).send({ email, role: 'lead' }), 201);
    const mail = await server.mailbox.waitFor(email);
    const token = new URL(mail.links[0]).searchParams.get('token');
    const accepted = await request(server.app).post('/api/invitations/accept').send({ token, displayName: 'Ansel Brack', password: TEST_PASSWORD });
    expectStatus(accepted, 200);
    secondLeadToken = accepted.body.token;

    const save = (token: string, name: string, tags: string[], description = '') =>
      as(server.app, token).post(`/api/studios/${libraryId}/presets`).send({ name, tags, description, patch: testPatch({ name }) });
    const made = [
      await save(leadToken, 'Mooring cable drone', ['steel', 'drone']),
      await save(secondLeadToken, 'Kelp line nylon', ['nylon', 'pluck'], 'Soft pluck for the kelp forest'),
      await save(leadToken, 'Breakwater bass', ['wound', 'bass', 'pluck']),
      await save(secondLeadToken, 'Rope locker mute', ['nylon', 'muted']),
      await save(leadToken, '100% wet quill', ['steel']),
    ];
    for (const response of made) expectStatus(response, 201);
    // Timestamps have whole-second resolution; give each preset its own update time so `date` has an order to show.
    const stamps = ['2026-11-03 09:00:00', '2026-11-01 09:00:00', '2026-11-05 09:00:00', '2026-11-02 09:00:00', '2026-11-04 09:00:00'];
    for (const [index, response] of made.entries()) {
      await server.dataSource.query('UPDATE presets SET "updatedAt" = ? WHERE id = ?', [stamps[index], response.body.preset.id]);
    }
  });

  const list = (query: string) => lead().get(`/api/studios/${libraryId}/presets${query}`);

  it('sorts by name by default, and lists no patches', async () => {
    const response = await list('');
    expectStatus(response, 200);
    expect(names(response)).toEqual(['100% wet quill', 'Breakwater bass', 'Kelp line nylon', 'Mooring cable drone', 'Rope locker mute']);
    expect(response.body.presets[0].patch).toBeUndefined();
    expect(names(await list('?sort=name'))).toEqual(names(response));
  });

  it('sort=date: most recently updated first', async () => {
    const response = await list('?sort=date');
    expectStatus(response, 200);
    expect(names(response)).toEqual(['Breakwater bass', '100% wet quill', 'Mooring cable drone', 'Rope locker mute', 'Kelp line nylon']);
  });

  it('sort=author: by author name, then by preset name', async () => {
    const response = await list('?sort=author');
    expectStatus(response, 200);
    expect(names(response)).toEqual(['Kelp line nylon', 'Rope locker mute', '100% wet quill', 'Breakwater bass', 'Mooring cable drone']);
    expect(response.body.presets.map((p: { author: { displayName: string } }) => p.author.displayName)).toEqual([
      'Ansel Brack',
      'Ansel Brack',
      'Wren Halloway',
      'Wren Halloway',
      'Wren Halloway',
    ]);
  });

  it('q searches names (and descriptions), case-insensitively; % and _ are literal', async () => {
    expect(names(await list('?q=LINE'))).toEqual(['Kelp line nylon']);
    expect(names(await list('?q=kelp%20forest'))).toEqual(['Kelp line nylon']);
    expect(names(await list('?q=o'))).toEqual(['Kelp line nylon', 'Mooring cable drone', 'Rope locker mute']);
    expect(names(await list(`?q=${encodeURIComponent('%')}`))).toEqual(['100% wet quill']);
    expect(names(await list('?q=_'))).toEqual([]);
    expect(names(await list('?q=zzz'))).toEqual([]);
  });

  it('tag filters on one tag, case-folded, and combines with q and sort', async () => {
    expect(names(await list('?tag=pluck'))).toEqual(['Breakwater bass', 'Kelp line nylon']);
    expect(names(await list('?tag=NYLON&sort=date'))).toEqual(['Rope locker mute', 'Kelp line nylon']);
    expect(names(await list('?tag=steel&q=drone'))).toEqual(['Mooring cable drone']);
    expect(names(await list('?tag=brass'))).toEqual([]);
  });

  it('sort=bogus: 400 naming sort', async () => {
    const response = await list('?sort=bogus');
    expectStatus(response, 400);
    expect(response.body.error).toMatchObject({ code: 'invalid', field: 'sort' });
    expect(response.body.error.message).toMatch(/^sort must be one of name, date, author/);
  });
});

describe('uploading a patch file', () => {
  it('a valid file: 201, named from the patch, tags from the comma-separated form field', async () => {
    const before = await rowCount(server.dataSource, 'presets');
    const response = await upload(JSON.stringify(testPatch({ name: 'Gull wire, uploaded' })), { tags: 'Steel, bright ,, pluck' });
    expectStatus(response, 201);
    expect(response.body.preset).toMatchObject({ name: 'Gull wire, uploaded', tags: ['steel', 'bright', 'pluck'], version: 1 });
    expect(response.body.preset.patch).toEqual(validated(testPatch({ name: 'Gull wire, uploaded' })));
    expect(await rowCount(server.dataSource, 'presets')).toBe(before + 1);
  });

  it('a name form field wins over the patch name; the description comes from the file', async () => {
    const file = factoryPatch('quayside-lamp-wire.json');
    const response = await upload(JSON.stringify(file), { name: 'Lamp wire (studio copy)' }, 'quayside-lamp-wire.json');
    expectStatus(response, 201);
    expect(response.body.preset.name).toBe('Lamp wire (studio copy)');
    expect(response.body.preset.patch.name).toBe('Lamp wire (studio copy)');
    expect(response.body.preset.description).toBe(file.description);
  });

  it('a downloaded preset uploads again with its tags (no tags form field sent)', async () => {
    const original = await newPreset({ tags: ['steel', 'lamp'], description: 'Quay lamps humming in the wind' });
    const download = await lead().get(`/api/presets/${original.id}/download`);
    expectStatus(download, 200);
    const response = await upload(download.text);
    expectStatus(response, 201);
    expect(response.body.preset).toMatchObject({ name: original.name, description: 'Quay lamps humming in the wind', tags: ['steel', 'lamp'] });
  });

  it("a downloaded preset uploads again with the same patch: the file's tags and description stay out of it", async () => {
    const original = await newPreset({ tags: ['steel', 'lamp'], description: 'Quay lamps humming in the wind' });
    const download = await lead().get(`/api/presets/${original.id}/download`);
    expectStatus(download, 200);
    const response = await upload(download.text, { tags: 'steel, lamp' });
    expectStatus(response, 201);
    expect(response.body.preset.patch).toEqual(original.patch);
  });

  it('a file exactly LIMITS.maxPatchFileBytes long is accepted (the command line reads it too)', async () => {
    const text = JSON.stringify(testPatch({ name: 'Padded to the limit' }));
    const padded = Buffer.from(text.padEnd(LIMITS.maxPatchFileBytes, ' '));
    expect(padded.length).toBe(LIMITS.maxPatchFileBytes);
    const response = await upload(padded);
    expectStatus(response, 201);
    expect(response.body.preset.name).toBe('Padded to the limit');
  });

  it('a valid patch file with a long name (allowed by the patch schema) is not refused for a `name` field nobody sent', async () => {
    // Patch names may be LIMITS.maxNameLength long; preset names LIMITS.maxLabelLength. A session takes this patch.
    const longName = `Saltglass Reach, act two: ${'the long winch cable under the lighthouse '.repeat(4)}`.slice(0, LIMITS.maxNameLength);
    expect(longName.length).toBeGreaterThan(LIMITS.maxLabelLength);
    expectStatus(await createSession({ name: 'Long-named patch', patch: testPatch({ name: longName }) }), 201);
    const response = await upload(JSON.stringify(testPatch({ name: longName })));
    const blamed = response.body.error?.field ?? null;
    expect(response.status === 201 || /^file\b/.test(String(blamed)), `${response.status} ${JSON.stringify(response.body)}`).toBe(true);
  });

  describe('refused uploads add no row', () => {
    let before: number;
    beforeAll(async () => {
      before = await rowCount(server.dataSource, 'presets');
    });

    it('a file that is not JSON: 400 naming file', async () => {
      const response = await upload('{"name": "Half a patch", "string": {', {}, 'half.json');
      expectStatus(response, 400);
      expect(response.body.error.code).toBe('invalid');
      expect(response.body.error.field).toBe('file');
      expect(response.body.error.message).toMatch(/^file half\.json is not valid JSON/);
      expect(await rowCount(server.dataSource, 'presets')).toBe(before);
    });

    it('a file with a bad patch: 422 naming file.…', async () => {
      const bad = testPatch({ string: { lengthM: 0.65, tensionN: -5, linearDensityKgPerM: 6e-4, inharmonicityB: 0 } });
      const response = await upload(JSON.stringify(bad));
      expectStatus(response, 422);
      expect(response.body.error).toMatchObject({ code: 'invalid_patch', field: 'file.string.tensionN', message: 'file.string.tensionN must be > 0, got -5' });
      const notAnObject = await upload('[1, 2, 3]');
      expectStatus(notAnObject, 422);
      expect(notAnObject.body.error.field).toMatch(/^file/);
      expect(await rowCount(server.dataSource, 'presets')).toBe(before);
    });

    it('no file: 400 naming file', async () => {
      const multipart = await lead().post(`/api/studios/${studioId}/presets/upload`).field('name', 'Nothing attached');
      expectStatus(multipart, 400);
      expect(multipart.body.error.field).toBe('file');
      const json = await lead().post(`/api/studios/${studioId}/presets/upload`).send({ name: 'JSON instead' });
      expectStatus(json, 400);
      expect(json.body.error.field).toBe('file');
      expect(await rowCount(server.dataSource, 'presets')).toBe(before);
    });

    it('a file one byte over LIMITS.maxPatchFileBytes: 413', async () => {
      const text = JSON.stringify(testPatch({ name: 'Too big' }));
      const response = await upload(Buffer.from(text.padEnd(LIMITS.maxPatchFileBytes + 1, ' ')));
      expectStatus(response, 413);
      expect(response.body.error).toMatchObject({ code: 'too_large', field: 'file' });
      expect(await rowCount(server.dataSource, 'presets')).toBe(before);
    });

    it('a file under another form field name: 400', async () => {
      const response = await lead()
        .post(`/api/studios/${studioId}/presets/upload`)
        .attach('patch', Buffer.from(JSON.stringify(testPatch())), 'x.json');
      expectStatus(response, 400);
      expect(response.body.error.code).toBe('invalid');
      expect(await rowCount(server.dataSource, 'presets')).toBe(before);
    });
  });
});

describe('downloading a preset', () => {
  it('sends the patch JSON as an attachment that passes validatePatch', async () => {
    const preset = await newPreset({ name: 'Lantern room harp / v2', tags: ['harp', 'nylon'], description: 'For the lantern room', patch: factoryPatch('lantern-room-harp.json') });
    const response = await lead().get(`/api/presets/${preset.id}/download`);
    expectStatus(response, 200);
    expect(response.headers['content-type']).toMatch(/^application\/json/);
    expect(response.headers['content-disposition']).toMatch(/^attachment; filename="?Lantern-room-harp-v2\.json"?$/);
    const file = JSON.parse(response.text);
    const check = validatePatch(file);
    expect(check.ok).toBe(true);
    expect(file).toEqual({ ...preset.patch, tags: ['harp', 'nylon'], description: 'For the lantern room' });
    if (check.ok) expect(check.value.string).toEqual(preset.patch.string);
  });

  it('keeps the letters of a name with accents in the file name', async () => {
    const preset = await newPreset({ name: 'Écume – ölige Saite' });
    const response = await lead().get(`/api/presets/${preset.id}/download`);
    expectStatus(response, 200);
    const header = String(response.headers['content-disposition']);
    const encoded = /filename\*=UTF-8''([^;]+)/i.exec(header)?.[1];
    const fileName = encoded ? decodeURIComponent(encoded) : /filename="?([^";]+)"?/.exec(header)?.[1];
    expect(fileName, header).toMatch(/^[ÉE]cume-[öo]lige-Saite\.json$/);
  });

  it('an unknown preset: 404', async () => {
    const response = await lead().get('/api/presets/00000000-0000-4000-8000-000000000000/download');
    expectStatus(response, 404);
    expect(response.body.error.code).toBe('not_found');
  });
});

describe('POST /api/patches/validate', () => {
  it('a good patch: {ok: true, issues: []}', async () => {
    for (const patch of [testPatch(), factoryPatch('mooring-cable-drone.json'), defaultPatch()]) {
      const response = await lead().post('/api/patches/validate').send(patch);
      expectStatus(response, 200);
      expect(response.body).toEqual({ ok: true, issues: [] });
    }
  });

  it('a bad patch: ok false, with issues naming their fields; nothing saved', async () => {
    const before = await counts();
    const bad = { ...testPatch(), string: { lengthM: 0.65, tensionN: -5, linearDensityKgPerM: 6e-4 }, render: { sampleRateHz: 12345, durationS: 1, maxModes: 4096 } };
    const response = await lead().post('/api/patches/validate').send(bad);
    expectStatus(response, 200);
    expect(response.body.ok).toBe(false);
    const fields = response.body.issues.map((issue: { field: string }) => issue.field).sort();
    expect(fields).toEqual(['render.sampleRateHz', 'string.tensionN']);
    expect(response.body.issues.find((issue: { field: string }) => issue.field === 'string.tensionN')).toEqual({
      field: 'string.tensionN',
      problem: 'must be > 0',
      got: '-5',
      message: 'string.tensionN must be > 0, got -5',
    });
    expect(await counts()).toEqual(before);
  });

  it('a rule between fields: the polyline must end at lengthM', async () => {
    const response = await lead()
      .post('/api/patches/validate')
      .send(testPatch({ excitation: { displacementM: [[0, 0], [0.2, 0.003], [0.6, 0]] } }));
    expect(response.body.ok).toBe(false);
    expect(response.body.issues.map((issue: { field: string }) => issue.field)).toEqual(['excitation.displacementM[2][0]']);
  });

  it('requires a signed-in user', async () => {
    const response = await request(server.app).post('/api/patches/validate').send(testPatch());
    expectStatus(response, 401);
  });
});

describe('bodies that are too large or not JSON', () => {
  it('a JSON body over LIMITS.maxRequestBodyBytes: 413 too_large, nothing written', async () => {
    const session = await newSession();
    const before = { counts: await counts(), session: await getSession(session.id) };
    const huge = JSON.stringify({ name: 'Huge', patch: { ...testPatch(), notes: 'x'.repeat(LIMITS.maxRequestBodyBytes) } });
    expect(Buffer.byteLength(huge)).toBeGreaterThan(LIMITS.maxRequestBodyBytes);
    for (const send of [
      () => lead().post(`/api/studios/${studioId}/sessions`),
      () => lead().post(`/api/studios/${studioId}/presets`),
      () => lead().patch(`/api/sessions/${session.id}`),
    ]) {
      const response = await send().set('Content-Type', 'application/json').send(huge);
      expectStatus(response, 413);
      expect(response.body.error.code).toBe('too_large');
    }
    expect({ counts: await counts(), session: await getSession(session.id) }).toEqual(before);
  });

  it('invalid JSON text: 400, nothing written', async () => {
    const session = await newSession();
    const before = { counts: await counts(), session: await getSession(session.id) };
    for (const send of [
      () => lead().post(`/api/studios/${studioId}/sessions`),
      () => lead().post(`/api/studios/${studioId}/presets`),
      () => lead().patch(`/api/sessions/${session.id}`),
    ]) {
      const response = await send().set('Content-Type', 'application/json').send('{"name": "Unfinished", "patch": {');
      expectStatus(response, 400);
      expect(response.body.error).toMatchObject({ code: 'invalid', message: 'Request body is not valid JSON' });
    }
    expect({ counts: await counts(), session: await getSession(session.id) }).toEqual(before);
  });
});
