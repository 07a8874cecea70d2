// @vitest-environment happy-dom
import { cleanup, screen, waitFor } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { InvitationPreview, MeResponse } from '../../../shared/api/responses';
import AcceptInvitationPage from '../../../src/app/routes/accept-invitation-page';
import { apiError, fakeApi, Landing, meAs, renderRoutes, STUDIO, WREN, type FakeRoute } from './fake-api';

const TOKEN = 'tok-quayside-7f3a';
const PAGE = `/invitations/accept?token=${TOKEN}`;
const PREVIEW_PATH = `/api/invitations/${TOKEN}`;

const forNewAddress: InvitationPreview = {
  studioName: 'Kestrel Lantern Audio',
  email: 'ines@kestrel-lantern.example',
  role: 'designer',
  expiresAt: '2099-12-08T10:00:00.000Z',
  hasAccount: false,
};
const forWren: InvitationPreview = { ...forNewAddress, email: WREN.email, role: 'producer', hasAccount: true };
const INES = { id: 'user-ines', email: forNewAddress.email, displayName: 'Inès Marlowe', createdAt: '2025-12-02T08:00:00.000Z' };

function renderAccept(preview: FakeRoute, extra: Record<string, FakeRoute> = {}, signedIn: MeResponse | null = null) {
  let me = signedIn;
  const api = fakeApi({
    'GET /api/me': () => (me ? { status: 200, body: me } : apiError(401, 'unauthenticated', 'Sign in first')),
    [`GET ${PREVIEW_PATH}`]: preview,
    ...extra,
  });
  const app = renderRoutes(
    [
      { path: '/invitations/accept', Component: AcceptInvitationPage },
      { path: '/studios/:studioId', element: <Landing name="the studio" /> },
      { path: '/sign-in', element: <Landing name="sign in" /> },
    ],
    PAGE,
  );
  return { ...app, api, setMe: (next: MeResponse | null) => (me = next) };
}

function fieldError(field: HTMLElement): string {
  const ids = field.getAttribute('aria-describedby')?.split(' ') ?? [];
  return ids.map((id) => document.getElementById(id)).find((element) => element?.id.endsWith('-error'))?.textContent ?? '';
}

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

