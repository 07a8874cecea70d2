import request from 'supertest';
import type { Response } from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ACTION_REASONS, ROLES, can, type Action, type Role } from '../../shared/access/roles';
import { testPatch } from '../support/patches';
import { TEST_PASSWORD, as, registerUser, rowCount, startTestServer, type TestServer } from '../support/test-server';

/**
 * The role matrix of a studio, request by request. Invented scenario: the studio "Kestrel Lantern
 * Audio" (its game "Saltglass Reach") has a lead, a designer, a producer and a listener; the rival
 * studio "Gannet Rock Sound" is run by an outsider. Every row is sent by each role against its own
 * studio (allowed → the exact 2xx, refused → 403 forbidden), by each role against the rival
 * studio's ids (404, never 403) and by the outsider against Kestrel Lantern's ids (404).
 */

type Method = 'get' | 'post' | 'patch' | 'delete';
type Table = 'studios' | 'memberships' | 'invitations' | 'sessions' | 'presets';

/** The ids a row's path and body are built from. */
interface Ids {
  studioId: string;
  sessionId: string;
  presetId: string;
  invitationId: string;
  /** A member of the studio other than the caller. */
  userId: string;
  /** An address nobody in the studio uses yet. */
  email: string;
}

interface StudioFixture {
  name: string;
  leadToken: string;
  /** Long-lived fixtures for the read-only rows; mutating rows make fresh ones. */
  ids: Ids;
}

interface Row {
  name: string;
  method: Method;
  path: (ids: Ids) => string;
  body?: (ids: Ids) => Record<string, unknown>;
  /** A multipart upload: the JSON text sent as the form file `file`. */
  upload?: { json: string; fields?: Record<string, string> };
  /** Who may do it, straight from the product table. */
  allowed: readonly Role[];
  /** The permission the server checks, for the 403 message. */
  action: Action;
  status: 200 | 201 | 204;
  /** Makes throwaway fixtures (acting as the studio's lead) so that every attempt starts afresh. */
  fresh?: (studio: StudioFixture) => Promise<Partial<Ids>>;
  /** Tables a refused attempt must leave exactly as they were. */
  touches?: readonly Table[];
  /** Checks the effect of an allowed attempt. */
  effect?: (response: Response, ids: Ids, studio: StudioFixture) => Promise<void>;
}

const ALL: readonly Role[] = ROLES;
const EDITORS: readonly Role[] = ['lead', 'designer'];
const LEADS: readonly Role[] = ['lead'];

let server: TestServer;
let kestrel: StudioFixture;
let gannet: StudioFixture;
const tokens = {} as Record<Role, string>;
const userIds = {} as Record<Role, string>;
let outsiderToken: string;
let serial = 0;

const unique = (stem: string) => `${stem}-${++serial}`;

function expectStatus(response: Response, status: number): void {
  expect(response.status, `${response.status} ${JSON.stringify(response.body)}`).toBe(status);
}

const lead = (studio: StudioFixture) => as(server.app, studio.leadToken);

async function createStudio(token: string, name: string): Promise<string> {
  const response = await as(server.app, token).post('/api/studios').send({ name });
  expectStatus(response, 201);
  return response.body.studio.id;
}

async function freshSession(studio: StudioFixture, name = unique('Mooring line sketch')): Promise<string> {
  const response = await lead(studio).post(`/api/studios/${studio.ids.studioId}/sessions`).send({ name });
  expectStatus(response, 201);
  return response.body.session.id;
}

async function freshPreset(studio: StudioFixture, name = unique('Lamp wire')): Promise<string> {
  const response = await lead(studio)
    .post(`/api/studios/${studio.ids.studioId}/presets`)
    .send({ name, tags: ['steel', 'test'], patch: testPatch({ name }) });
  expectStatus(response, 201);
  return response.body.preset.id;
}

async function freshInvitation(studio: StudioFixture, role: Role = 'listener'): Promise<{ invitationId: string; email: string }> {
  const email = `${unique('deckhand')}@saltglass.test`;
  const response = await lead(studio).post(`/api/studios/${studio.ids.studioId}/invitations`).send({ email, role });
  expectStatus(response, 201);
  return { invitationId: response.body.invitation.id, email };
}

