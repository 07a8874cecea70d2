import { Router } from 'express';
import type { AppContext } from '../app-context';
import type { FakeMailbox } from '../mail/fake-smtp-server';

const escape = (text: string) => text.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

/**
 * The local mailbox (only when mail goes to the in-process fake SMTP server, never with SMTP_URL):
 * `GET /api/dev/mailbox` as JSON, and `/dev/mailbox` as a plain page with clickable links.
 */
export function devMailboxRoutes(_context: AppContext, mailbox: FakeMailbox): { api: Router; page: Router } {
  const api = Router();
  api.get('/dev/mailbox', (_request, response) => {
    response.json({ messages: mailbox.messages() });
  });
  const page = Router();
  page.get('/dev/mailbox', (_request, response) => {
    const items = mailbox
      .messages()
      .map((message) => {
        const body = escape(message.text).replace(/https?:\/\/[^\s&]+/g, (link) => `<a href="${link}">${link}</a>`);
        return `<article><h2>${escape(message.subject)}</h2><p class="meta">to ${escape(message.to.join(', '))} · ${escape(message.receivedAt)}</p><pre>${body}</pre></article>`;
      })
      .join('\n');
    response.type('html').send(`<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Tautline · local mailbox</title>
<style>body{font-family:system-ui,sans-serif;max-width:52rem;margin:2rem auto;padding:0 1rem;background:#171b22;color:#e6e9ef}
a{color:#e8b64f}article{border-top:1px solid #323a4a;padding:1rem 0}.meta{color:#b7bfcc;font-size:.9rem}pre{white-space:pre-wrap}</style></head>
<body><h1>Local mailbox</h1><p class="meta">Mail the server sent while no SMTP_URL is set. Newest first; kept in memory until restart.</p>
${items || '<p>No mail yet.</p>'}</body></html>`);
  });
  return { api, page };
}