describe('the accept-invitation page', () => {
  it('shows what the invitation offers', async () => {
    renderAccept({ status: 200, body: { invitation: forNewAddress } });
    expect(await screen.findByRole('heading', { name: 'Join Kestrel Lantern Audio' })).toBeTruthy();
    expect(screen.getByText('Designer')).toBeTruthy();
    expect(screen.getAllByText(/ines@kestrel-lantern.example/).length).toBeGreaterThan(0);
  });

  it('creates the account of a new address, refreshes the signed-in user and opens the studio', async () => {
    const { api, user, router, queryClient, setMe } = renderAccept(
      { status: 200, body: { invitation: forNewAddress } },
      {
        'POST /api/invitations/accept': () => {
          setMe({ user: INES, studios: [{ ...STUDIO, role: 'designer' }] });
          return { status: 200, body: { token: 'jwt', user: INES, studioId: STUDIO.id, role: 'designer' } };
        },
      },
    );
    await user.type(await screen.findByLabelText('Your name'), 'Inès Marlowe');
    await user.type(screen.getByLabelText('Password'), 'harbour-lamp-wire-7');
    await user.click(screen.getByRole('button', { name: 'Create account and join' }));
    expect(await screen.findByText('Landed on the studio')).toBeTruthy();
    expect(router.state.location.pathname).toBe(`/studios/${STUDIO.id}`);
    expect(api.sent('POST', '/api/invitations/accept').map((request) => request.body)).toEqual([
      { token: TOKEN, displayName: 'Inès Marlowe', password: 'harbour-lamp-wire-7' },
    ]);
    expect((queryClient.getQueryData(['me']) as MeResponse).user.email).toBe('ines@kestrel-lantern.example');
  });

  it('shows the password rules, and a weak password’s problem beside the field without asking the server', async () => {
    const { api, user } = renderAccept({ status: 200, body: { invitation: forNewAddress } });
    const password = await screen.findByLabelText('Password');
    const described = password.getAttribute('aria-describedby')?.split(' ').map((id) => document.getElementById(id)?.textContent);
    expect(described).toContain('At least 10 characters, 5 or more different ones, not a common password and not your e-mail.');
    await user.type(screen.getByLabelText('Your name'), 'Inès Marlowe');
    await user.type(password, 'short');
    await user.click(screen.getByRole('button', { name: 'Create account and join' }));
    expect(fieldError(password)).toBe('Password must be at least 10 characters');
    expect(password.getAttribute('aria-invalid')).toBe('true');
    expect(api.sent('POST', '/api/invitations/accept')).toHaveLength(0);
  });

  it('puts the server’s password answer beside the field', async () => {
    const { user } = renderAccept(
      { status: 200, body: { invitation: forNewAddress } },
      { 'POST /api/invitations/accept': apiError(400, 'invalid', 'password must not contain your e-mail address', 'password') },
    );
    await user.type(await screen.findByLabelText('Your name'), 'Inès Marlowe');
    const password = screen.getByLabelText('Password');
    await user.type(password, 'harbour-lamp-wire-7');
    await user.click(screen.getByRole('button', { name: 'Create account and join' }));
    await waitFor(() => expect(fieldError(password)).toBe('Password must not contain your e-mail address'));
  });

  it('sends an existing account that is signed out to sign in, and back here afterwards', async () => {
    renderAccept({ status: 200, body: { invitation: forWren } });
    const link = await screen.findByRole('link', { name: `Sign in as ${WREN.email}` });
    expect(link.getAttribute('href')).toBe(`/sign-in?next=${encodeURIComponent(PAGE)}`);
    expect(screen.queryByRole('button', { name: /Join/ })).toBeNull();
  });

  it('lets the invitee who is signed in accept with the token alone', async () => {
    const { api, user, router } = renderAccept(
      { status: 200, body: { invitation: forWren } },
      { 'POST /api/invitations/accept': { status: 200, body: { token: 'jwt', user: WREN, studioId: STUDIO.id, role: 'producer' } } },
      meAs('lead', WREN, []),
    );
    await user.click(await screen.findByRole('button', { name: 'Join Kestrel Lantern Audio' }));
    await waitFor(() => expect(router.state.location.pathname).toBe(`/studios/${STUDIO.id}`));
    expect(api.sent('POST', '/api/invitations/accept')[0].body).toEqual({ token: TOKEN });
  });

  it('tells someone signed in as another address to switch accounts', async () => {
    const other = { ...WREN, id: 'user-tamsin', email: 'tamsin@kestrel-lantern.example', displayName: 'Tamsin Okafor' };
    renderAccept({ status: 200, body: { invitation: forWren } }, {}, meAs('designer', other));
    expect(await screen.findByText(`This invitation is for ${WREN.email}`)).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Sign out of tamsin@kestrel-lantern.example' })).toBeTruthy();
  });

  it('says clearly when the invitation is unknown, used or expired', async () => {
    renderAccept(apiError(404, 'not_found', 'Invitation not found'));
    expect((await screen.findByRole('alert')).textContent).toContain('This invitation is not valid');
    cleanup();

    renderAccept(apiError(409, 'conflict', 'This invitation has already been used', 'token'));
    const used = await screen.findByRole('alert');
    expect(used.textContent).toContain('This invitation can no longer be used');
    expect(used.textContent).toContain('This invitation has already been used');
    cleanup();

    renderAccept(apiError(409, 'conflict', 'This invitation has expired; ask the studio lead to send a new one', 'token'));
    expect((await screen.findByRole('alert')).textContent).toContain('has expired; ask the studio lead to send a new one');
  });

  it('shows a used link’s 409 when someone else accepted first', async () => {
    const { user } = renderAccept(
      { status: 200, body: { invitation: forNewAddress } },
      { 'POST /api/invitations/accept': apiError(409, 'conflict', 'This invitation has already been used', 'token') },
    );
    await user.type(await screen.findByLabelText('Your name'), 'Inès Marlowe');
    await user.type(screen.getByLabelText('Password'), 'harbour-lamp-wire-7');
    await user.click(screen.getByRole('button', { name: 'Create account and join' }));
    const alert = await screen.findByRole('alert');
    expect(alert.textContent).toContain('You have not joined yet');
    expect(alert.textContent).toContain('This invitation has already been used');
  });
});
