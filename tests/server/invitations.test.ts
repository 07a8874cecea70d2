import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { as, registerUser, rowCount, startTestServer, TEST_PASSWORD, type TestServer } from '../support/test-server';

let server: TestServer;
let lead: { token: string; id: string };
let studioId: string;

beforeAll(async () => {
  server = await startTestServer();
  lead = await registerUser(server.app, 'wren@kestrel-lantern.example', 'Wren Halloway');
  studioId = (await as(server.app, lead.token).post('/api/studios').send({ name: 'Kestrel Lantern Audio' })).body.studio.id;
});
afterAll(() => server.close());

/** Invites an address and returns the token from the link in the e-mail the local SMTP server received. */
async function invite(email: string, role: string): Promise<{ token: string; invitationId: string }> {
  const since = Date.now();
  const response = await as(server.app, lead.token).post(`/api/studios/${studioId}/invitations`).send({ email, role });
  expect([200, 201]).toContain(response.status);
  const mail = await server.mailbox.waitFor(email, since);
  expect(mail.subject).toBe('Wren Halloway invited you to Kestrel Lantern Audio on Tautline');
  expect(mail.text).toContain(`as a ${role}`);
  const link = new URL(mail.links[0]);
  expect(link.pathname).toBe('/invitations/accept');
  return { token: link.searchParams.get('token') as string, invitationId: response.body.invitation.id };
}

describe('invitations', () => {
  it('creates the account and the membership when a new address accepts', async () => {
    const { token } = await invite('tamsin@kestrel-lantern.example', 'designer');
    const preview = await request(server.app).get(`/api/invitations/${token}`);
    expect(preview.status).toBe(200);
    expect(preview.body.invitation).toMatchObject({ studioName: 'Kestrel Lantern Audio', role: 'designer', hasAccount: false });

    const missing = await request(server.app).post('/api/invitations/accept').send({ token });
    expect(missing.status).toBe(400);
    expect(missing.body.error.field).toBe('displayName');
    const weak = await request(server.app).post('/api/invitations/accept').send({ token, displayName: 'Tamsin', password: 'weak' });
    expect(weak.status).toBe(400);
    expect(weak.body.error.field).toBe('password');

    const accepted = await request(server.app).post('/api/invitations/accept').send({ token, displayName: 'Tamsin Okafor', password: TEST_PASSWORD });
    expect(accepted.status).toBe(200);
    expect(accepted.body).toMatchObject({ studioId, role: 'designer' });
    const me = await as(server.app, accepted.body.token).get('/api/me');
    expect(me.body.studios).toEqual([expect.objectContaining({ id: studioId, role: 'designer' })]);
  });

  it('refuses a used invitation with 409 and changes nothing', async () => {
    const { token } = await invite('joaquin@kestrel-lantern.example', 'producer');
    expect((await request(server.app).post('/api/invitations/accept').send({ token, displayName: 'Joaquín Reyes', password: TEST_PASSWORD })).status).toBe(200);
    const [users, memberships] = [await rowCount(server.dataSource, 'users'), await rowCount(server.dataSource, 'memberships')];
    const again = await request(server.app).post('/api/invitations/accept').send({ token, displayName: 'Someone Else', password: TEST_PASSWORD });
    expect(again.status).toBe(409);
    expect(again.body.error.message).toBe('This invitation has already been used');
    expect(await rowCount(server.dataSource, 'users')).toBe(users);
    expect(await rowCount(server.dataSource, 'memberships')).toBe(memberships);
  });

  it('refuses an expired invitation with 409', async () => {
    const { token } = await invite('late@kestrel-lantern.example', 'listener');
    server.advanceClock(8 * 24 * 3600 * 1000);
    const response = await request(server.app).post('/api/invitations/accept').send({ token, displayName: 'Late', password: TEST_PASSWORD });
    expect(response.status).toBe(409);
    expect(response.body.error.message).toMatch(/expired/);
    expect((await request(server.app).get(`/api/invitations/${token}`)).status).toBe(409);
  });

  it('lists pending invitations, resends with a fresh link (the old one stops working) and revokes', async () => {
    const first = await invite('pell@kestrel-lantern.example', 'listener');
    const pending = await as(server.app, lead.token).get(`/api/studios/${studioId}/invitations`);
    expect(pending.body.invitations.map((invitation: { email: string }) => invitation.email)).toContain('pell@kestrel-lantern.example');

    const since = Date.now();
    const resent = await as(server.app, lead.token).post(`/api/studios/${studioId}/invitations/${first.invitationId}/resend`);
    expect(resent.status).toBe(200);
    const mail = await server.mailbox.waitFor('pell@kestrel-lantern.example', since + 1);
    const fresh = new URL(mail.links.at(-1) as string).searchParams.get('token') as string;
    expect(fresh).not.toBe(first.token);
    expect((await request(server.app).get(`/api/invitations/${first.token}`)).status).toBe(404);
    expect((await request(server.app).get(`/api/invitations/${fresh}`)).status).toBe(200);

    expect((await as(server.app, lead.token).delete(`/api/studios/${studioId}/invitations/${first.invitationId}`)).status).toBe(204);
    expect((await request(server.app).get(`/api/invitations/${fresh}`)).status).toBe(404);
    const after = await as(server.app, lead.token).get(`/api/studios/${studioId}/invitations`);
    expect(after.body.invitations.map((invitation: { email: string }) => invitation.email)).not.toContain('pell@kestrel-lantern.example');
  });

  it('asks an existing account to sign in before accepting, then adds the membership', async () => {
    const existing = await registerUser(server.app, 'ana@kestrel-lantern.example', 'Ana Sollis');
    const { token } = await invite('ana@kestrel-lantern.example', 'listener');
    const anonymous = await request(server.app).post('/api/invitations/accept').send({ token });
    expect(anonymous.status).toBe(401);
    expect(anonymous.body.error.message).toBe('Sign in as ana@kestrel-lantern.example to accept this invitation');
    const accepted = await as(server.app, existing.token).post('/api/invitations/accept').send({ token });
    expect(accepted.status).toBe(200);
    const me = await as(server.app, existing.token).get('/api/me');
    expect(me.body.studios.map((studio: { id: string }) => studio.id)).toContain(studioId);
  });

  it('will not invite someone who is already a member', async () => {
    const response = await as(server.app, lead.token).post(`/api/studios/${studioId}/invitations`).send({ email: 'tamsin@kestrel-lantern.example', role: 'lead' });
    expect(response.status).toBe(409);
    expect(response.body.error.field).toBe('email');
  });
});

