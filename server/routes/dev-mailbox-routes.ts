import { Router } from 'express';
import type { AppContext } from '../app-context';
import type { FakeMailbox } from '../mail/fake-smtp-server';

/**
 * The local mailbox (only when mail goes to the in-process fake SMTP server, never with SMTP_URL):
 * `GET /api/dev/mailbox` lists what it received; the web app's `/dev/mailbox` page shows it.
 */
export function devMailboxRoutes(_context: AppContext, mailbox: FakeMailbox): Router {
  const api = Router();
  api.get('/dev/mailbox', (_request, response) => {
    response.json({ messages: mailbox.messages() });
  });
  return api;
}