/** Invites an address, reads the e-mail from the fake SMTP mailbox and accepts with a new account. */
async function joinByInvitation(studio: StudioFixture, role: Role, displayName: string, email = `${unique('crew')}@saltglass.test`) {
  const response = await lead(studio).post(`/api/studios/${studio.ids.studioId}/invitations`).send({ email, role });
  expectStatus(response, 201);
  const mail = await server.mailbox.waitFor(email);
  const token = new URL(mail.links[0]).searchParams.get('token');
  expect(token).toBeTruthy();
  const accepted = await request(server.app).post('/api/invitations/accept').send({ token, displayName, password: TEST_PASSWORD });
  expectStatus(accepted, 200);
  expect(accepted.body.role).toBe(role);
  return { token: accepted.body.token as string, userId: accepted.body.user.id as string };
}

async function freshMember(studio: StudioFixture): Promise<{ userId: string }> {
  const { userId } = await joinByInvitation(studio, 'listener', unique('Crew member'));
  return { userId };
}

/** Every row of the tables a refused request must not change, plus their counts. */
async function snapshot(tables: readonly Table[] = []) {
  const out: Record<string, unknown> = {};
  for (const table of tables) {
    out[table] = { count: await rowCount(server.dataSource, table), rows: await server.dataSource.query(`SELECT * FROM "${table}" ORDER BY id`) };
  }
  return out;
}

async function idsFor(row: Row, studio: StudioFixture): Promise<Ids> {
  const base: Ids = { ...studio.ids, email: `${unique('newcomer')}@saltglass.test` };
  return { ...base, ...(row.fresh ? await row.fresh(studio) : {}) };
}

function send(token: string | null, row: Row, ids: Ids) {
  const url = row.path(ids);
  let test = token === null ? request(server.app)[row.method](url) : as(server.app, token)[row.method](url);
  if (row.upload) {
    test = test.attach('file', Buffer.from(row.upload.json), 'x.json');
    for (const [key, value] of Object.entries(row.upload.fields ?? {})) test = test.field(key, value);
  } else if (row.body) {
    test = test.send(row.body(ids));
  }
  return test;
}

async function readAsLead(studio: StudioFixture, url: string) {
  return lead(studio).get(url);
}

