import { request as httpRequest } from 'node:http';
import { networkInterfaces } from 'node:os';
import request from 'supertest';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { createTautlineServer } from '../../server/http-server';
import { isLocalRequest } from '../../server/http/local-request';
import { getMailbox, isMailboxOff } from '../../src/features/mailbox/api/get-mailbox';
import { registerUser, startLiveTestServer, type LiveTestServer } from '../support/test-server';

let server: LiveTestServer;
let resetToken: string;

beforeAll(async () => {
  server = await startLiveTestServer();
  await registerUser(server.app, 'wren@kestrel-lantern.example', 'Wren Halloway');
  const since = Date.now();
  expect((await request(server.app).post('/api/auth/password-reset').send({ email: 'wren@kestrel-lantern.example' })).status).toBe(202);
  // The token as the real fake SMTP server received it: no answer below may ever contain it.
  const mail = await server.mailbox.waitFor('wren@kestrel-lantern.example', since);
  resetToken = new URL(mail.links[0]).searchParams.get('token') as string;
  expect(resetToken.length).toBeGreaterThan(20);
});
afterAll(() => server.close());

/** A GET over a real socket with raw headers; the whole answer (status line, headers, body) as text. */
function rawGet(url: string, headers: Record<string, string> = {}): Promise<{ status: number; whole: string; body: string }> {
  return new Promise((resolve, reject) => {
    const outgoing = httpRequest(url, { headers }, (response) => {
      let body = '';
      response.setEncoding('utf8');
      response.on('data', (chunk: string) => (body += chunk));
      response.on('end', () => resolve({ status: response.statusCode ?? 0, whole: `${JSON.stringify(response.headers)}\n${body}`, body }));
    });
    outgoing.on('error', reject);
    outgoing.end();
  });
}

describe('the local mailbox guard (unit: the socket peer address and proxy headers)', () => {
  const from = (remoteAddress: string | undefined, headers: Record<string, string> = {}) => isLocalRequest({ socket: { remoteAddress }, headers });

  it.each(['127.0.0.1', '127.8.9.10', '::1', '::ffff:127.0.0.1'])('answers a plain request from %s', (address) => {
    expect(from(address)).toBe(true);
  });

  it.each(['192.0.2.7', '10.0.0.5', '::ffff:10.0.0.5', 'fd00::2', '128.0.0.1', '::2', undefined])('refuses a request from %s', (address) => {
    expect(from(address)).toBe(false);
  });

  it.each([
    ['x-forwarded-for', '127.0.0.1'],
    ['forwarded', 'for=127.0.0.1'],
    ['x-real-ip', '127.0.0.1'],
    ['via', '1.1 edge'],
    ['x-forwarded-host', 'localhost'],
    ['true-client-ip', '127.0.0.1'],
  ])('refuses a loopback peer that carries %s, whatever address it claims', (name, value) => {
    expect(from('127.0.0.1', { [name]: value })).toBe(false);
  });
});

describe('GET /api/dev/mailbox over real HTTP', () => {
  const url = () => `${server.baseUrl}/api/dev/mailbox`;

  it('answers a local request with the messages (the data path of the /dev/mailbox page)', async () => {
    const local = await rawGet(url());
    expect(local.status).toBe(200);
    expect(local.body).toContain(resetToken);
  });

  it('the page\'s own fetcher (src/features/mailbox) reads it from this machine', async () => {
    const realFetch = globalThis.fetch;
    globalThis.fetch = ((input: string, init?: RequestInit) => realFetch(new URL(input, server.baseUrl), init)) as typeof fetch;
    try {
      const messages = await getMailbox();
      expect(messages.some((message) => message.text.includes(resetToken))).toBe(true);
    } finally {
      globalThis.fetch = realFetch;
    }
  });

  const unknownRoute = async () => (await rawGet(`${server.baseUrl}/api/dev/no-such-thing`)).body.replace('/api/dev/no-such-thing', '/api/dev/mailbox');

  it.each([
    ['X-Forwarded-For', '127.0.0.1'],
    ['Forwarded', 'for=127.0.0.1;proto=http'],
    ['X-Real-IP', '127.0.0.1'],
    ['Via', '1.1 reverse-proxy'],
  ])('answers 404, exactly like a missing route, to a request through a proxy (%s) and never shows the token', async (name, value) => {
    const proxied = await rawGet(url(), { [name]: value });
    expect(proxied.status).toBe(404);
    expect(proxied.whole).not.toContain(resetToken);
    expect(proxied.body).toBe(await unknownRoute());
  });

  it('Express `trust proxy` cannot change the decision', async () => {
    server.app.set('trust proxy', true);
    const proxied = await request(server.app).get('/api/dev/mailbox').set('X-Forwarded-For', '127.0.0.1');
    expect(proxied.status).toBe(404);
    expect(proxied.text).not.toContain(resetToken);
    expect((await request(server.app).get('/api/dev/mailbox')).status).toBe(200);
  });

  it('the page\'s fetcher sees "no mailbox" when the request came through a proxy', async () => {
    const realFetch = globalThis.fetch;
    globalThis.fetch = ((input: string, init?: RequestInit) => realFetch(new URL(input, server.baseUrl), { ...init, headers: { 'X-Forwarded-For': '203.0.113.9' } })) as typeof fetch;
    try {
      const error = await getMailbox().then(
        () => null,
        (thrown: unknown) => thrown,
      );
      expect(isMailboxOff(error)).toBe(true);
    } finally {
      globalThis.fetch = realFetch;
    }
  });
});

describe('a server open to other machines (HOST=0.0.0.0)', () => {
  const external = Object.values(networkInterfaces())
    .flat()
    .find((address) => address && !address.internal && address.family === 'IPv4');
  let open: ReturnType<typeof createTautlineServer> | null = null;
  afterEach(async () => {
    server.context.config.mailboxRemote = false;
    await open?.close();
    open = null;
  });

  /** Starts a second server on every interface with the same context, and reads the mailbox from this machine's own non-loopback address. */
  async function readFromOtherAddress(): Promise<{ status: number; whole: string }> {
    // A machine with no address but loopback cannot make a non-loopback connection; the unit cases above cover that peer.
    if (!external) return { status: isLocalRequest({ socket: { remoteAddress: '192.0.2.7' }, headers: {} }) ? 200 : 404, whole: '' };
    open = createTautlineServer({ ...server.context, collab: undefined, renders: undefined });
    const port = await open.listen(0, '0.0.0.0');
    return rawGet(`http://${external.address}:${port}/api/dev/mailbox`);
  }

  it('answers 404 to a client at a non-loopback address, and never shows the token', async () => {
    const remote = await readFromOtherAddress();
    expect(remote.status).toBe(404);
    expect(remote.whole).not.toContain(resetToken);
  });

  it('is not served at all, even to this machine, by a server bound where other machines reach it (main.ts sets mailboxOff)', async () => {
    server.context.config.mailboxOff = true;
    try {
      const local = await rawGet(url());
      expect(local.status).toBe(404);
      expect(local.whole).not.toContain(resetToken);
    } finally {
      server.context.config.mailboxOff = false;
    }
    expect((await rawGet(url())).status).toBe(200);
  });

  it('serves other machines only with the explicit opt-in (DEV_MAILBOX_REMOTE=true)', async () => {
    server.context.config.mailboxRemote = true;
    const proxied = await rawGet(url(), { 'X-Forwarded-For': '203.0.113.9' });
    expect(proxied.status).toBe(200);
    if (external) expect((await readFromOtherAddress()).status).toBe(200);
  });

  const url = () => `${server.baseUrl}/api/dev/mailbox`;
});
