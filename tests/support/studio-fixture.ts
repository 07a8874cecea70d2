import request from 'supertest';
import type { Role } from '../../shared/access/roles';
import { as, registerUser, TEST_PASSWORD, type TestServer } from './test-server';

export interface Member {
  token: string;
  id: string;
  email: string;
}

export interface StudioFixture {
  studioId: string;
  sessionId: string;
  members: Record<Role, Member>;
}

/**
 * A studio of the invented Kestrel Lantern Audio with one member per role, joined through real
 * invitation e-mails, and one session started from the default string.
 */
export async function createStudioFixture(server: TestServer, prefix = 'kla'): Promise<StudioFixture> {
  const leadEmail = `${prefix}-lead@kestrel-lantern.example`;
  const lead = await registerUser(server.app, leadEmail, 'Wren Halloway');
  const studioId = (await as(server.app, lead.token).post('/api/studios').send({ name: `Kestrel Lantern Audio ${prefix}` })).body.studio.id as string;
  const members = { lead: { ...lead, email: leadEmail } } as Record<Role, Member>;
  for (const role of ['designer', 'producer', 'listener'] as const) {
    const email = `${prefix}-${role}@kestrel-lantern.example`;
    const since = Date.now();
    await as(server.app, lead.token).post(`/api/studios/${studioId}/invitations`).send({ email, role });
    const mail = await server.mailbox.waitFor(email, since);
    const token = new URL(mail.links[0]).searchParams.get('token');
    const accepted = await request(server.app).post('/api/invitations/accept').send({ token, displayName: `${role} of ${prefix}`, password: TEST_PASSWORD });
    if (accepted.status !== 200) throw new Error(`accept ${email}: ${JSON.stringify(accepted.body)}`);
    members[role] = { token: accepted.body.token, id: accepted.body.user.id, email };
  }
  const session = await as(server.app, lead.token).post(`/api/studios/${studioId}/sessions`).send({ name: 'Harbour bell-wire study' });
  return { studioId, sessionId: session.body.session.id as string, members };
}
