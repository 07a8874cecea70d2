import { createServer, type Server } from 'node:net';
import jwt from 'jsonwebtoken';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { AccessChange } from '../../server/access/access-events';
import { createSmtpMailer } from '../../server/mail/mailer';
import { REGISTER_REFUSED } from '../../server/routes/auth-routes';
import { LIMITS } from '../../shared/limits';
import { as, registerUser, rowCount, startLiveTestServer, startTestServer, TEST_PASSWORD, type LiveTestServer, type TestServer } from '../support/test-server';
import { createStudioFixture } from '../support/studio-fixture';
import { websocketUpgradeStatus } from '../support/websocket-upgrade';

let server: TestServer;
beforeAll(async () => {
  server = await startTestServer({
    accountRateLimits: { signInFailures: { windowS: 60, limit: 3 }, passwordChecks: { windowS: 60, limit: 3 } },
  });
});
afterAll(() => server.close());

/** An SMTP "server" that accepts connections and never says a word: a send to it never completes. */
async function silentSmtpServer(): Promise<{ url: string; close: () => Promise<void> }> {
  const sockets = new Set<import('node:net').Socket>();
  const silent: Server = createServer((socket) => {
    sockets.add(socket);
    socket.on('error', () => undefined);
  });
  await new Promise<void>((resolve) => silent.listen(0, '127.0.0.1', resolve));
  const { port } = silent.address() as { port: number };
  return {
    url: `smtp://127.0.0.1:${port}`,
    close: () => {
      for (const socket of sockets) socket.destroy();
      return new Promise((resolve) => silent.close(() => resolve()));
    },
  };
}

/** Everything of an answer a client could compare, except the parts that differ by time or request count alone. */
function comparable(response: request.Response) {
  const headers = Object.fromEntries(Object.entries(response.headers).filter(([name]) => !['date', 'ratelimit', 'ratelimit-policy', 'connection', 'keep-alive'].includes(name)));
  return { status: response.status, headers, text: response.text };
}

describe('password reset answers before anything depends on the address', () => {
  it('answers 202 while the mail server hangs, and the mail follows after the answer', async () => {
    await registerUser(server.app, 'ossian@saltglass.example', 'Ossian Vale');
    const silent = await silentSmtpServer();
    const realMailer = server.context.mailer;
    const hanging = createSmtpMailer(silent.url, 'Tautline <no-reply@tautline.test>');
    server.context.mailer = hanging;
    try {
      // Before the fix the handler awaited the SMTP conversation, so this request never came back while the server was silent.
      const answered = await request(server.app).post('/api/auth/password-reset').send({ email: 'ossian@saltglass.example' }).timeout(10_000);
      expect(answered.status).toBe(202);
    } finally {
      server.context.mailer = realMailer;
      hanging.close();
      await silent.close();
    }
    // With the mail server answering again, a reset's mail reaches the mailbox only after its answer was received.
    const since = Date.now();
    const answered = await request(server.app).post('/api/auth/password-reset').send({ email: 'ossian@saltglass.example' });
    const answeredAt = Date.now();
    const mail = await server.mailbox.waitFor('ossian@saltglass.example', since);
    expect(answered.status).toBe(202);
    expect(Date.parse(mail.receivedAt)).toBeGreaterThanOrEqual(answeredAt - 1);
  });

  it('gives byte-identical answers for a known and an unknown address', async () => {
    await registerUser(server.app, 'maren@saltglass.example', 'Maren Dove');
    const known = await request(server.app).post('/api/auth/password-reset').send({ email: 'maren@saltglass.example' });
    const unknown = await request(server.app).post('/api/auth/password-reset').send({ email: 'nobody-here@saltglass.example' });
    expect(comparable(unknown)).toEqual(comparable(known));
  });
});