const rows: Row[] = [
  // view studio, sessions, presets; audition: every role
  {
    name: 'GET /api/studios/:id',
    method: 'get',
    path: (ids) => `/api/studios/${ids.studioId}`,
    allowed: ALL,
    action: 'view',
    status: 200,
    effect: async (response, ids) => expect(response.body.studio.id).toBe(ids.studioId),
  },
  {
    name: 'GET /api/studios/:id/sessions',
    method: 'get',
    path: (ids) => `/api/studios/${ids.studioId}/sessions`,
    allowed: ALL,
    action: 'view',
    status: 200,
    effect: async (response, ids) => expect(response.body.sessions.map((s: { id: string }) => s.id)).toContain(ids.sessionId),
  },
  {
    name: 'GET /api/sessions/:id',
    method: 'get',
    path: (ids) => `/api/sessions/${ids.sessionId}`,
    allowed: ALL,
    action: 'view',
    status: 200,
    effect: async (response, ids) => {
      expect(response.body.session.id).toBe(ids.sessionId);
      expect(response.body.session.patch.string.tensionN).toBeGreaterThan(0);
    },
  },
  {
    name: 'GET /api/sessions/:id/modes (audition)',
    method: 'get',
    path: (ids) => `/api/sessions/${ids.sessionId}/modes`,
    allowed: ALL,
    action: 'view',
    status: 200,
    effect: async (response) => {
      expect(response.body.f0Hz).toBeGreaterThan(0);
      expect(response.body.modes.length).toBeGreaterThan(0);
    },
  },
  {
    name: 'GET /api/studios/:id/presets',
    method: 'get',
    path: (ids) => `/api/studios/${ids.studioId}/presets`,
    allowed: ALL,
    action: 'view',
    status: 200,
    effect: async (response, ids) => expect(response.body.presets.map((p: { id: string }) => p.id)).toContain(ids.presetId),
  },
  {
    name: 'GET /api/presets/:id',
    method: 'get',
    path: (ids) => `/api/presets/${ids.presetId}`,
    allowed: ALL,
    action: 'view',
    status: 200,
    effect: async (response, ids) => expect(response.body.preset.id).toBe(ids.presetId),
  },
  {
    name: 'GET /api/presets/:id/download',
    method: 'get',
    path: (ids) => `/api/presets/${ids.presetId}/download`,
    allowed: ALL,
    action: 'view',
    status: 200,
    effect: async (response) => expect(response.headers['content-disposition']).toMatch(/^attachment/),
  },
  {
    name: 'GET /api/studios/:id/members',
    method: 'get',
    path: (ids) => `/api/studios/${ids.studioId}/members`,
    allowed: ALL,
    action: 'view',
    status: 200,
    effect: async (response) => expect(response.body.members.length).toBeGreaterThanOrEqual(4),
  },

  // create / rename / edit sessions: lead and designer
  {
    name: 'POST /api/studios/:id/sessions',
    method: 'post',
    path: (ids) => `/api/studios/${ids.studioId}/sessions`,
    body: () => ({ name: 'Breakwater bell, second take' }),
    allowed: EDITORS,
    action: 'editSessions',
    status: 201,
    touches: ['sessions'],
    effect: async (response, _ids, studio) => {
      const again = await readAsLead(studio, `/api/sessions/${response.body.session.id}`);
      expectStatus(again, 200);
      expect(again.body.session.name).toBe('Breakwater bell, second take');
    },
  },
  {
    name: 'PATCH /api/sessions/:id (rename)',
    method: 'patch',
    path: (ids) => `/api/sessions/${ids.sessionId}`,
    body: () => ({ name: 'Tidepool hammer, renamed' }),
    allowed: EDITORS,
    action: 'editSessions',
    status: 200,
    fresh: async (studio) => ({ sessionId: await freshSession(studio) }),
    touches: ['sessions'],
    effect: async (_response, ids, studio) => {
      expect((await readAsLead(studio, `/api/sessions/${ids.sessionId}`)).body.session.name).toBe('Tidepool hammer, renamed');
    },
  },
  {
    name: 'PATCH /api/sessions/:id (edit patch)',
    method: 'patch',
    path: (ids) => `/api/sessions/${ids.sessionId}`,
    body: () => ({ patch: testPatch({ name: 'Tighter', string: { lengthM: 0.65, tensionN: 82.5, linearDensityKgPerM: 6e-4, inharmonicityB: 0 } }) }),
    allowed: EDITORS,
    action: 'editSessions',
    status: 200,
    fresh: async (studio) => ({ sessionId: await freshSession(studio) }),
    touches: ['sessions'],
    effect: async (_response, ids, studio) => {
      expect((await readAsLead(studio, `/api/sessions/${ids.sessionId}`)).body.session.patch.string.tensionN).toBe(82.5);
    },
  },
  {
    name: 'PATCH /api/sessions/:id (archive)',
    method: 'patch',
    path: (ids) => `/api/sessions/${ids.sessionId}`,
    body: () => ({ archived: true }),
    allowed: EDITORS,
    action: 'editSessions',
    status: 200,
    fresh: async (studio) => ({ sessionId: await freshSession(studio) }),
    touches: ['sessions'],
    effect: async (_response, ids, studio) => {
      expect((await readAsLead(studio, `/api/sessions/${ids.sessionId}`)).body.session.archived).toBe(true);
    },
  },
  {
    name: 'POST /api/sessions/:id/load-preset',
    method: 'post',
    path: (ids) => `/api/sessions/${ids.sessionId}/load-preset`,
    body: (ids) => ({ presetId: ids.presetId }),
    allowed: EDITORS,
    action: 'editSessions',
    status: 200,
    fresh: async (studio) => ({ sessionId: await freshSession(studio) }),
    touches: ['sessions', 'presets'],
    effect: async (_response, ids, studio) => {
      const session = await readAsLead(studio, `/api/sessions/${ids.sessionId}`);
      const preset = await readAsLead(studio, `/api/presets/${ids.presetId}`);
      expect(session.body.session.patch).toEqual(preset.body.preset.patch);
    },
  },
  {
    name: 'POST /api/sessions/:id/duplicate',
    method: 'post',
    path: (ids) => `/api/sessions/${ids.sessionId}/duplicate`,
    allowed: EDITORS,
    action: 'editSessions',
    status: 201,
    fresh: async (studio) => ({ sessionId: await freshSession(studio) }),
    touches: ['sessions'],
    effect: async (response, ids, studio) => {
      const original = await readAsLead(studio, `/api/sessions/${ids.sessionId}`);
      expect(response.body.session.name).toBe(`${original.body.session.name} (copy)`);
      expect(response.body.session.patch).toEqual(original.body.session.patch);
    },
  },
  {
    name: 'POST /api/sessions/:id/preset-loaded',
    method: 'post',
    path: (ids) => `/api/sessions/${ids.sessionId}/preset-loaded`,
    body: (ids) => ({ presetId: ids.presetId }),
    allowed: EDITORS,
    action: 'editSessions',
    status: 200,
    fresh: async (studio) => ({ sessionId: await freshSession(studio) }),
    touches: ['sessions'],
    effect: async (response, ids) => expect(response.body.session.sourcePreset.id).toBe(ids.presetId),
  },
  {
    name: 'POST /api/sessions/:id/update-preset',
    method: 'post',
    path: (ids) => `/api/sessions/${ids.sessionId}/update-preset`,
    allowed: LEADS,
    action: 'managePresets',
    status: 200,
    fresh: async (studio) => {
      const presetId = await freshPreset(studio);
      const response = await lead(studio).post(`/api/studios/${studio.ids.studioId}/sessions`).send({ name: unique('From a preset'), presetId });
      expectStatus(response, 201);
      return { presetId, sessionId: response.body.session.id };
    },
    touches: ['sessions', 'presets'],
    effect: async (response, ids) => {
      expect(response.body.preset.id).toBe(ids.presetId);
      // Nothing was edited since the session started from the preset: same sound, same version.
      expect(response.body).toMatchObject({ changed: false, preset: { version: 1 } });
    },
  },

  // delete sessions: lead only
  {
    name: 'DELETE /api/sessions/:id',
    method: 'delete',
    path: (ids) => `/api/sessions/${ids.sessionId}`,
    allowed: LEADS,
    action: 'deleteSessions',
    status: 204,
    fresh: async (studio) => ({ sessionId: await freshSession(studio) }),
    touches: ['sessions'],
    effect: async (_response, ids, studio) => expectStatus(await readAsLead(studio, `/api/sessions/${ids.sessionId}`), 404),
  },

  // save, edit, delete presets: lead only
  {
    name: 'POST /api/studios/:id/presets (from a patch)',
    method: 'post',
    path: (ids) => `/api/studios/${ids.studioId}/presets`,
    body: () => ({ name: 'Harbour bell wire', tags: ['steel'], patch: testPatch() }),
    allowed: LEADS,
    action: 'managePresets',
    status: 201,
    touches: ['presets'],
    effect: async (response, _ids, studio) => {
      expect((await readAsLead(studio, `/api/presets/${response.body.preset.id}`)).body.preset.name).toBe('Harbour bell wire');
    },
  },
  {
    name: 'POST /api/studios/:id/presets (from a sessionId)',
    method: 'post',
    path: (ids) => `/api/studios/${ids.studioId}/presets`,
    body: (ids) => ({ name: 'Kept from the session', sessionId: ids.sessionId }),
    allowed: LEADS,
    action: 'managePresets',
    status: 201,
    touches: ['presets'],
    effect: async (response, ids, studio) => {
      const session = await readAsLead(studio, `/api/sessions/${ids.sessionId}`);
      expect(response.body.preset.patch.string).toEqual(session.body.session.patch.string);
    },
  },
  {
    name: 'POST /api/studios/:id/presets/upload',
    method: 'post',
    path: (ids) => `/api/studios/${ids.studioId}/presets/upload`,
    upload: { json: JSON.stringify(testPatch({ name: 'Uploaded rope locker' })), fields: { tags: 'nylon, muted' } },
    allowed: LEADS,
    action: 'managePresets',
    status: 201,
    touches: ['presets'],
    effect: async (response) => {
      expect(response.body.preset.name).toBe('Uploaded rope locker');
      expect(response.body.preset.tags).toEqual(['nylon', 'muted']);
    },
  },
  {
    name: 'PATCH /api/presets/:id',
    method: 'patch',
    path: (ids) => `/api/presets/${ids.presetId}`,
    body: () => ({ name: 'Lamp wire, brighter', tags: ['bright'] }),
    allowed: LEADS,
    action: 'managePresets',
    status: 200,
    fresh: async (studio) => ({ presetId: await freshPreset(studio) }),
    touches: ['presets'],
    effect: async (_response, ids, studio) => {
      const preset = (await readAsLead(studio, `/api/presets/${ids.presetId}`)).body.preset;
      expect(preset.name).toBe('Lamp wire, brighter');
      expect(preset.tags).toEqual(['bright']);
    },
  },
  {
    name: 'DELETE /api/presets/:id',
    method: 'delete',
    path: (ids) => `/api/presets/${ids.presetId}`,
    allowed: LEADS,
    action: 'managePresets',
    status: 204,
    fresh: async (studio) => ({ presetId: await freshPreset(studio) }),
    touches: ['presets'],
    effect: async (_response, ids, studio) => expectStatus(await readAsLead(studio, `/api/presets/${ids.presetId}`), 404),
  },

  // invite, change roles, remove members (and rename the studio): lead only
  {
    name: 'GET /api/studios/:id/invitations',
    method: 'get',
    path: (ids) => `/api/studios/${ids.studioId}/invitations`,
    allowed: LEADS,
    action: 'manageMembers',
    status: 200,
    effect: async (response, ids) => expect(response.body.invitations.map((i: { id: string }) => i.id)).toContain(ids.invitationId),
  },
  {
    name: 'POST /api/studios/:id/invitations',
    method: 'post',
    path: (ids) => `/api/studios/${ids.studioId}/invitations`,
    body: (ids) => ({ email: ids.email, role: 'designer' }),
    allowed: LEADS,
    action: 'manageMembers',
    status: 201,
    touches: ['invitations', 'memberships'],
    effect: async (_response, ids) => {
      const mail = await server.mailbox.waitFor(ids.email);
      expect(mail.links[0]).toMatch(/token=/);
    },
  },
  {
    name: 'POST /api/studios/:id/invitations/:invitationId/resend',
    method: 'post',
    path: (ids) => `/api/studios/${ids.studioId}/invitations/${ids.invitationId}/resend`,
    allowed: LEADS,
    action: 'manageMembers',
    status: 200,
    fresh: (studio) => freshInvitation(studio),
    touches: ['invitations'],
    effect: async (response, ids) => {
      expect(response.body.invitation.id).toBe(ids.invitationId);
      expect(server.mailbox.messages().filter((message) => message.to.includes(ids.email))).toHaveLength(2);
    },
  },
  {
    name: 'DELETE /api/studios/:id/invitations/:invitationId',
    method: 'delete',
    path: (ids) => `/api/studios/${ids.studioId}/invitations/${ids.invitationId}`,
    allowed: LEADS,
    action: 'manageMembers',
    status: 204,
    fresh: (studio) => freshInvitation(studio),
    touches: ['invitations'],
    effect: async (_response, ids, studio) => {
      const list = await readAsLead(studio, `/api/studios/${ids.studioId}/invitations`);
      expect(list.body.invitations.map((i: { id: string }) => i.id)).not.toContain(ids.invitationId);
    },
  },
  {
    name: 'PATCH /api/studios/:id/members/:userId (change role)',
    method: 'patch',
    path: (ids) => `/api/studios/${ids.studioId}/members/${ids.userId}`,
    body: () => ({ role: 'designer' }),
    allowed: LEADS,
    action: 'manageMembers',
    status: 200,
    fresh: (studio) => freshMember(studio),
    touches: ['memberships'],
    effect: async (response, ids) => {
      expect(response.body.members.find((m: { userId: string }) => m.userId === ids.userId).role).toBe('designer');
    },
  },
  {
    name: 'DELETE /api/studios/:id/members/:userId (remove someone else)',
    method: 'delete',
    path: (ids) => `/api/studios/${ids.studioId}/members/${ids.userId}`,
    allowed: LEADS,
    action: 'manageMembers',
    status: 204,
    fresh: (studio) => freshMember(studio),
    touches: ['memberships'],
    effect: async (_response, ids, studio) => {
      const list = await readAsLead(studio, `/api/studios/${ids.studioId}/members`);
      expect(list.body.members.map((m: { userId: string }) => m.userId)).not.toContain(ids.userId);
    },
  },
  {
    name: 'PATCH /api/studios/:id (rename the studio)',
    method: 'patch',
    path: (ids) => `/api/studios/${ids.studioId}`,
    body: () => ({ name: 'Kestrel Lantern Audio (Saltglass Reach team)' }),
    allowed: LEADS,
    action: 'manageMembers',
    status: 200,
    touches: ['studios'],
    effect: async (response, ids, studio) => {
      expect(response.body.studio.name).toBe('Kestrel Lantern Audio (Saltglass Reach team)');
      // Put the name back so the next attempt is a real change again.
      expectStatus(await lead(studio).patch(`/api/studios/${ids.studioId}`).send({ name: studio.name }), 200);
    },
  },
];

