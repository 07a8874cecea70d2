import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import type { Express } from 'express';
import type { DataSource } from 'typeorm';
import { inProcessAccessEvents } from '../../server/access/access-events';
import { createApp } from '../../server/app';
import { createTautlineServer, type TautlineServer } from '../../server/http-server';
import type { AppContext, ServerConfig } from '../../server/app-context';
import { openDatabase } from '../../server/db/data-source';
import { startFakeSmtpServer, type FakeMailbox } from '../../server/mail/fake-smtp-server';
import { createSmtpMailer } from '../../server/mail/mailer';

export interface TestServer {
  app: Express;
  context: AppContext;
  dataSource: DataSource;
  mailbox: FakeMailbox;
  databasePath: string;
  /** Moves the server's clock forward (invitation and reset expiry). */
  advanceClock(ms: number): void;
  close(): Promise<void>;
}

export interface LiveTestServer extends TestServer {
  tautline: TautlineServer;
  baseUrl: string;
}

/**
 * The real app on a temporary SQLite file, with the real fake SMTP server: nothing mocked. scrypt
 * runs at a lower cost (2^10) than production (2^15) so the suite stays quick.
 */
export async function startTestServer(overrides: Partial<ServerConfig> = {}, databasePathGiven?: string): Promise<TestServer> {
  const dir = mkdtempSync(join(tmpdir(), 'tautline-server-'));
  const databasePath = databasePathGiven ?? join(dir, 'test.sqlite');
  const dataSource = await openDatabase(databasePath);
  const mailbox = await startFakeSmtpServer();
  const mailer = createSmtpMailer(mailbox.smtpUrl, 'Tautline <no-reply@tautline.test>');
  let offsetMs = 0;
  const config: ServerConfig = {
    appUrl: 'http://localhost:3000',
    jwtSecret: randomBytes(32).toString('hex'),
    tokenLifetimeS: 3600,
    passwordHashCost: 10,
    invitationLifetimeS: 7 * 24 * 3600,
    passwordResetLifetimeS: 3600,
    authRateLimit: { windowMs: 60_000, limit: 10_000 },
    secureCookies: false,
    rendersDir: join(dir, 'renders'),
    renderQuotaBytes: 512 * 1024 * 1024,
    ...overrides,
  };
  const context: AppContext = { dataSource, config, mailer, mailbox, clock: () => new Date(Date.now() + offsetMs), log: () => {}, access: inProcessAccessEvents() };
  return {
    app: createApp(context),
    context,
    dataSource,
    mailbox,
    databasePath,
    advanceClock: (ms) => {
      offsetMs += ms;
    },
    close: async () => {
      await context.renders?.close();
      mailer.close();
      await mailbox.close();
      await dataSource.destroy();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}

/**
 * The whole server listening on a loopback port: the REST API, the Yjs endpoint under /collab/
 * and the socket.io compute channel, over real sockets. Pass a database path to restart on it.
 */
export async function startLiveTestServer(options: { databasePath?: string; previewDurationS?: number; jwtSecret?: string } = {}): Promise<LiveTestServer> {
  const base = await startTestServer(options.jwtSecret ? { jwtSecret: options.jwtSecret } : {}, options.databasePath);
  const tautline = createTautlineServer(base.context, { previewDurationS: options.previewDurationS ?? 0.5 });
  const port = await tautline.listen(0);
  return {
    ...base,
    tautline,
    baseUrl: `http://127.0.0.1:${port}`,
    close: async () => {
      await tautline.close();
      await base.close();
    },
  };
}

export const TEST_PASSWORD = 'quiet-harbour-42';

/** Registers an account and returns its Bearer token and id. */
export async function registerUser(app: Express, email: string, displayName = email.split('@')[0]): Promise<{ token: string; id: string }> {
  const response = await request(app).post('/api/auth/register').send({ email, password: TEST_PASSWORD, displayName });
  if (response.status !== 201) throw new Error(`register ${email}: ${response.status} ${JSON.stringify(response.body)}`);
  return { token: response.body.token, id: response.body.user.id };
}

/** A supertest request with the Bearer token set. */
export function as(app: Express, token: string) {
  const auth = (test: request.Test) => test.set('Authorization', `Bearer ${token}`);
  return {
    get: (url: string) => auth(request(app).get(url)),
    post: (url: string) => auth(request(app).post(url)),
    patch: (url: string) => auth(request(app).patch(url)),
    delete: (url: string) => auth(request(app).delete(url)),
  };
}

/** Counts the rows of a table (to prove a refused request changed nothing). */
export async function rowCount(dataSource: DataSource, table: string): Promise<number> {
  const [row] = await dataSource.query(`SELECT COUNT(*) AS n FROM "${table}"`);
  return Number(row.n);
}