describe('register with a taken address', () => {
  it('refuses with a neutral message that does not say the account exists, and writes nothing', async () => {
    await registerUser(server.app, 'lio@saltglass.example', 'Lio Sand');
    const before = await rowCount(server.dataSource, 'users');
    const refused = await request(server.app).post('/api/auth/register').send({ email: 'LIO@saltglass.example', password: TEST_PASSWORD, displayName: 'Again' });
    expect(refused.status).toBe(409);
    expect(refused.body.error).toEqual({ code: 'conflict', field: 'email', message: REGISTER_REFUSED, issues: [{ field: 'email', problem: REGISTER_REFUSED, got: null, message: REGISTER_REFUSED }] });
    expect(refused.body.error.message).not.toMatch(/exist/i);
    expect(await rowCount(server.dataSource, 'users')).toBe(before);
  });
});

describe('per-account limits', () => {
  it('limits failed sign-ins per address (not only per client), with Retry-After, until the window passes', async () => {
    await registerUser(server.app, 'tamsin@saltglass.example', 'Tamsin Ray');
    const wrong = () => request(server.app).post('/api/auth/login').send({ email: 'Tamsin@saltglass.example', password: 'not-the-password-1' });
    expect([(await wrong()).status, (await wrong()).status, (await wrong()).status]).toEqual([401, 401, 401]);
    const limited = await request(server.app).post('/api/auth/login').send({ email: 'tamsin@saltglass.example', password: TEST_PASSWORD });
    expect(limited.status).toBe(429);
    expect(limited.body.error).toMatchObject({ code: 'rate_limited', field: 'email' });
    expect(limited.body.error.message).toMatch(/Too many failed sign-ins for this address.*try again in 1 minute/);
    expect(Number(limited.headers['retry-after'])).toBeGreaterThan(0);
    expect(Number(limited.headers['retry-after'])).toBeLessThanOrEqual(60);
    // Another account from the same client is not affected.
    await registerUser(server.app, 'ysolde@saltglass.example', 'Ysolde Marr');
    expect((await request(server.app).post('/api/auth/login').send({ email: 'ysolde@saltglass.example', password: TEST_PASSWORD })).status).toBe(200);
    server.advanceClock(61_000);
    expect((await request(server.app).post('/api/auth/login').send({ email: 'tamsin@saltglass.example', password: TEST_PASSWORD })).status).toBe(200);
  });

  it('limits an unknown address the same way, so the limit reveals nothing', async () => {
    const wrong = () => request(server.app).post('/api/auth/login').send({ email: 'ghost-9@saltglass.example', password: 'not-the-password-1' });
    const statuses = [];
    for (let i = 0; i < 4; i++) statuses.push((await wrong()).status);
    expect(statuses).toEqual([401, 401, 401, 429]);
  });

  it('limits wrong current passwords on POST /api/me/password, with Retry-After', async () => {
    const { token } = await registerUser(server.app, 'petra@saltglass.example', 'Petra Lune');
    const wrong = () => as(server.app, token).post('/api/me/password').send({ currentPassword: 'guess-number-x', newPassword: 'brine-lantern-55' });
    expect([(await wrong()).status, (await wrong()).status, (await wrong()).status]).toEqual([400, 400, 400]);
    const limited = await as(server.app, token).post('/api/me/password').send({ currentPassword: TEST_PASSWORD, newPassword: 'brine-lantern-55' });
    expect(limited.status).toBe(429);
    expect(limited.body.error).toMatchObject({ code: 'rate_limited', field: 'currentPassword' });
    expect(Number(limited.headers['retry-after'])).toBeGreaterThan(0);
    // Nothing changed: the old password still signs in.
    expect((await request(server.app).post('/api/auth/login').send({ email: 'petra@saltglass.example', password: TEST_PASSWORD })).status).toBe(200);
  });

  it(`sends at most ${LIMITS.invitationMailsPerAddress.limit} invitation e-mails per address and hour, however they are asked for (default limit)`, async () => {
    const plain = await startTestServer();
    try {
      const lead = await registerUser(plain.app, 'iona@kestrel-lantern.example', 'Iona Reed');
      const studioId = (await as(plain.app, lead.token).post('/api/studios').send({ name: 'Kestrel Lantern Audio' })).body.studio.id as string;
      const invited = await as(plain.app, lead.token).post(`/api/studios/${studioId}/invitations`).send({ email: 'fen@kestrel-lantern.example', role: 'designer' });
      expect(invited.status).toBe(201);
      const statuses: number[] = [];
      for (let i = 0; i < 30; i++) {
        statuses.push((await as(plain.app, lead.token).post(`/api/studios/${studioId}/invitations/${invited.body.invitation.id}/resend`)).status);
      }
      const again = await as(plain.app, lead.token).post(`/api/studios/${studioId}/invitations`).send({ email: 'fen@kestrel-lantern.example', role: 'listener' });
      expect(again.status).toBe(429);
      expect(again.headers['retry-after']).toBeDefined();
      expect(statuses.filter((status) => status === 200)).toHaveLength(LIMITS.invitationMailsPerAddress.limit - 1);
      expect(statuses.filter((status) => status === 429)).toHaveLength(30 - (LIMITS.invitationMailsPerAddress.limit - 1));
      await new Promise((resolve) => setTimeout(resolve, 300));
      const mails = plain.mailbox.messages().filter((message) => message.to.includes('fen@kestrel-lantern.example'));
      expect(mails).toHaveLength(LIMITS.invitationMailsPerAddress.limit);
    } finally {
      await plain.close();
    }
  });
});