beforeAll(async () => {
  server = await startTestServer();

  const wren = await registerUser(server.app, 'wren.halloway@kestrel-lantern.test', 'Wren Halloway');
  tokens.lead = wren.token;
  userIds.lead = wren.id;
  const kestrelId = await createStudio(wren.token, 'Kestrel Lantern Audio');
  kestrel = { name: 'Kestrel Lantern Audio', leadToken: wren.token, ids: { studioId: kestrelId, sessionId: '', presetId: '', invitationId: '', userId: '', email: '' } };
  const crew: Array<[Role, string, string]> = [
    ['designer', 'Odile Marsh', 'odile.marsh@kestrel-lantern.test'],
    ['producer', 'Bram Tolliver', 'bram.tolliver@kestrel-lantern.test'],
    ['listener', 'Sefa Quint', 'sefa.quint@kestrel-lantern.test'],
  ];
  for (const [role, displayName, email] of crew) {
    const joined = await joinByInvitation(kestrel, role, displayName, email);
    tokens[role] = joined.token;
    userIds[role] = joined.userId;
  }
  kestrel.ids.sessionId = await freshSession(kestrel, 'Saltglass Reach: harbour bell wire');
  kestrel.ids.presetId = await freshPreset(kestrel, 'Quayside lamp wire');
  kestrel.ids.invitationId = (await freshInvitation(kestrel)).invitationId;
  kestrel.ids.userId = userIds.listener;

  const ines = await registerUser(server.app, 'ines.carrow@gannet-rock.test', 'Ines Carrow');
  outsiderToken = ines.token;
  const gannetId = await createStudio(ines.token, 'Gannet Rock Sound');
  gannet = { name: 'Gannet Rock Sound', leadToken: ines.token, ids: { studioId: gannetId, sessionId: '', presetId: '', invitationId: '', userId: '', email: '' } };
  gannet.ids.sessionId = await freshSession(gannet, 'Cliff winch cable');
  gannet.ids.presetId = await freshPreset(gannet, 'Gannet cry wire');
  gannet.ids.invitationId = (await freshInvitation(gannet)).invitationId;
  gannet.ids.userId = (await freshMember(gannet)).userId;
});