describe('members', () => {
  it('keeps at least one lead: the last lead cannot be demoted or removed, and the answer says why', async () => {
    const demote = await as(server.app, lead.token).patch(`/api/studios/${studioId}/members/${lead.id}`).send({ role: 'designer' });
    expect(demote.status).toBe(409);
    expect(demote.body.error.message).toBe('A studio keeps at least one lead: make another member lead first');
    const leave = await as(server.app, lead.token).delete(`/api/studios/${studioId}/members/${lead.id}`);
    expect(leave.status).toBe(409);
    const members = (await as(server.app, lead.token).get(`/api/studios/${studioId}/members`)).body.members;
    expect(members.find((member: { userId: string }) => member.userId === lead.id).role).toBe('lead');
  });

  it('changes a role and removes a member; a removed member sees the studio as missing', async () => {
    const members = (await as(server.app, lead.token).get(`/api/studios/${studioId}/members`)).body.members as Array<{ userId: string; email: string; role: string }>;
    const tamsin = members.find((member) => member.email === 'tamsin@kestrel-lantern.example')!;
    expect((tamsin as unknown as { joinedAt: string }).joinedAt).toMatch(/^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d\.\d{3}Z$/);
    const promoted = await as(server.app, lead.token).patch(`/api/studios/${studioId}/members/${tamsin.userId}`).send({ role: 'lead' });
    expect(promoted.body.members.find((member: { userId: string }) => member.userId === tamsin.userId).role).toBe('lead');
    // With two leads, the first may now step down.
    expect((await as(server.app, lead.token).patch(`/api/studios/${studioId}/members/${lead.id}`).send({ role: 'lead' })).status).toBe(200);
    const badRole = await as(server.app, lead.token).patch(`/api/studios/${studioId}/members/${tamsin.userId}`).send({ role: 'owner' });
    expect(badRole.status).toBe(400);
    expect(badRole.body.error.field).toBe('role');

    const ana = members.find((member) => member.email === 'ana@kestrel-lantern.example')!;
    const anaLogin = await request(server.app).post('/api/auth/login').send({ email: 'ana@kestrel-lantern.example', password: TEST_PASSWORD });
    expect((await as(server.app, lead.token).delete(`/api/studios/${studioId}/members/${ana.userId}`)).status).toBe(204);
    expect((await as(server.app, anaLogin.body.token).get(`/api/studios/${studioId}`)).status).toBe(404);
  });
});
