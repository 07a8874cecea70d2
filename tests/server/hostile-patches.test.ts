import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { LIMITS } from '../../shared/limits';
import { testPatch } from '../support/patches';
import { as, registerUser, rowCount, startTestServer, type TestServer } from '../support/test-server';

/**
 * Patches built to hurt the server: pass-through fields nested thousands of levels deep (they once
 * overflowed the database layer's stack: a 500 after the live document had already changed) and
 * oversized notes. Every route that takes a patch must answer 422 (the API's answer to an invalid patch) naming the field and change nothing.
 */

let server: TestServer;
let token: string;
let studioId: string;
let sessionId: string;
let presetId: string;

function nested(levels: number): unknown {
  let value: unknown = 'bottom';
  for (let i = 0; i < levels; i++) value = { a: value };
  return value;
}

const deepPatch = () => ({ ...testPatch({ name: 'Fence wire, hostile' }), design: nested(2300) });
const hugePatch = () => ({ ...testPatch({ name: 'Fence wire, hostile' }), design: { notes: 'x'.repeat(LIMITS.maxPassThroughBytes + 10) } });

async function snapshot() {
  const session = (await as(server.app, token).get(`/api/sessions/${sessionId}`)).body.session;
  const preset = (await as(server.app, token).get(`/api/presets/${presetId}`)).body.preset;
  return { session, preset, sessions: await rowCount(server.dataSource, 'sessions'), presets: await rowCount(server.dataSource, 'presets') };
}

beforeAll(async () => {
  server = await startTestServer();
  token = (await registerUser(server.app, 'ines.varga@kestrel-lantern.test', 'Ines Varga')).token;
  studioId = (await as(server.app, token).post('/api/studios').send({ name: 'Kestrel Lantern Audio' })).body.studio.id;
  sessionId = (await as(server.app, token).post(`/api/studios/${studioId}/sessions`).send({ name: 'Breakwater fence', patch: testPatch() })).body.session.id;
  presetId = (await as(server.app, token).post(`/api/studios/${studioId}/presets`).send({ name: 'Breakwater fence', tags: ['wire'], patch: testPatch() })).body.preset.id;
});

afterAll(async () => {
  await server?.close();
});

describe.each([
  ['nested 2,300 levels deep', deepPatch, 'nested too deep'],
  ['with notes past the size limit', hugePatch, 'KiB'],
])('a patch %s', (_label, makePatch, words) => {
  const requests: Array<[string, () => ReturnType<ReturnType<typeof as>['post']>]> = [
    ['create a session', () => as(server.app, token).post(`/api/studios/${studioId}/sessions`).send({ name: 'Hostile', patch: makePatch() })],
    ['update a session', () => as(server.app, token).patch(`/api/sessions/${sessionId}`).send({ patch: makePatch() })],
    ['create a preset', () => as(server.app, token).post(`/api/studios/${studioId}/presets`).send({ name: 'Hostile', tags: [], patch: makePatch() })],
    ['update a preset', () => as(server.app, token).patch(`/api/presets/${presetId}`).send({ patch: makePatch() })],
    ['upload a patch file', () => as(server.app, token).post(`/api/studios/${studioId}/presets/upload`).attach('file', Buffer.from(JSON.stringify(makePatch())), 'hostile.json')],
  ];
  it.each(requests)('is refused with 422 naming the field when people %s, and nothing changes', async (_what, send) => {
    const before = await snapshot();
    const response = await send();
    expect(response.status, JSON.stringify(response.body).slice(0, 300)).toBe(422);
    expect(response.body.error.message).toContain('design');
    expect(response.body.error.message).toContain(words);
    expect(await snapshot()).toEqual(before);
  });
});
