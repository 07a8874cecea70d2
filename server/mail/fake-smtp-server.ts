import { randomUUID } from 'node:crypto';
import type { AddressInfo } from 'node:net';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import type { MailboxMessageView } from '../../shared/api/responses';
import { systemClock } from '../clock';

/** What the mailbox keeps of each message (the same shape the API answers). */
export type MailboxMessage = MailboxMessageView;

export interface FakeMailbox {
  smtpUrl: string;
  messages(): MailboxMessage[];
  /** Resolves with the next message sent to `to` (or one already there that arrived after `since`). */
  waitFor(to: string, since?: number, timeoutMs?: number): Promise<MailboxMessage>;
  close(): Promise<void>;
}

const MAX_MESSAGES = 500;

/**
 * A local SMTP server (smtp-server) that keeps every message it receives, in memory, for the
 * development mailbox page and the tests. Listens on 127.0.0.1 only; no mail leaves the machine.
 */
export async function startFakeSmtpServer(port = 0, clock: () => Date = systemClock): Promise<FakeMailbox> {
  const stored: MailboxMessage[] = [];
  const waiters: Array<{ to: string; since: number; resolve: (message: MailboxMessage) => void }> = [];

  const server = new SMTPServer({
    secure: false,
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((parsed) => {
          const text = parsed.text ?? '';
          const message: MailboxMessage = {
            id: randomUUID(),
            to: session.envelope.rcptTo.map((rcpt) => rcpt.address.toLowerCase()),
            from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
            subject: parsed.subject ?? '',
            text,
            links: text.match(/https?:\/\/[^\s<>"]+/g) ?? [],
            receivedAt: clock().toISOString(),
          };
          stored.push(message);
          if (stored.length > MAX_MESSAGES) stored.shift();
          for (const waiter of [...waiters]) {
            if (message.to.includes(waiter.to)) {
              waiters.splice(waiters.indexOf(waiter), 1);
              waiter.resolve(message);
            }
          }
          callback();
        })
        .catch((error: Error) => callback(error));
    },
  });
  await new Promise<void>((resolve) => server.listen(port, '127.0.0.1', resolve));
  const { port: boundPort } = server.server.address() as AddressInfo;

  return {
    smtpUrl: `smtp://127.0.0.1:${boundPort}`,
    messages: () => [...stored].reverse(),
    waitFor(to, since = 0, timeoutMs = 5000) {
      const address = to.toLowerCase();
      const existing = stored.find((message) => message.to.includes(address) && Date.parse(message.receivedAt) >= since);
      if (existing) return Promise.resolve(existing);
      return new Promise((resolve, reject) => {
        const timer = setTimeout(() => reject(new Error(`no mail to ${to} within ${timeoutMs} ms`)), timeoutMs);
        waiters.push({ to: address, since, resolve: (message) => (clearTimeout(timer), resolve(message)) });
      });
    },
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
