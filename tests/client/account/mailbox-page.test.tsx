// @vitest-environment happy-dom
import { cleanup, screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { MailboxMessageView } from '../../../shared/api/responses';
import MailboxPage from '../../../src/app/routes/mailbox-page';
import { getMailboxQueryOptions, MAILBOX_REFRESH_MS } from '../../../src/features/mailbox/api/get-mailbox';
import { appPath, splitLinks } from '../../../src/features/mailbox/local-links';
import { ApiRequestError } from '../../../src/lib/api-error';
import { apiError, fakeApi, Landing, renderRoutes, type FakeRoute } from './fake-api';

function renderMailbox(answer: FakeRoute) {
  const api = fakeApi({ 'GET /api/dev/mailbox': answer });
  return { ...renderRoutes([{ path: '/dev/mailbox', Component: MailboxPage }, { path: '/reset-password', element: <Landing name="reset" /> }], '/dev/mailbox'), api };
}

const message = (id: string, subject: string, text: string, receivedAt: string): MailboxMessageView => ({
  id,
  to: ['pell@kestrel-lantern.example'],
  from: 'no-reply@tautline.local',
  subject,
  text,
  links: [],
  receivedAt,
});

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

describe('the local mailbox page', () => {
  it('lists mail newest first with links that open inside the app', async () => {
    const origin = window.location.origin;
    const { user, router } = renderMailbox({
      status: 200,
      body: {
        messages: [
          message('m1', 'Wren Halloway invited you to Kestrel Lantern Audio on Tautline', 'Accept the invitation: https://elsewhere.example/join', '2025-12-01T10:00:00.000Z'),
          message('m2', 'Reset your Tautline password', `Choose a new password: ${origin}/reset-password?token=abc.\nThanks`, '2025-12-01T11:00:00.000Z'),
        ],
      },
    });
    const list = await screen.findByRole('list', { name: 'Messages, newest first' });
    const headings = within(list).getAllByRole('heading').map((heading) => heading.textContent);
    expect(headings).toEqual(['Reset your Tautline password', 'Wren Halloway invited you to Kestrel Lantern Audio on Tautline']);
    const inApp = screen.getByRole('link', { name: `${origin}/reset-password?token=abc` });
    expect(inApp.getAttribute('href')).toBe('/reset-password?token=abc');
    const outside = screen.getByRole('link', { name: 'https://elsewhere.example/join' });
    expect(outside.getAttribute('href')).toBe('https://elsewhere.example/join');
    expect(outside.getAttribute('target')).toBe('_blank');
    await user.click(inApp);
    expect(await screen.findByText('Landed on reset')).toBeTruthy();
    expect(router.state.location.search).toBe('?token=abc');
  });

  it('says the mailbox is off when the server sends real e-mail', async () => {
    renderMailbox(apiError(404, 'not_found', 'No API route GET /api/dev/mailbox'));
    expect(await screen.findByText('The local mailbox is off: this server sends real e-mail.')).toBeTruthy();
  });

  it('says when no mail came yet, and shows new mail without a reload', async () => {
    let messages: MailboxMessageView[] = [];
    const { api } = renderMailbox(() => ({ status: 200, body: { messages } }));
    expect(await screen.findByText('No mail yet')).toBeTruthy();
    messages = [message('m3', 'Reset your Tautline password', 'Choose a new password', new Date().toISOString())];
    expect(await screen.findByText('Choose a new password', {}, { timeout: MAILBOX_REFRESH_MS + 1500 })).toBeTruthy();
    expect(api.sent('GET', '/api/dev/mailbox').length).toBeGreaterThanOrEqual(2);
  });

  it('polls every 3 s, and stops once the server says there is no mailbox', () => {
    const interval = getMailboxQueryOptions().refetchInterval as (query: { state: { error: unknown } }) => number | false;
    expect(MAILBOX_REFRESH_MS).toBe(3000);
    expect(interval({ state: { error: null } })).toBe(3000);
    expect(interval({ state: { error: new ApiRequestError(0, 'network', 'offline') } })).toBe(3000);
    expect(interval({ state: { error: new ApiRequestError(404, 'not_found', 'No API route') } })).toBe(false);
  });
});

describe('links in mail text', () => {
  it('leave sentence punctuation outside the link', () => {
    expect(splitLinks('Go to http://localhost:3000/a?b=1. Then rest')).toEqual([
      { kind: 'text', text: 'Go to ' },
      { kind: 'link', href: 'http://localhost:3000/a?b=1' },
      { kind: 'text', text: '. Then rest' },
    ]);
  });

  it('become app paths on this origin, and on any local port in a development build', () => {
    expect(appPath('http://localhost:3000/invitations/accept?token=t', 'http://localhost:3000', false)).toBe('/invitations/accept?token=t');
    expect(appPath('http://localhost:3000/invitations/accept?token=t', 'http://localhost:5173', false)).toBeNull();
    expect(appPath('http://localhost:3000/invitations/accept?token=t', 'http://localhost:5173', true)).toBe('/invitations/accept?token=t');
    expect(appPath('https://tautline.example/x', 'http://localhost:5173', true)).toBeNull();
    expect(appPath('http://localhost:30001/x', 'http://localhost:3000', false)).toBeNull();
  });
});
