import { request as httpRequest } from 'node:http';
import { io as connectSocket } from 'socket.io-client';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ownOrigins } from '../../server/http/request-origin';
import { as, rowCount, startLiveTestServer, TEST_PASSWORD, type LiveTestServer } from '../support/test-server';
import { createStudioFixture, type StudioFixture } from '../support/studio-fixture';
import { websocketUpgradeStatus } from '../support/websocket-upgrade';

const FOREIGN = 'https://prank-pages.example';
let server: LiveTestServer;
let fixture: StudioFixture;

beforeAll(async () => {
  server = await startLiveTestServer();
  fixture = await createStudioFixture(server);
});
afterAll(() => server.close());

/** A websocket upgrade to the collaboration endpoint with the given Origin; how it ended (101 or the status). */
const collabUpgrade = (path: string, origin?: string) => websocketUpgradeStatus(`${server.baseUrl.replace('http', 'ws')}${path}`, { origin });

/** A socket.io connection over websocket only, with the given Origin: 'connected' or the error. */
function computeChannel(origin?: string): Promise<string> {
  return new Promise((resolve) => {
    const socket = connectSocket(server.baseUrl, {
      path: '/socket.io/',
      transports: ['websocket'],
      auth: { token: fixture.members.lead.token },
      extraHeaders: origin ? { Origin: origin } : {},
      reconnection: false,
    });
    socket.on('connect', () => {
      resolve('connected');
      socket.close();
    });
    socket.on('connect_error', (error) => {
      resolve(`refused: ${error.message}`);
      socket.close();
    });
  });
}

function pollingStatus(origin?: string): Promise<number> {
  return new Promise((resolve, reject) => {
    const outgoing = httpRequest(`${server.baseUrl}/socket.io/?EIO=4&transport=polling`, { headers: origin ? { Origin: origin } : {} }, (response) => {
      response.resume();
      resolve(response.statusCode ?? 0);
    });
    outgoing.on('error', reject);
    outgoing.end();
  });
}

describe('the app\'s own origins', () => {
  it('counts every loopback spelling of APP_URL\'s port as its own, plus ALLOWED_ORIGINS', () => {
    const origins = ownOrigins({ appUrl: 'http://localhost:41234', allowedOrigins: ['https://mix.kestrel-lantern.example'] });
    expect([...origins].sort()).toEqual(['http://127.0.0.1:41234', 'http://[::1]:41234', 'http://localhost:41234', 'https://mix.kestrel-lantern.example'].sort());
    expect([...ownOrigins({ appUrl: 'https://tautline.kestrel-lantern.example' })]).toEqual(['https://tautline.kestrel-lantern.example']);
  });
});

describe('state-changing requests with a foreign Origin', () => {
  it('refuses a cookie-carrying POST from another site with 403 naming the origin, and creates nothing', async () => {
    const login = await request(server.app).post('/api/auth/login').send({ email: fixture.members.lead.email, password: TEST_PASSWORD });
    const cookie = ([] as string[]).concat(login.headers['set-cookie'] ?? [])[0].split(';')[0];
    const before = await rowCount(server.dataSource, 'sessions');
    const refused = await request(server.app).post(`/api/studios/${fixture.studioId}/sessions`).set('Cookie', cookie).set('Origin', FOREIGN).send({ name: 'Planted session' });
    expect(refused.status).toBe(403);
    expect(refused.body.error.code).toBe('forbidden');
    expect(refused.body.error.message).toContain(FOREIGN);
    expect(refused.body.error.message).toContain('ALLOWED_ORIGINS');
    expect(await rowCount(server.dataSource, 'sessions')).toBe(before);
    const own = await request(server.app).post(`/api/studios/${fixture.studioId}/sessions`).set('Cookie', cookie).set('Origin', 'http://127.0.0.1:3000').send({ name: 'Own session' });
    expect(own.status).toBe(201);
  });

  it.each(['PATCH', 'DELETE'] as const)('refuses %s from another site', async (method) => {
    const test = method === 'PATCH' ? request(server.app).patch('/api/me') : request(server.app).delete('/api/me');
    const refused = await test.set('Authorization', `Bearer ${fixture.members.listener.token}`).set('Origin', FOREIGN).send({ displayName: 'Renamed', password: TEST_PASSWORD });
    expect(refused.status).toBe(403);
    expect((await as(server.app, fixture.members.listener.token).get('/api/me')).status).toBe(200);
  });

  it('refuses Origin: null (sandboxed frames)', async () => {
    expect((await request(server.app).post('/api/auth/login').set('Origin', 'null').send({ email: 'a@b.example', password: 'x' })).status).toBe(403);
  });

  it('lets requests without Origin (scripts, curl) and from the app\'s own pages through', async () => {
    expect((await request(server.app).post('/api/auth/login').send({ email: fixture.members.lead.email, password: TEST_PASSWORD })).status).toBe(200);
    for (const origin of ['http://localhost:3000', 'http://127.0.0.1:3000']) {
      expect((await request(server.app).post('/api/auth/login').set('Origin', origin).send({ email: fixture.members.lead.email, password: TEST_PASSWORD })).status).toBe(200);
    }
  });

  it('accepts an origin listed in ALLOWED_ORIGINS', async () => {
    server.context.config.allowedOrigins = [FOREIGN];
    try {
      expect((await request(server.app).post('/api/auth/login').set('Origin', FOREIGN).send({ email: fixture.members.lead.email, password: TEST_PASSWORD })).status).toBe(200);
    } finally {
      server.context.config.allowedOrigins = [];
    }
  });

  it('still answers reads from another site (the browser keeps the answer from that page without CORS headers)', async () => {
    expect((await request(server.app).get('/api/health').set('Origin', FOREIGN)).status).toBe(200);
  });
});

describe('websocket upgrades with a foreign Origin', () => {
  const documentPath = () => `/collab/${fixture.sessionId}?token=${fixture.members.lead.token}`;

  it('refuses the collaboration upgrade (403) and opens it for the app\'s own origin or none', async () => {
    expect(await collabUpgrade(documentPath(), FOREIGN)).toBe(403);
    expect(await collabUpgrade(documentPath(), 'http://localhost:3000')).toBe(101);
    expect(await collabUpgrade(documentPath())).toBe(101);
  });

  it('refuses the socket.io compute channel, over websocket and long-polling alike', async () => {
    expect(await computeChannel(FOREIGN)).toMatch(/^refused/);
    expect(await computeChannel('http://127.0.0.1:3000')).toBe('connected');
    expect(await computeChannel()).toBe('connected');
    expect(await pollingStatus(FOREIGN)).toBe(403);
    expect(await pollingStatus()).toBe(200);
  });
});

describe('a broken percent-encoding in the document path', () => {
  it('answers 400, not 500', async () => {
    expect(await collabUpgrade(`/collab/%E0%A4%A?token=${fixture.members.lead.token}`)).toBe(400);
    expect(await collabUpgrade(`/collab/%E0%A4%A`)).toBe(400);
  });
});
