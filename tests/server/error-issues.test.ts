import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ApiErrorBody } from '../../shared/api/error-body';
import { defaultPatch } from '../../shared/patch/default-patch';
import { as, registerUser, rowCount, startTestServer, TEST_PASSWORD, type TestServer } from '../support/test-server';

/**
 * Every 400 and 422 body lists its field problems under `issues`, a single problem too, so a
 * client never has to read fields out of the message. `field` and `message` repeat the first.
 */
let server: TestServer;
let token: string;
let studioId: string;

beforeAll(async () => {
  server = await startTestServer();
  token = (await registerUser(server.app, 'ines.varga@kestrel-lantern.test', 'Ines Varga')).token;
  studioId = (await as(server.app, token).post('/api/studios').send({ name: 'Kestrel Lantern Audio' })).body.studio.id;
});
afterAll(() => server.close());

/** The body's issues, checked to agree with its top-level field and message. */
function issuesOf(body: ApiErrorBody) {
  const { issues, field, message } = body.error;
  expect(Array.isArray(issues)).toBe(true);
  expect(issues!.length).toBeGreaterThanOrEqual(1);
  expect(issues![0].field).toBe(field);
  expect(message.startsWith(issues![0].message)).toBe(true);
  return issues!;
}

describe('error bodies always carry their issues', () => {
  it('register with a malformed e-mail: 400 with one issue naming email, no account created', async () => {
    const before = await rowCount(server.dataSource, 'users');
    const response = await request(server.app).post('/api/auth/register').send({ email: 'not-an-address', password: TEST_PASSWORD, displayName: 'Odile' });
    expect(response.status).toBe(400);
    const issues = issuesOf(response.body);
    expect(issues).toHaveLength(1);
    expect(issues[0]).toMatchObject({ field: 'email', got: '"not-an-address"' });
    expect(issues[0].message).toBe(`email ${issues[0].problem}, got "not-an-address"`);
    expect(await rowCount(server.dataSource, 'users')).toBe(before);
  });

  it('a weak password (checked outside zod): 400 with one issue whose problem is bare', async () => {
    const response = await request(server.app).post('/api/auth/register').send({ email: 'odile@kestrel-lantern.test', password: 'harbour', displayName: 'Odile' });
    expect(response.status).toBe(400);
    expect(issuesOf(response.body)).toEqual([{ field: 'password', problem: 'must be at least 10 characters', got: null, message: 'password must be at least 10 characters' }]);
  });

  it('a route that blames a field with its own words (wrong current password): the issue keeps the bare problem', async () => {
    const response = await as(server.app, token).post('/api/me/password').send({ currentPassword: 'not-the-password-9', newPassword: 'another-quiet-pier-7' });
    expect(response.status).toBe(400);
    expect(issuesOf(response.body)).toEqual([{ field: 'currentPassword', problem: 'is wrong', got: null, message: 'currentPassword is wrong' }]);
  });

  it('create a session with one bad patch field: 422 with one issue under patch.…, no session stored', async () => {
    const before = await rowCount(server.dataSource, 'sessions');
    const patch = defaultPatch('Saltglass Reach: slack line');
    const response = await as(server.app, token)
      .post(`/api/studios/${studioId}/sessions`)
      .send({ name: 'Slack line', patch: { ...patch, string: { ...patch.string, tensionN: -5 } } });
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('invalid_patch');
    expect(issuesOf(response.body)).toEqual([{ field: 'patch.string.tensionN', problem: 'must be > 0', got: '-5', message: 'patch.string.tensionN must be > 0, got -5' }]);
    expect(await rowCount(server.dataSource, 'sessions')).toBe(before);
  });

  it('upload of a file that is not JSON, and of no file at all: 400 with one issue naming file', async () => {
    const before = await rowCount(server.dataSource, 'presets');
    const broken = await as(server.app, token).post(`/api/studios/${studioId}/presets/upload`).attach('file', Buffer.from('{"name": "Half'), 'half.json');
    expect(broken.status).toBe(400);
    const [issue] = issuesOf(broken.body);
    expect(issue.field).toBe('file');
    expect(issue.message).toMatch(/^file half\.json is not valid JSON/);
    const missing = await as(server.app, token).post(`/api/studios/${studioId}/presets/upload`).field('name', 'Nothing attached');
    expect(missing.status).toBe(400);
    expect(issuesOf(missing.body)).toEqual([{ field: 'file', problem: 'is required: attach a patch JSON file', got: null, message: 'file is required: attach a patch JSON file' }]);
    expect(await rowCount(server.dataSource, 'presets')).toBe(before);
  });

  it('a body that is not JSON at all blames body', async () => {
    const response = await as(server.app, token).post('/api/studios').set('Content-Type', 'application/json').send('{"name": ');
    expect(response.status).toBe(400);
    expect(issuesOf(response.body)).toEqual([{ field: 'body', problem: 'Request body is not valid JSON', got: null, message: 'Request body is not valid JSON' }]);
  });

  it('several problems are all listed, the first repeated at the top', async () => {
    const response = await request(server.app).post('/api/auth/register').send({ email: 'nope', password: 'short', displayName: '' });
    expect(response.status).toBe(400);
    const fields = issuesOf(response.body).map((issue) => issue.field);
    expect(fields).toEqual(expect.arrayContaining(['email', 'displayName']));
    expect(response.body.error.message).toMatch(/\(and \d+ more\)$/);
  });

  it('a 404 or 403 without a field carries no issues', async () => {
    const response = await as(server.app, token).get('/api/sessions/no-such-session');
    expect(response.status).toBe(404);
    expect(response.body.error.issues).toBeUndefined();
    expect(response.body.error.field).toBeUndefined();
  });
});
