import jwt from 'jsonwebtoken';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { LIMITS } from '../../shared/limits';
import { AUTH_COOKIE } from '../../server/auth/authenticate';
import { as, registerUser, rowCount, startTestServer, TEST_PASSWORD, type TestServer } from '../support/test-server';

let server: TestServer;
beforeAll(async () => {
  server = await startTestServer();
});
afterAll(() => server.close());

function cookieFrom(response: request.Response): string {
  const header = ([] as string[]).concat(response.headers['set-cookie'] ?? []);
  const cookie = header.find((line) => line.startsWith(`${AUTH_COOKIE}=`));
  if (!cookie) throw new Error('no auth cookie set');
  return cookie;
}

describe('register and sign in', () => {
  it('registers (201), sets an httpOnly SameSite=Lax cookie, and the cookie signs the browser in', async () => {
    const response = await request(server.app).post('/api/auth/register').send({ email: '  Marisol@Saltglass.example ', password: TEST_PASSWORD, displayName: 'Marisol Teague' });
    expect(response.status).toBe(201);
    expect(response.body.user).toMatchObject({ email: 'marisol@saltglass.example', displayName: 'Marisol Teague' });
    expect(response.body.user.passwordHash).toBeUndefined();
    const cookie = cookieFrom(response);
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    const me = await request(server.app).get('/api/me').set('Cookie', cookie.split(';')[0]);
    expect(me.status).toBe(200);
    expect(me.body.user.email).toBe('marisol@saltglass.example');
    expect(me.body.studios).toEqual([]);
  });

  it('stores a scrypt hash, never the password', async () => {
    const [row] = await server.dataSource.query(`SELECT passwordHash FROM users WHERE email = 'marisol@saltglass.example'`);
    expect(row.passwordHash).toMatch(/^scrypt\$10\$8\$1\$/);
    expect(row.passwordHash).not.toContain(TEST_PASSWORD);
  });

  it('refuses a duplicate e-mail, whatever its case, with 409 naming email', async () => {
    const before = await rowCount(server.dataSource, 'users');
    const response = await request(server.app).post('/api/auth/register').send({ email: 'MARISOL@saltglass.example', password: TEST_PASSWORD, displayName: 'Again' });
    expect(response.status).toBe(409);
    expect(response.body.error).toMatchObject({ code: 'conflict', field: 'email' });
    expect(await rowCount(server.dataSource, 'users')).toBe(before);
  });

  it.each([
    ['short', 'harbour', 'password must be at least 10 characters'],
    ['common', 'password123', 'password is one of the most common passwords; choose another'],
    ['repetitive', 'aaaaabbbbbaaaaa', 'password must use at least 5 different characters'],
    ['the e-mail name', 'xander-weak-1', 'password must not contain your e-mail address'],
  ])('refuses a weak password (%s) with the reason, 400, writing nothing', async (_label, password, message) => {
    const before = await rowCount(server.dataSource, 'users');
    const response = await request(server.app).post('/api/auth/register').send({ email: 'xander@saltglass.example', password, displayName: 'Xander' });
    expect(response.status).toBe(400);
    expect(response.body.error).toMatchObject({ code: 'invalid', field: 'password', message });
    expect(await rowCount(server.dataSource, 'users')).toBe(before);
  });

  it('refuses malformed bodies with 400 naming the field', async () => {
    const cases: Array<[unknown, string]> = [
      [{ email: 'not-an-address', password: TEST_PASSWORD, displayName: 'N' }, 'email'],
      [{ email: 'n@saltglass.example', password: 12345678901, displayName: 'N' }, 'password'],
      [{ email: 'n@saltglass.example', password: TEST_PASSWORD }, 'displayName'],
      [[1, 2, 3], 'body'],
    ];
    for (const [body, field] of cases) {
      const response = await request(server.app).post('/api/auth/register').send(body as object);
      expect(response.status, JSON.stringify(body)).toBe(400);
      expect(response.body.error.field).toBe(field);
    }
    const text = await request(server.app).post('/api/auth/register').set('Content-Type', 'application/json').send('{"email": ');
    expect(text.status).toBe(400);
    expect(text.body.error.message).toBe('Request body is not valid JSON');
    const huge = await request(server.app)
      .post('/api/auth/register')
      .send({ email: 'h@saltglass.example', password: TEST_PASSWORD, displayName: 'x'.repeat(LIMITS.maxRequestBodyBytes) });
    expect(huge.status).toBe(413);
    expect(huge.body.error.code).toBe('too_large');
    expect(await rowCount(server.dataSource, 'users')).toBe(1);
  });

  it('signs in with the right password (200, token and cookie) and refuses a wrong one with 401', async () => {
    const good = await request(server.app).post('/api/auth/login').send({ email: 'marisol@saltglass.example', password: TEST_PASSWORD });
    expect(good.status).toBe(200);
    expect(typeof good.body.token).toBe('string');
    cookieFrom(good);
    const bad = await request(server.app).post('/api/auth/login').send({ email: 'marisol@saltglass.example', password: 'wrong-password-1' });
    expect(bad.status).toBe(401);
    expect(bad.body.error.message).toBe('E-mail or password is wrong');
    const unknown = await request(server.app).post('/api/auth/login').send({ email: 'nobody@saltglass.example', password: TEST_PASSWORD });
    expect(unknown.status).toBe(401);
    expect(unknown.body.error.message).toBe(bad.body.error.message);
  });

  it('signs out by clearing the cookie', async () => {
    const response = await request(server.app).post('/api/auth/logout');
    expect(response.status).toBe(204);
    expect(cookieFrom(response)).toMatch(/Expires=Thu, 01 Jan 1970/);
  });
});

