import type { Server } from 'node:http';
import type { AppContext } from './app-context';
import { CLIENT_DIST_DIR, databasePath, loadServerConfig, serverPort } from './config';
import { openDatabase } from './db/data-source';
import { startFakeSmtpServer } from './mail/fake-smtp-server';
import { createSmtpMailer } from './mail/mailer';
import { DEMO_ACCOUNTS, DEMO_PASSWORD, seedDemo } from './seed/demo-seed';
import { createTautlineServer } from './http-server';
import { inProcessAccessEvents } from './access/access-events';

const MAIL_FROM = 'Tautline <no-reply@tautline.local>';

/**
 * Starts Tautline: opens the database and runs its migrations, seeds the demo on a fresh database,
 * connects mail (SMTP_URL, or a local fake mailbox), and serves the API (and, in production, the
 * built client) on PORT.
 */
export async function startServer(options: { serveClient: boolean }): Promise<{ server: Server; close: () => Promise<void> }> {
  const port = serverPort();
  const config = loadServerConfig(process.env, port);
  const dataSource = await openDatabase(databasePath());
  const log = (line: string) => console.log(line);

  if (await seedDemo(dataSource, config.passwordHashCost)) {
    log('Fresh database: seeded the demo studio "Kestrel Lantern Audio". Demo-only accounts (password "' + DEMO_PASSWORD + '"):');
    for (const account of DEMO_ACCOUNTS) log(`  ${account.role.padEnd(9)} ${account.email}`);
  }

  const mailbox = process.env.SMTP_URL ? null : await startFakeSmtpServer();
  const mailer = createSmtpMailer(process.env.SMTP_URL ?? (mailbox as NonNullable<typeof mailbox>).smtpUrl, MAIL_FROM);
  if (mailbox) log('No SMTP_URL: e-mail goes to the local mailbox at /dev/mailbox');

  const context: AppContext = { dataSource, config, mailer, mailbox, clock: () => new Date(), log, access: inProcessAccessEvents() };
  const tautline = createTautlineServer(context, { clientDistDir: options.serveClient ? CLIENT_DIST_DIR : undefined });
  const server = tautline.server;
  const boundPort = await tautline.listen(port);
  // With PORT=0 the port is known only now; links in e-mails must carry it.
  if (!process.env.APP_URL) config.appUrl = `http://localhost:${boundPort}`;
  log(`Tautline is listening on http://localhost:${boundPort}`);

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

if (import.meta.url === `file://${process.argv[1]}`) await startServer({ serveClient: false });
