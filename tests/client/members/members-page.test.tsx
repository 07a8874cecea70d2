// @vitest-environment happy-dom
import { cleanup, fireEvent, screen, waitFor, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { InvitationView, MemberView } from '../../../shared/api/responses';
import MembersPage from '../../../src/app/routes/members-page';
import { apiError, fakeApi, Landing, meAs, member, renderRoutes, STUDIO, type FakeRoute } from '../account/fake-api';

const LAST_LEAD = 'A studio keeps at least one lead: make another member lead first';
const MEMBERS_PATH = `/api/studios/${STUDIO.id}/members`;
const INVITATIONS_PATH = `/api/studios/${STUDIO.id}/invitations`;

const wren = member('user-wren', 'Wren Halloway', 'wren@kestrel-lantern.example', 'lead');
const tamsin = member('user-tamsin', 'Tamsin Okafor', 'tamsin@kestrel-lantern.example', 'designer');
const joaquin = member('user-joaquin', 'Joaquín Reyes', 'joaquin@kestrel-lantern.example', 'producer');
const pell = member('user-pell', 'Pell Ashby', 'pell@kestrel-lantern.example', 'listener', null);

const invitation: InvitationView = {
  id: 'invite-1',
  email: 'marlo@kestrel-lantern.example',
  role: 'designer',
  sentAt: '2025-12-01T10:00:00.000Z',
  expiresAt: '2099-12-08T10:00:00.000Z',
  acceptedAt: null,
};

function renderMembers(members: MemberView[], extra: Record<string, FakeRoute> = {}, role: MemberView['role'] = 'lead') {
  const api = fakeApi({
    'GET /api/me': { status: 200, body: meAs(role) },
    [`GET ${MEMBERS_PATH}`]: { status: 200, body: { members } },
    [`GET ${INVITATIONS_PATH}`]: { status: 200, body: { invitations: [invitation] } },
    ...extra,
  });
  const app = renderRoutes(
    [
      { path: '/studios/:studioId/members', Component: MembersPage },
      { path: '/', element: <Landing name="home" /> },
    ],
    `/studios/${STUDIO.id}/members`,
  );
  return { ...app, api };
}

const row = (name: string) => screen.getByRole('row', { name: new RegExp(name) });

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

describe('the members page', () => {
  it('lists the members with their roles, e-mail and last visit', async () => {
    renderMembers([wren, tamsin, joaquin, pell]);
    const table = await screen.findByRole('table', { name: 'Members of Kestrel Lantern Audio' });
    expect(within(table).getAllByRole('row')).toHaveLength(5);
    expect((screen.getByRole('combobox', { name: 'Role of Wren Halloway' }) as HTMLSelectElement).value).toBe('lead');
    expect((screen.getByRole('combobox', { name: 'Role of Tamsin Okafor' }) as HTMLSelectElement).value).toBe('designer');
    expect((screen.getByRole('combobox', { name: 'Role of Joaquín Reyes' }) as HTMLSelectElement).value).toBe('producer');
    expect((screen.getByRole('combobox', { name: 'Role of Pell Ashby' }) as HTMLSelectElement).value).toBe('listener');
    expect(within(row('Tamsin Okafor')).getByText('tamsin@kestrel-lantern.example')).toBeTruthy();
    expect(within(row('Pell Ashby')).getByText('Not yet')).toBeTruthy();
    expect(within(row('Wren Halloway')).getByText('you')).toBeTruthy();
  });

  it('locks the only lead’s role and removal, and says why', async () => {
    renderMembers([wren, tamsin]);
    const select = (await screen.findByRole('combobox', { name: 'Role of Wren Halloway' })) as HTMLSelectElement;
    expect(select.disabled).toBe(true);
    expect(select.title).toBe(LAST_LEAD);
    expect(select.getAttribute('aria-description')).toBe(LAST_LEAD);
    const leave = screen.getByRole('button', { name: 'Leave Kestrel Lantern Audio' }) as HTMLButtonElement;
    expect(leave.disabled).toBe(true);
    expect(leave.title).toBe(LAST_LEAD);
    // The others stay editable.
    expect((screen.getByRole('combobox', { name: 'Role of Tamsin Okafor' }) as HTMLSelectElement).disabled).toBe(false);
    expect((screen.getByRole('button', { name: 'Remove Tamsin Okafor' }) as HTMLButtonElement).disabled).toBe(false);
    expect(screen.getByText(/You are the only lead/)).toBeTruthy();
  });

  it('changes a role with PATCH and shows the new list', async () => {
    let members = [wren, tamsin];
    const { api } = renderMembers([], {
      [`GET ${MEMBERS_PATH}`]: () => ({ status: 200, body: { members } }),
      [`PATCH ${MEMBERS_PATH}/user-tamsin`]: (request) => {
        members = [wren, { ...tamsin, role: (request.body as { role: MemberView['role'] }).role }];
        return { status: 200, body: { members } };
      },
    });
    const select = (await screen.findByRole('combobox', { name: 'Role of Tamsin Okafor' })) as HTMLSelectElement;
    fireEvent.change(select, { target: { value: 'lead' } });
    // Asked first: nothing is sent until confirmed.
    const question = await screen.findByText('Make Tamsin Okafor a lead?');
    expect(api.sent('PATCH', `${MEMBERS_PATH}/user-tamsin`)).toHaveLength(0);
    fireEvent.click(within(question.closest('[role="status"]') as HTMLElement).getByRole('button', { name: 'Yes, make lead' }));
    await waitFor(() => expect(api.sent('PATCH', `${MEMBERS_PATH}/user-tamsin`)).toHaveLength(1));
    expect(api.sent('PATCH', `${MEMBERS_PATH}/user-tamsin`)[0].body).toEqual({ role: 'lead' });
    // Says what happened, once.
    expect((await screen.findAllByText(/^Tamsin Okafor is now a lead: manages members and presets/)).length).toBe(1);
    // Two leads now: neither is locked.
    await waitFor(() => expect((screen.getByRole('combobox', { name: 'Role of Wren Halloway' }) as HTMLSelectElement).disabled).toBe(false));
  });

  it('withdraws a role change that is not confirmed: nothing is sent and the role stays', async () => {
    const { api } = renderMembers([wren, tamsin]);
    const select = (await screen.findByRole('combobox', { name: 'Role of Tamsin Okafor' })) as HTMLSelectElement;
    fireEvent.change(select, { target: { value: 'listener' } });
    expect(select.value).toBe('listener');
    fireEvent.click(await screen.findByRole('button', { name: 'Keep designer' }));
    await waitFor(() => expect((screen.getByRole('combobox', { name: 'Role of Tamsin Okafor' }) as HTMLSelectElement).value).toBe('designer'));
    expect(screen.queryByText(/Make Tamsin Okafor/)).toBeNull();
    expect(api.sent('PATCH', `${MEMBERS_PATH}/user-tamsin`)).toHaveLength(0);
  });

  it('asks before removing, and shows the server’s 409 when it refuses', async () => {
    const refusal = 'A studio keeps at least one lead: make another member lead first';
    const { api, user } = renderMembers([wren, { ...tamsin, role: 'lead' }], {
      [`DELETE ${MEMBERS_PATH}/user-tamsin`]: apiError(409, 'conflict', refusal),
    });
    await user.click(await screen.findByRole('button', { name: 'Remove Tamsin Okafor' }));
    const question = screen.getByRole('group', { name: 'Remove Tamsin Okafor from Kestrel Lantern Audio?' });
    expect(document.activeElement).toBe(within(question).getByRole('button', { name: 'Cancel' }));
    expect(api.sent('DELETE', `${MEMBERS_PATH}/user-tamsin`)).toHaveLength(0);
    await user.click(within(question).getByRole('button', { name: 'Yes, remove' }));
    const alert = await screen.findByRole('alert');
    expect(alert.textContent).toContain('Nobody was removed');
    expect(alert.textContent).toContain(refusal);
    expect(api.sent('DELETE', `${MEMBERS_PATH}/user-tamsin`)).toHaveLength(1);
  });

  it('removes a member after the confirmation', async () => {
    let members = [wren, tamsin];
    const { user } = renderMembers([], {
      [`GET ${MEMBERS_PATH}`]: () => ({ status: 200, body: { members } }),
      [`DELETE ${MEMBERS_PATH}/user-tamsin`]: () => {
        members = [wren];
        return { status: 204 };
      },
    });
    await user.click(await screen.findByRole('button', { name: 'Remove Tamsin Okafor' }));
    await user.click(within(screen.getByRole('group')).getByRole('button', { name: 'Yes, remove' }));
    await waitFor(() => expect(screen.queryByText('Tamsin Okafor')).toBeNull());
  });

  it('shows the e-mail field error without asking the server', async () => {
    const { api, user } = renderMembers([wren, tamsin]);
    const email = await screen.findByRole('textbox', { name: 'E-mail' });
    await user.type(email, 'not-an-address');
    await user.click(screen.getByRole('button', { name: 'Send invitation' }));
    expect(await screen.findByText('Must be an e-mail address')).toBeTruthy();
    expect(email.getAttribute('aria-invalid')).toBe('true');
    const describedBy = email.getAttribute('aria-describedby')?.split(' ') ?? [];
    expect(describedBy.map((id) => document.getElementById(id)?.textContent)).toContain('Must be an e-mail address');
    expect(api.sent('POST', INVITATIONS_PATH)).toHaveLength(0);
  });

  it('invites with the chosen role and shows the server’s conflict beside the e-mail', async () => {
    const { api, user } = renderMembers([wren, tamsin], {
      [`POST ${INVITATIONS_PATH}`]: (request) =>
        (request.body as { email: string }).email === 'tamsin@kestrel-lantern.example'
          ? apiError(409, 'conflict', 'tamsin@kestrel-lantern.example is already a member of this studio', 'email')
          : { status: 201, body: { invitation: { ...invitation, id: 'invite-2', email: 'ines@kestrel-lantern.example', role: 'producer' } } },
    });
    const email = await screen.findByRole('textbox', { name: 'E-mail' });
    await user.type(email, 'Ines@Kestrel-Lantern.example');
    await user.selectOptions(screen.getByRole('combobox', { name: 'Role' }), 'producer');
    await user.click(screen.getByRole('button', { name: 'Send invitation' }));
    expect(await screen.findByText(/Invitation sent to ines@kestrel-lantern.example as a producer/)).toBeTruthy();
    expect(api.sent('POST', INVITATIONS_PATH)[0].body).toEqual({ email: 'ines@kestrel-lantern.example', role: 'producer' });

    await user.type(email, 'tamsin@kestrel-lantern.example');
    await user.click(screen.getByRole('button', { name: 'Send invitation' }));
    expect(await screen.findByText('tamsin@kestrel-lantern.example is already a member of this studio')).toBeTruthy();
    expect(email.getAttribute('aria-invalid')).toBe('true');
  });

  it('lists waiting invitations and resends or revokes them, showing a failure', async () => {
    let release: () => void = () => {};
    const { api, user } = renderMembers([wren, tamsin], {
      [`POST ${INVITATIONS_PATH}/invite-1/resend`]: () =>
        new Promise((resolve) => {
          release = () => resolve({ status: 200, body: { invitation } });
        }),
      [`DELETE ${INVITATIONS_PATH}/invite-1`]: apiError(404, 'not_found', 'Invitation not found'),
    });
    const table = await screen.findByRole('table', { name: /waiting for an answer/ });
    expect(within(table).getByText('marlo@kestrel-lantern.example')).toBeTruthy();

    const resend = screen.getByRole('button', { name: 'Resend the invitation to marlo@kestrel-lantern.example' });
    await user.click(resend);
    await waitFor(() => expect(resend.getAttribute('aria-busy')).toBe('true'));
    release();
    expect(await screen.findByText(/A fresh link went to marlo@kestrel-lantern.example/)).toBeTruthy();
    expect(api.sent('POST', `${INVITATIONS_PATH}/invite-1/resend`)).toHaveLength(1);

    await user.click(screen.getByRole('button', { name: 'Revoke the invitation to marlo@kestrel-lantern.example' }));
    const alert = await screen.findByRole('alert');
    expect(alert.textContent).toContain('The invitation to marlo@kestrel-lantern.example was not revoked');
    expect(alert.textContent).toContain('Invitation not found');
  });

  it('shows an empty list and a failed load in their own words', async () => {
    renderMembers([wren, tamsin], { [`GET ${INVITATIONS_PATH}`]: { status: 200, body: { invitations: [] } }, [`GET ${MEMBERS_PATH}`]: apiError(500, 'internal', 'The database is busy') });
    expect(await screen.findByText('No invitations waiting')).toBeTruthy();
    expect((await screen.findByRole('alert')).textContent).toContain('The database is busy');
  });

  it('tells a member who is not a lead that only leads manage members', async () => {
    const { api } = renderMembers([wren, tamsin], {}, 'designer');
    expect(await screen.findByText('Only leads manage members')).toBeTruthy();
    expect(screen.queryByRole('table')).toBeNull();
    expect(api.sent('GET', INVITATIONS_PATH)).toHaveLength(0);
  });
});
