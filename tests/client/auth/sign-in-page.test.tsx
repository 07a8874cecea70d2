// @vitest-environment happy-dom
import { cleanup, fireEvent, screen, waitFor } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import SignInPage from '../../../src/app/routes/sign-in-page';
import { fakeFetch, renderAt } from '../render-page';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const me = { user: { id: 'u1', email: 'wren@kestrel-lantern.example', displayName: 'Wren Halloway', createdAt: '2026-12-01T00:00:00.000Z' }, studios: [] };

describe('sign-in form', () => {
  it('checks the fields in the browser first, each error tied to its field, without calling the server', async () => {
    const fake = fakeFetch({});
    vi.stubGlobal('fetch', fake.fetchImpl);
    renderAt('/sign-in', [{ path: '/sign-in', element: <SignInPage /> }]);
    fireEvent.change(screen.getByLabelText('E-mail'), { target: { value: 'not-an-address' } });
    fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    const email = screen.getByLabelText('E-mail');
    await waitFor(() => expect(email.getAttribute('aria-invalid')).toBe('true'));
    const described = email.getAttribute('aria-describedby') as string;
    expect(document.getElementById(described.split(' ')[0])?.textContent).toBe('Must be an e-mail address');
    expect(screen.getByLabelText('Password').getAttribute('aria-invalid')).toBe('true');
    expect(fake.calls).toHaveLength(0);
  });

  it('shows the server’s refusal and stays on the page', async () => {
    const fake = fakeFetch({ 'POST /api/auth/login': () => ({ status: 401, body: { error: { code: 'unauthenticated', message: 'E-mail or password is wrong' } } }) });
    vi.stubGlobal('fetch', fake.fetchImpl);
    renderAt('/sign-in', [{ path: '/sign-in', element: <SignInPage /> }]);
    fireEvent.change(screen.getByLabelText('E-mail'), { target: { value: 'wren@kestrel-lantern.example' } });
    fireEvent.change(screen.getByLabelText('Password'), { target: { value: 'not-the-password' } });
    fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    expect((await screen.findByRole('alert')).textContent).toBe('E-mail or password is wrong');
    expect(fake.calls[0]).toMatchObject({ method: 'POST', path: '/api/auth/login', body: { email: 'wren@kestrel-lantern.example', password: 'not-the-password' } });
  });

  it('returns to the page that sent the person to sign in, and only to pages of ours', async () => {
    const fake = fakeFetch({ 'POST /api/auth/login': () => ({ body: { token: 't', user: me.user } }), 'GET /api/me': () => ({ body: me }) });
    vi.stubGlobal('fetch', fake.fetchImpl);
    const { router } = renderAt('/sign-in?next=%2Fstudios%2Fabc%2Fpresets', [
      { path: '/sign-in', element: <SignInPage /> },
      { path: '/studios/:id/presets', element: <p>presets page</p> },
    ]);
    expect(screen.getByRole('status').textContent).toBe('Sign in to continue where you were.');
    fireEvent.change(screen.getByLabelText('E-mail'), { target: { value: 'wren@kestrel-lantern.example' } });
    fireEvent.change(screen.getByLabelText('Password'), { target: { value: 'saltglass-demo' } });
    fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    await screen.findByText('presets page');
    expect(router.state.location.pathname).toBe('/studios/abc/presets');
    // The user was fetched before navigating, so the next page sees who is signed in.
    expect(fake.calls.map((call) => `${call.method} ${call.path}`)).toEqual(['POST /api/auth/login', 'GET /api/me']);
  });
});