describe('tokens', () => {
  let token: string;
  let userId: string;
  beforeAll(async () => {
    ({ token, id: userId } = await registerUser(server.app, 'odile@saltglass.example', 'Odile Brandt'));
  });

  it('accepts a Bearer token for scripts', async () => {
    const response = await as(server.app, token).get('/api/me');
    expect(response.status).toBe(200);
    expect(response.body.user.id).toBe(userId);
  });

  it.each([
    ['no token', () => undefined],
    ['a tampered token', () => `${token.slice(0, -3)}${token.slice(-3) === 'AAA' ? 'BBB' : 'AAA'}`],
    ['a token signed with another secret', () => jwt.sign({ ver: 0 }, 'another-secret-of-more-than-32-characters', { subject: userId, expiresIn: 600 })],
    ['an expired token', () => jwt.sign({ ver: 0, exp: Math.floor(Date.now() / 1000) - 10 }, server.context.config.jwtSecret, { subject: userId })],
    ['an unsigned token', () => jwt.sign({ ver: 0, sub: userId }, '', { algorithm: 'none' as jwt.Algorithm })],
    ['garbage', () => 'not.a.token'],
  ])('answers 401 to %s', async (_label, make) => {
    const bearer = make();
    const test = request(server.app).get('/api/me');
    const response = await (bearer ? test.set('Authorization', `Bearer ${bearer}`) : test);
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it('changes the display name', async () => {
    const response = await as(server.app, token).patch('/api/me').send({ displayName: 'Odile B.' });
    expect(response.status).toBe(200);
    expect((await as(server.app, token).get('/api/me')).body.user.displayName).toBe('Odile B.');
  });

  it('changes the password: the current one is checked, older tokens stop working, the new one signs in', async () => {
    const wrong = await as(server.app, token).post('/api/me/password').send({ currentPassword: 'not-it-at-all', newPassword: 'tidewater-lamp-9' });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.field).toBe('currentPassword');
    const weak = await as(server.app, token).post('/api/me/password').send({ currentPassword: TEST_PASSWORD, newPassword: 'short' });
    expect(weak.body.error.field).toBe('newPassword');
    const changed = await as(server.app, token).post('/api/me/password').send({ currentPassword: TEST_PASSWORD, newPassword: 'tidewater-lamp-9' });
    expect(changed.status).toBe(200);
    expect((await as(server.app, token).get('/api/me')).status).toBe(401);
    expect((await as(server.app, changed.body.token).get('/api/me')).status).toBe(200);
    const login = await request(server.app).post('/api/auth/login').send({ email: 'odile@saltglass.example', password: 'tidewater-lamp-9' });
    expect(login.status).toBe(200);
  });
});

describe('password reset by e-mail (through the local SMTP server)', () => {
  it('mails a single-use link that sets a new password', async () => {
    await registerUser(server.app, 'bram@saltglass.example', 'Bram Kell');
    const since = Date.now();
    const asked = await request(server.app).post('/api/auth/password-reset').send({ email: 'BRAM@saltglass.example' });
    expect(asked.status).toBe(202);
    const mail = await server.mailbox.waitFor('bram@saltglass.example', since);
    expect(mail.subject).toBe('Reset your Tautline password');
    const link = new URL(mail.links[0]);
    expect(link.pathname).toBe('/reset-password');
    const token = link.searchParams.get('token') as string;

    const weak = await request(server.app).post('/api/auth/password-reset/confirm').send({ token, password: 'short' });
    expect(weak.status).toBe(400);
    expect(weak.body.error.field).toBe('password');
    const done = await request(server.app).post('/api/auth/password-reset/confirm').send({ token, password: 'lantern-keeper-77' });
    expect(done.status).toBe(200);
    expect((await request(server.app).post('/api/auth/login').send({ email: 'bram@saltglass.example', password: 'lantern-keeper-77' })).status).toBe(200);
    expect((await request(server.app).post('/api/auth/login').send({ email: 'bram@saltglass.example', password: TEST_PASSWORD })).status).toBe(401);

    const again = await request(server.app).post('/api/auth/password-reset/confirm').send({ token, password: 'another-lantern-8' });
    expect(again.status).toBe(400);
    expect(again.body.error.field).toBe('token');
  });

  it('answers the same for an unknown address and sends nothing', async () => {
    const before = server.mailbox.messages().length;
    const response = await request(server.app).post('/api/auth/password-reset').send({ email: 'ghost@saltglass.example' });
    expect(response.status).toBe(202);
    await new Promise((resolve) => setTimeout(resolve, 200));
    expect(server.mailbox.messages().length).toBe(before);
  });

  it('refuses an expired reset link', async () => {
    const since = Date.now();
    await request(server.app).post('/api/auth/password-reset').send({ email: 'bram@saltglass.example' });
    const mail = await server.mailbox.waitFor('bram@saltglass.example', since);
    const token = new URL(mail.links[0]).searchParams.get('token');
    server.advanceClock(2 * 3600 * 1000);
    const response = await request(server.app).post('/api/auth/password-reset/confirm').send({ token, password: 'lantern-keeper-78' });
    expect(response.status).toBe(400);
    expect(response.body.error.field).toBe('token');
  });
});

describe('deleting an account', () => {
  it('refuses while the user is the last lead of a studio with other members, then succeeds after handing over', async () => {
    const lead = await registerUser(server.app, 'cato@saltglass.example', 'Cato Venn');
    const studio = (await as(server.app, lead.token).post('/api/studios').send({ name: 'Gannet Rock Sound' })).body.studio;
    const since = Date.now();
    await as(server.app, lead.token).post(`/api/studios/${studio.id}/invitations`).send({ email: 'rhea@saltglass.example', role: 'designer' });
    const mail = await server.mailbox.waitFor('rhea@saltglass.example', since);
    const token = new URL(mail.links[0]).searchParams.get('token');
    const rhea = (await request(server.app).post('/api/invitations/accept').send({ token, displayName: 'Rhea Quill', password: TEST_PASSWORD })).body;

    const refused = await as(server.app, lead.token).delete('/api/me').send({ password: TEST_PASSWORD });
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toBe('You are the last lead of Gannet Rock Sound: make another member lead before deleting your account');
    expect((await as(server.app, lead.token).get('/api/me')).status).toBe(200);

    expect((await as(server.app, lead.token).patch(`/api/studios/${studio.id}/members/${rhea.user.id}`).send({ role: 'lead' })).status).toBe(200);
    const wrongPassword = await as(server.app, lead.token).delete('/api/me').send({ password: 'not-my-password' });
    expect(wrongPassword.status).toBe(400);
    const deleted = await as(server.app, lead.token).delete('/api/me').send({ password: TEST_PASSWORD });
    expect(deleted.status).toBe(204);
    expect((await as(server.app, lead.token).get('/api/me')).status).toBe(401);
    const members = await as(server.app, rhea.token).get(`/api/studios/${studio.id}/members`);
    expect(members.body.members.map((member: { email: string }) => member.email)).toEqual(['rhea@saltglass.example']);
  });

  it('takes a studio the user leads alone with the account', async () => {
    const solo = await registerUser(server.app, 'ines@saltglass.example', 'Ines Moor');
    await as(server.app, solo.token).post('/api/studios').send({ name: 'Solo Tide Works' });
    const studios = await rowCount(server.dataSource, 'studios');
    expect((await as(server.app, solo.token).delete('/api/me').send({ password: TEST_PASSWORD })).status).toBe(204);
    expect(await rowCount(server.dataSource, 'studios')).toBe(studios - 1);
  });
});

describe('rate limits', () => {
  it('answers 429 once sign-in attempts pass the limit', async () => {
    const limited = await startTestServer({ authRateLimit: { windowMs: 60_000, limit: 3 } });
    try {
      const statuses: number[] = [];
      for (let i = 0; i < 5; i++) {
        statuses.push((await request(limited.app).post('/api/auth/login').send({ email: 'a@saltglass.example', password: 'whatever-it-is' })).status);
      }
      expect(statuses).toEqual([401, 401, 401, 429, 429]);
      const last = await request(limited.app).post('/api/auth/register').send({ email: 'b@saltglass.example', password: TEST_PASSWORD, displayName: 'B' });
      expect(last.status).toBe(429);
      expect(last.body.error.code).toBe('rate_limited');
    } finally {
      await limited.close();
    }
  });
});
