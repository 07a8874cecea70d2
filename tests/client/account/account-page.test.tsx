// @vitest-environment happy-dom
import { cleanup, screen, waitFor } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { MeResponse } from '../../../shared/api/responses';
import AccountPage from '../../../src/app/routes/account-page';
import SignedInLayout from '../../../src/app/routes/signed-in-layout';
import { apiError, fakeApi, Landing, meAs, renderRoutes, WREN, type FakeRoute } from './fake-api';

const LAST_LEAD_REFUSAL = 'You are the last lead of Kestrel Lantern Audio: make another member lead before deleting your account';

function renderAccount(extra: Record<string, FakeRoute> = {}) {
  let me: MeResponse | null = meAs('lead');
  const api = fakeApi({
    'GET /api/me': () => (me ? { status: 200, body: me } : apiError(401, 'unauthenticated', 'Sign in first')),
    ...extra,
  });
  const app = renderRoutes(
    [
      { Component: SignedInLayout, children: [{ path: '/account', Component: AccountPage }] },
      { path: '/sign-in', element: <Landing name="sign in" /> },
    ],
    '/account',
  );
  return { ...app, api, setMe: (next: MeResponse | null) => (me = next) };
}

/** The text of the error tied to a field (aria-describedby). */
function fieldError(field: HTMLElement): string {
  const ids = field.getAttribute('aria-describedby')?.split(' ') ?? [];
  return ids.map((id) => document.getElementById(id)).find((element) => element?.id.endsWith('-error'))?.textContent ?? '';
}

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

describe('the account page', () => {
  it('renames you and refreshes the signed-in user', async () => {
    const { api, user, setMe } = renderAccount({
      'PATCH /api/me': (request) => {
        const user = { ...WREN, ...(request.body as { displayName: string }) };
        setMe({ ...meAs('lead'), user });
        return { status: 200, body: { user } };
      },
    });
    const name = await screen.findByRole('textbox', { name: 'Display name' });
    const save = screen.getByRole('button', { name: 'Save name' }) as HTMLButtonElement;
    expect(save.disabled).toBe(true);
    await user.clear(name);
    await user.type(name, 'Wren H. Halloway');
    await user.click(save);
    expect(await screen.findByText('Saved: your studios now see you as Wren H. Halloway.')).toBeTruthy();
    expect(api.sent('PATCH', '/api/me')[0].body).toEqual({ displayName: 'Wren H. Halloway' });
    // The header reads `me`: it shows the new name.
    expect(screen.getByRole('link', { name: 'Wren H. Halloway' })).toBeTruthy();
  });

  it('shows the password rules and a weak new password’s problem beside the field, without asking the server', async () => {
    const { api, user } = renderAccount();
    const current = await screen.findByLabelText('Current password');
    const fresh = screen.getByLabelText('New password');
    expect(fresh.getAttribute('aria-describedby')?.split(' ').map((id) => document.getElementById(id)?.textContent)).toContain(
      'At least 10 characters, 5 or more different ones, not a common password and not your e-mail.',
    );
    await user.type(current, 'saltglass-demo');
    await user.type(fresh, 'aaaabbbbaaaa');
    await user.click(screen.getByRole('button', { name: 'Change password' }));
    expect(fieldError(fresh)).toBe('New password must use at least 5 different characters');
    expect(fresh.getAttribute('aria-invalid')).toBe('true');
    expect(api.sent('POST', '/api/me/password')).toHaveLength(0);
  });

  it('puts the server’s wrong-current-password answer beside that field', async () => {
    const { api, user } = renderAccount({ 'POST /api/me/password': apiError(400, 'invalid', 'currentPassword is wrong', 'currentPassword') });
    const current = await screen.findByLabelText('Current password');
    await user.type(current, 'not-my-password');
    await user.type(screen.getByLabelText('New password'), 'harbour-lamp-wire-7');
    await user.click(screen.getByRole('button', { name: 'Change password' }));
    await waitFor(() => expect(fieldError(current)).toBe('Current password is wrong'));
    expect(api.sent('POST', '/api/me/password')[0].body).toEqual({ currentPassword: 'not-my-password', newPassword: 'harbour-lamp-wire-7' });
  });

  it('refuses to delete the last lead’s account and shows the server’s message naming the studio', async () => {
    const { api, user, router } = renderAccount({ 'DELETE /api/me': apiError(409, 'conflict', LAST_LEAD_REFUSAL) });
    await user.click(await screen.findByRole('button', { name: 'Delete my account…' }));
    const password = screen.getByLabelText('Type your password to confirm');
    expect(document.activeElement).toBe(password);
    await user.type(password, 'saltglass-demo');
    await user.click(screen.getByRole('button', { name: 'Delete my account for good' }));
    const alert = await screen.findByRole('alert');
    expect(alert.textContent).toContain('Your account was not deleted');
    expect(alert.textContent).toContain(LAST_LEAD_REFUSAL);
    expect(api.sent('DELETE', '/api/me')[0].body).toEqual({ password: 'saltglass-demo' });
    expect(router.state.location.pathname).toBe('/account');
  });

  it('shows a wrong password beside the confirmation field', async () => {
    const { user } = renderAccount({ 'DELETE /api/me': apiError(400, 'invalid', 'password is wrong', 'password') });
    await user.click(await screen.findByRole('button', { name: 'Delete my account…' }));
    const password = screen.getByLabelText('Type your password to confirm');
    await user.type(password, 'not-it');
    await user.click(screen.getByRole('button', { name: 'Delete my account for good' }));
    await waitFor(() => expect(fieldError(password)).toBe('Password is wrong'));
  });

  it('deletes the account and goes to sign-in', async () => {
    const { user, router, queryClient, setMe } = renderAccount({
      'DELETE /api/me': () => {
        setMe(null);
        return { status: 204 };
      },
    });
    await user.click(await screen.findByRole('button', { name: 'Delete my account…' }));
    await user.type(screen.getByLabelText('Type your password to confirm'), 'saltglass-demo');
    await user.click(screen.getByRole('button', { name: 'Delete my account for good' }));
    expect(await screen.findByText('Landed on sign in')).toBeTruthy();
    expect(router.state.location.pathname).toBe('/sign-in');
    expect(router.state.location.search).toBe('');
    expect(queryClient.getQueryData(['me'])).toBeNull();
  });

  it('withdraws the deletion form and returns focus to its button', async () => {
    const { user } = renderAccount();
    const open = await screen.findByRole('button', { name: 'Delete my account…' });
    await user.click(open);
    await user.click(screen.getByRole('button', { name: 'Keep my account' }));
    expect(screen.queryByLabelText('Type your password to confirm')).toBeNull();
    expect(document.activeElement).toBe(screen.getByRole('button', { name: 'Delete my account…' }));
  });
});