afterAll(() => server?.close());

describe('the permission matrix in shared/access/roles.ts', () => {
  const table: Array<[Action, readonly Role[]]> = [
    ['view', ALL],
    ['editSessions', EDITORS],
    ['deleteSessions', LEADS],
    ['managePresets', LEADS],
    ['manageMembers', LEADS],
  ];
  it.each(table)('%s is allowed to exactly %j', (action, allowed) => {
    expect(ROLES.filter((role) => can(role, action))).toEqual(allowed);
  });

  it('every row below checks the action whose roles it lists', () => {
    for (const row of rows) expect(ROLES.filter((role) => can(role, row.action)), row.name).toEqual(row.allowed);
  });
});

describe.each(rows)('$name', (row) => {
  it.each(ROLES)(`as the %s of Kestrel Lantern Audio`, async (role) => {
    const ids = await idsFor(row, kestrel);
    const before = await snapshot(row.touches);
    const response = await send(tokens[role], row, ids);
    if (row.allowed.includes(role)) {
      expectStatus(response, row.status);
      await row.effect?.(response, ids, kestrel);
    } else {
      expectStatus(response, 403);
      expect(response.body.error.code).toBe('forbidden');
      expect(response.body.error.message).toBe(`Not allowed: ${ACTION_REASONS[row.action]}`);
      expect(await snapshot(row.touches)).toEqual(before);
    }
  });

  it.each(ROLES)(`as the %s of Kestrel Lantern Audio, on Gannet Rock Sound's ids: 404`, async (role) => {
    const ids = await idsFor(row, gannet);
    const before = await snapshot(row.touches);
    const response = await send(tokens[role], row, ids);
    expectStatus(response, 404);
    expect(response.body.error.code).toBe('not_found');
    expect(response.body.error.message).toMatch(/not found$/);
    expect(await snapshot(row.touches)).toEqual(before);
  });

  it(`as the outsider (lead of Gannet Rock Sound), on Kestrel Lantern's ids: 404`, async () => {
    const ids = await idsFor(row, kestrel);
    const before = await snapshot(row.touches);
    const response = await send(outsiderToken, row, ids);
    expectStatus(response, 404);
    expect(response.body.error.code).toBe('not_found');
    expect(await snapshot(row.touches)).toEqual(before);
  });

  it('without a token, or with a forged one: 401', async () => {
    const ids = await idsFor(row, kestrel);
    const before = await snapshot(row.touches);
    for (const token of [null, `${tokens.lead.slice(0, -4)}AAAA`]) {
      const response = await send(token, row, ids);
      expectStatus(response, 401);
      expect(response.body.error.code).toBe('unauthenticated');
    }
    expect(await snapshot(row.touches)).toEqual(before);
  });
});

