// @vitest-environment happy-dom
import { cleanup, screen, waitFor } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import ForgotPasswordPage from '../../../src/app/routes/forgot-password-page';
import ResetPasswordPage from '../../../src/app/routes/reset-password-page';
import { apiError, fakeApi, Landing, renderRoutes, type FakeRoute } from './fake-api';

const ROUTES = [
  { path: '/forgot-password', Component: ForgotPasswordPage },
  { path: '/reset-password', Component: ResetPasswordPage },
  { path: '/sign-in', element: <Landing name="sign in" /> },
];
const INVALID_LINK = 'This reset link is invalid, used or expired; ask for a new one';

function renderAt(path: string, routes: Record<string, FakeRoute>) {
  const api = fakeApi(routes);
  return { ...renderRoutes(ROUTES, path), api };
}

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

describe('asking for a reset link', () => {
  it('checks the address, then always answers with the same neutral message', async () => {
    const { api, user } = renderAt('/forgot-password', {
      'POST /api/auth/password-reset': { status: 202, body: { ok: true, message: 'If an account uses this address, a reset link is on its way' } },
    });
    const email = screen.getByLabelText('E-mail');
    await user.type(email, 'nobody');
    await user.click(screen.getByRole('button', { name: 'Send the link' }));
    expect(await screen.findByText('Must be an e-mail address')).toBeTruthy();
    expect(api.sent('POST', '/api/auth/password-reset')).toHaveLength(0);

    await user.clear(email);
    await user.type(email, 'pell@kestrel-lantern.example');
    await user.click(screen.getByRole('button', { name: 'Send the link' }));
    expect(await screen.findByText(/If an account uses pell@kestrel-lantern.example, a link to choose a new password is on its way/)).toBeTruthy();
    expect(api.sent('POST', '/api/auth/password-reset')[0].body).toEqual({ email: 'pell@kestrel-lantern.example' });
  });

  it('shows a refusal such as too many attempts', async () => {
    const { user } = renderAt('/forgot-password', { 'POST /api/auth/password-reset': apiError(429, 'rate_limited', 'Too many attempts; try again in a few minutes') });
    await user.type(screen.getByLabelText('E-mail'), 'pell@kestrel-lantern.example');
    await user.click(screen.getByRole('button', { name: 'Send the link' }));
    expect((await screen.findByRole('alert')).textContent).toContain('Too many attempts');
  });
});

describe('choosing a new password from the link', () => {
  it('sets the password with the token and offers to sign in', async () => {
    const { api, user } = renderAt('/reset-password?token=reset-tok-1', { 'POST /api/auth/password-reset/confirm': { status: 200, body: { ok: true } } });
    await user.type(screen.getByLabelText('New password'), 'breakwater-bass-42');
    await user.click(screen.getByRole('button', { name: 'Set the new password' }));
    const signIn = await screen.findByRole('link', { name: 'Sign in with the new password' });
    expect(signIn.getAttribute('href')).toBe('/sign-in');
    expect(api.sent('POST', '/api/auth/password-reset/confirm')[0].body).toEqual({ token: 'reset-tok-1', password: 'breakwater-bass-42' });
  });

  it('shows a weak password beside the field and a spent link with a way to ask for a new one', async () => {
    const { api, user } = renderAt('/reset-password?token=reset-tok-1', {
      'POST /api/auth/password-reset/confirm': apiError(400, 'invalid', INVALID_LINK, 'token'),
    });
    const password = screen.getByLabelText('New password');
    await user.type(password, 'password123');
    await user.click(screen.getByRole('button', { name: 'Set the new password' }));
    expect(await screen.findByText('Password is one of the most common passwords; choose another')).toBeTruthy();
    expect(api.sent('POST', '/api/auth/password-reset/confirm')).toHaveLength(0);

    await user.clear(password);
    await user.type(password, 'breakwater-bass-42');
    await user.click(screen.getByRole('button', { name: 'Set the new password' }));
    await waitFor(() => expect(screen.getByText(`${INVALID_LINK}.`)).toBeTruthy());
    expect(screen.getByRole('link', { name: 'Ask for a new link' }).getAttribute('href')).toBe('/forgot-password');
  });

  it('explains a link without a token', () => {
    renderAt('/reset-password', {});
    expect(screen.getByText('This reset link does not work')).toBeTruthy();
    expect(screen.getByRole('link', { name: 'Ask for a new link' })).toBeTruthy();
  });
});
