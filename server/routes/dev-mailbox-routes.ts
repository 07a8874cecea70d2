import { Router } from 'express';
import type { AppContext } from '../app-context';
import { ApiError } from '../http/api-error';
import { isLocalRequest } from '../http/local-request';
import type { FakeMailbox } from '../mail/fake-smtp-server';

/**
 * The local mailbox (only when mail goes to the in-process fake SMTP server, never with SMTP_URL):
 * `GET /api/dev/mailbox` lists what it received; the web app's `/dev/mailbox` page shows it.
 *
 * It holds password-reset and invitation links, so it answers only requests from this machine
 * (`isLocalRequest`: a loopback peer, no proxy headers). Anyone else gets the same 404 as a
 * server with no mailbox. DEV_MAILBOX_REMOTE=true (`config.mailboxRemote`) opens it to every
 * client, for a demo on a shared network; the server warns loudly at start.
 */
export function devMailboxRoutes(context: AppContext, mailbox: FakeMailbox): Router {
  const api = Router();
  api.get('/dev/mailbox', (request, response) => {
    const served = context.config.mailboxRemote || (!context.config.mailboxOff && isLocalRequest(request));
    if (!served) {
      throw new ApiError(404, 'not_found', `No API route ${request.method} ${request.originalUrl}`);
    }
    response.setHeader('Cache-Control', 'no-store');
    response.json({ messages: mailbox.messages() });
  });
  return api;
}