describe('a member of Kestrel Lantern Audio sees nothing of Gannet Rock Sound', () => {
  it.each(ROLES)('GET /api/studios and /api/me list only Kestrel Lantern Audio to the %s', async (role) => {
    const studios = await as(server.app, tokens[role]).get('/api/studios');
    expectStatus(studios, 200);
    expect(studios.body.studios.map((s: { id: string; role: string }) => [s.id, s.role])).toEqual([[kestrel.ids.studioId, role]]);
    const me = await as(server.app, tokens[role]).get('/api/me');
    expect(me.body.studios.map((s: { id: string }) => s.id)).toEqual([kestrel.ids.studioId]);
  });

  it('the lists of Kestrel Lantern hold only its own sessions, presets and members', async () => {
    const sessions = await as(server.app, tokens.listener).get(`/api/studios/${kestrel.ids.studioId}/sessions?archived=true`);
    expect(sessions.body.sessions.length).toBeGreaterThan(0);
    for (const session of sessions.body.sessions) expect(session.studioId).toBe(kestrel.ids.studioId);
    const presets = await as(server.app, tokens.listener).get(`/api/studios/${kestrel.ids.studioId}/presets`);
    expect(presets.body.presets.length).toBeGreaterThan(0);
    for (const preset of presets.body.presets) expect(preset.studioId).toBe(kestrel.ids.studioId);
    const members = await as(server.app, tokens.listener).get(`/api/studios/${kestrel.ids.studioId}/members`);
    expect(members.body.members.map((m: { email: string }) => m.email)).not.toContain('ines.carrow@gannet-rock.test');
  });

  it('a Kestrel session cannot start from a Gannet preset (404, nothing saved)', async () => {
    const before = await snapshot(['sessions']);
    const response = await as(server.app, tokens.lead)
      .post(`/api/studios/${kestrel.ids.studioId}/sessions`)
      .send({ name: 'Borrowed', presetId: gannet.ids.presetId });
    expectStatus(response, 404);
    expect(response.body.error.code).toBe('not_found');
    expect(await snapshot(['sessions'])).toEqual(before);
  });

  it('a Gannet preset cannot be loaded into a Kestrel session (404, session unchanged)', async () => {
    const sessionId = await freshSession(kestrel);
    const before = await snapshot(['sessions']);
    const response = await as(server.app, tokens.designer).post(`/api/sessions/${sessionId}/load-preset`).send({ presetId: gannet.ids.presetId });
    expectStatus(response, 404);
    expect(response.body.error.code).toBe('not_found');
    expect(await snapshot(['sessions'])).toEqual(before);
  });

  it('a Kestrel preset cannot be saved from a Gannet session (404, nothing saved)', async () => {
    const before = await snapshot(['presets']);
    const response = await as(server.app, tokens.lead)
      .post(`/api/studios/${kestrel.ids.studioId}/presets`)
      .send({ name: 'Borrowed', sessionId: gannet.ids.sessionId });
    expectStatus(response, 404);
    expect(response.body.error.code).toBe('not_found');
    expect(await snapshot(['presets'])).toEqual(before);
  });

  it("Kestrel's lead cannot reach a Gannet member or invitation through Kestrel's own paths (404)", async () => {
    const before = await snapshot(['memberships', 'invitations']);
    const client = as(server.app, tokens.lead);
    const base = `/api/studios/${kestrel.ids.studioId}`;
    const responses = [
      await client.patch(`${base}/members/${gannet.ids.userId}`).send({ role: 'listener' }),
      await client.delete(`${base}/members/${gannet.ids.userId}`),
      await client.post(`${base}/invitations/${gannet.ids.invitationId}/resend`),
      await client.delete(`${base}/invitations/${gannet.ids.invitationId}`),
    ];
    for (const response of responses) {
      expectStatus(response, 404);
      expect(response.body.error.code).toBe('not_found');
    }
    expect(await snapshot(['memberships', 'invitations'])).toEqual(before);
  });

  it('an id that exists nowhere answers exactly like a foreign one', async () => {
    const missing = '00000000-0000-4000-8000-000000000000';
    const client = as(server.app, tokens.lead);
    const foreign = await client.get(`/api/sessions/${gannet.ids.sessionId}`);
    const absent = await client.get(`/api/sessions/${missing}`);
    expect([foreign.status, foreign.body]).toEqual([absent.status, absent.body]);
    const foreignPreset = await client.get(`/api/presets/${gannet.ids.presetId}`);
    const absentPreset = await client.get(`/api/presets/${missing}`);
    expect([foreignPreset.status, foreignPreset.body]).toEqual([absentPreset.status, absentPreset.body]);
    const foreignStudio = await client.get(`/api/studios/${gannet.ids.studioId}`);
    const absentStudio = await client.get(`/api/studios/${missing}`);
    expect([foreignStudio.status, foreignStudio.body]).toEqual([absentStudio.status, absentStudio.body]);
  });
});

describe("leaving, and changing one's own role", () => {
  it('a listener may remove themselves (leave) with 204', async () => {
    const { token, userId } = await joinByInvitation(kestrel, 'listener', 'Leaving deckhand');
    const response = await as(server.app, token).delete(`/api/studios/${kestrel.ids.studioId}/members/${userId}`);
    expectStatus(response, 204);
    expectStatus(await as(server.app, token).get(`/api/studios/${kestrel.ids.studioId}`), 404);
  });

  it('a designer may not change their own role (403, role unchanged)', async () => {
    const before = await snapshot(['memberships']);
    const response = await as(server.app, tokens.designer).patch(`/api/studios/${kestrel.ids.studioId}/members/${userIds.designer}`).send({ role: 'lead' });
    expectStatus(response, 403);
    expect(response.body.error.code).toBe('forbidden');
    expect(await snapshot(['memberships'])).toEqual(before);
  });
});
