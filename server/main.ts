import type { Server } from 'node:http';
import type { AppContext } from './app-context';
import { systemClock } from './clock';
import { CLIENT_DIST_DIR, databasePath, DEV_CLIENT_PORT, isLoopbackHost, loadServerConfig, serverHost, serverPort } from './config';
import { openDatabase } from './db/data-source';
import { startFakeSmtpServer } from './mail/fake-smtp-server';
import { createSmtpMailer } from './mail/mailer';
import { DEMO_ACCOUNTS, DEMO_PASSWORD, seedDemo } from './seed/demo-seed';
import { createTautlineServer } from './http-server';
import { RendersDirError } from './renders/renders-dir';
import { inProcessAccessEvents } from './access/access-events';

const MAIL_FROM = 'Tautline <no-reply@tautline.local>';

/**
 * Starts Tautline: opens the database and runs its migrations, seeds the demo on a fresh database,
 * connects mail (SMTP_URL, or a local fake mailbox), and serves the API (and, in production, the
 * built client) on PORT.
 */
export async function startServer(options: { serveClient: boolean }): Promise<{ server: Server; close: () => Promise<void> }> {
  const port = serverPort();
  const host = serverHost();
  const config = loadServerConfig(process.env, port);
  // In development Vite serves the pages (npm run dev) and forwards the API: its origin is the app's own.
  if (!options.serveClient) config.allowedOrigins = [...(config.allowedOrigins ?? []), `http://localhost:${DEV_CLIENT_PORT}`, `http://127.0.0.1:${DEV_CLIENT_PORT}`];
  const dataSource = await openDatabase(databasePath());
  const log = (line: string) => console.log(line);

  if (await seedDemo(dataSource, config.passwordHashCost)) {
    log('Fresh database: seeded the demo studio "Kestrel Lantern Audio". Demo-only accounts (password "' + DEMO_PASSWORD + '"):');
    for (const account of DEMO_ACCOUNTS) log(`  ${account.role.padEnd(9)} ${account.email}`);
  }

  const mailbox = process.env.SMTP_URL ? null : await startFakeSmtpServer(0, systemClock);
  const mailer = createSmtpMailer(process.env.SMTP_URL || (mailbox as NonNullable<typeof mailbox>).smtpUrl, MAIL_FROM);
  if (mailbox && config.mailboxRemote) {
    log('!!! WARNING: DEV_MAILBOX_REMOTE=true: the local mailbox at /dev/mailbox answers ANY client that can reach this server.');
    log('!!! It holds password-reset and invitation links: anyone who reads it can take over accounts. Use it only for a demo on a trusted network.');
  } else if (mailbox && !isLoopbackHost(host)) {
    // Bound where other machines can reach it: a proxy on this machine would make every visitor look local.
    config.mailboxOff = true;
    log(`!!! WARNING: no SMTP_URL and HOST=${host} (reachable from other machines): e-mail goes to a local mailbox that is NOT served, so reset and invitation links cannot be read.`);
    log('!!! Set SMTP_URL for real mail, or DEV_MAILBOX_REMOTE=true for a demo on a trusted network.');
  } else if (mailbox) {
    log('No SMTP_URL: e-mail goes to the local mailbox at /dev/mailbox, readable from this machine only');
  }
  if (!mailbox && config.mailboxRemote) log('DEV_MAILBOX_REMOTE is ignored: SMTP_URL is set, so there is no local mailbox');

  const context: AppContext = { dataSource, config, mailer, mailbox, clock: systemClock, log, access: inProcessAccessEvents() };
  const tautline = createTautlineServer(context, { clientDistDir: options.serveClient ? CLIENT_DIST_DIR : undefined });
  const server = tautline.server;
  const boundPort = await tautline.listen(port, host);
  // With PORT=0 the port is known only now; links in e-mails must carry it.
  if (!process.env.APP_URL) config.appUrl = `http://localhost:${boundPort}`;
  if (!isLoopbackHost(host) && !process.env.APP_URL) {
    log(`Note: HOST=${host} but APP_URL is unset: e-mail links point to ${config.appUrl}, and pages opened at another address may not send changes (set APP_URL, or ALLOWED_ORIGINS)`);
  }
  // Other tools read this line (`listening on http://localhost:<port>`) to find a server started with PORT=0.
  if (isLoopbackHost(host)) {
    log(`Tautline is listening on http://localhost:${boundPort} (bound to ${host}: this machine only; HOST=0.0.0.0 opens it to other machines)`);
  } else {
    log(`Tautline is listening on http://${host.includes(':') ? `[${host}]` : host}:${boundPort} (open to other machines; links point to ${config.appUrl})`);
  }

  const close = async () => {
    await tautline.close();
    mailer.close();
    await mailbox?.close();
    await dataSource.destroy();
  };
  const shutDown = () => void close().then(() => process.exit(0));
  process.once('SIGINT', shutDown);
  process.once('SIGTERM', shutDown);
  return { server, close };
}

/**
 * Starts the server, or ends the process with one plain line and exit code 1 when a setting makes
 * starting impossible (an unusable RENDERS_DIR), instead of a stack trace.
 */
export async function startServerOrExit(options: { serveClient: boolean }): Promise<void> {
  try {
    await startServer(options);
  } catch (error) {
    if (!(error instanceof RendersDirError)) throw error;
    process.stderr.write(`Tautline cannot start: ${error.message}\n`);
    process.exit(1);
  }
}

if (import.meta.url === `file://${process.argv[1]}`) await startServerOrExit({ serveClient: false });
