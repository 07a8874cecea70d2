// @vitest-environment happy-dom
import { cleanup, fireEvent, screen, waitFor } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { apiErrorBody } from '../../../shared/api/error-body';
import RegisterPage from '../../../src/app/routes/register-page';
import { fakeFetch, renderAt } from '../render-page';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

/** The text of the error tied to a field (aria-describedby). */
function errorOf(label: string): string | null {
  const field = screen.getByLabelText(label);
  const ids = field.getAttribute('aria-describedby')?.split(' ') ?? [];
  return ids.map((id) => document.getElementById(id)?.textContent ?? '').find((text) => text !== '') ?? null;
}

function fillAndSend() {
  fireEvent.change(screen.getByLabelText('Your name'), { target: { value: 'Perpetua Oyelaran' } });
  fireEvent.change(screen.getByLabelText('E-mail'), { target: { value: 'perpetua@saltglass-reach.example' } });
  fireEvent.change(screen.getByLabelText('Password'), { target: { value: 'tidal-lantern-walk-9' } });
  fireEvent.click(screen.getByRole('button', { name: 'Create account' }));
}

describe('register form: the server’s field problems come from issues', () => {
  it('puts each listed issue’s problem under its own field', async () => {
    const name = { field: 'displayName', problem: 'must not be only spaces', got: '"Perpetua Oyelaran"', message: 'displayName must not be only spaces, got "Perpetua Oyelaran"' };
    const email = { field: 'email', problem: 'must use a domain that takes mail', got: '"perpetua@saltglass-reach.example"', message: 'email must use a domain that takes mail, got "perpetua@saltglass-reach.example"' };
    const fake = fakeFetch({ 'POST /api/auth/register': () => ({ status: 400, body: apiErrorBody(400, 'invalid', `${name.message} (and 1 more)`, name.field, [name, email]) }) });
    vi.stubGlobal('fetch', fake.fetchImpl);
    renderAt('/register', [{ path: '/register', element: <RegisterPage /> }]);
    fillAndSend();
    await waitFor(() => expect(errorOf('Your name')).toBe('Must not be only spaces'));
    expect(errorOf('E-mail')).toBe('Must use a domain that takes mail');
    expect(screen.getByLabelText('E-mail').getAttribute('aria-invalid')).toBe('true');
    expect(fake.calls.filter((call) => call.path === '/api/auth/register')).toHaveLength(1);
  });

  it('shows a single problem from its one-item issues list (a refused address, 409) under E-mail', async () => {
    const refused = 'Could not create an account with this address. If you already have one, sign in or reset your password';
    const fake = fakeFetch({ 'POST /api/auth/register': () => ({ status: 409, body: apiErrorBody(409, 'conflict', refused, 'email') }) });
    vi.stubGlobal('fetch', fake.fetchImpl);
    renderAt('/register', [{ path: '/register', element: <RegisterPage /> }]);
    fillAndSend();
    await waitFor(() => expect(errorOf('E-mail')).toBe(refused));
    // The problem sits under its field, so no general notice repeats it.
    expect(screen.queryByRole('alert', { name: refused })).toBeNull();
  });
});