describe('sign-out revokes the token on the server', () => {
  it('refuses the signed-out token on REST (401), keeps other tokens of the user, and tells live connections', async () => {
    const { token, id } = await registerUser(server.app, 'corin@saltglass.example', 'Corin Flint');
    const other = (await request(server.app).post('/api/auth/login').send({ email: 'corin@saltglass.example', password: TEST_PASSWORD })).body.token as string;
    const changes: AccessChange[] = [];
    const stop = server.context.access.subscribe((change) => changes.push(change));
    try {
      expect((await as(server.app, token).get('/api/me')).status).toBe(200);
      expect((await as(server.app, token).post('/api/auth/logout')).status).toBe(204);
      const after = await as(server.app, token).get('/api/me');
      expect(after.status).toBe(401);
      expect(after.body.error.code).toBe('unauthenticated');
      expect((await request(server.app).get('/api/me').set('Cookie', `tautline_token=${token}`)).status).toBe(401);
      expect((await as(server.app, other).get('/api/me')).status).toBe(200);
      expect(changes).toContainEqual({ kind: 'user', userId: id, reason: 'signed-out' });
    } finally {
      stop();
    }
  });

  it('keeps a revocation only until the token would have expired', async () => {
    const { token } = await registerUser(server.app, 'bryn@saltglass.example', 'Bryn Hale');
    await as(server.app, token).post('/api/auth/logout');
    const [row] = await server.dataSource.query(`SELECT expiresAt FROM revoked_tokens WHERE userId = (SELECT id FROM users WHERE email = 'bryn@saltglass.example')`);
    expect(row).toBeDefined();
    server.advanceClock((server.context.config.tokenLifetimeS + 5) * 1000);
    const { token: later } = await registerUser(server.app, 'bryn-2@saltglass.example', 'Bryn Two');
    await as(server.app, later).post('/api/auth/logout');
    const left = await server.dataSource.query(`SELECT jti FROM revoked_tokens WHERE userId = (SELECT id FROM users WHERE email = 'bryn@saltglass.example')`);
    expect(left).toEqual([]);
  });

  it('refuses a token without an id (it could never be signed out)', async () => {
    const { id } = await registerUser(server.app, 'nell@saltglass.example', 'Nell Ash');
    const noId = jwt.sign({ ver: 0 }, server.context.config.jwtSecret, { subject: id, expiresIn: 600 });
    expect((await as(server.app, noId).get('/api/me')).status).toBe(401);
  });
});

describe('sign-out and live connections', () => {
  let live: LiveTestServer;
  beforeAll(async () => {
    live = await startLiveTestServer();
  });
  afterAll(() => live.close());

  it('refuses a signed-out token at the collaboration upgrade (401)', async () => {
    const fixture = await createStudioFixture(live, 'out');
    const token = fixture.members.designer.token;
    await as(live.app, token).post('/api/auth/logout');
    const status = await websocketUpgradeStatus(`${live.baseUrl.replace('http', 'ws')}/collab/${fixture.sessionId}?token=${token}`);
    expect(status).toBe(401);
  });
});
