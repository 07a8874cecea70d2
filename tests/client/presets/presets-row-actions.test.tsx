// @vitest-environment happy-dom
import { cleanup, screen, waitFor, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { findPresetRow, openPresetDetails, presetNamesInTable, renderPresetsPage } from './presets-page-kit';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

describe('presets page: actions of a lead on the selected preset', () => {
  it('loads a preset into a chosen open session and links to it', async () => {
    const { api, user, router } = renderPresetsPage({ role: 'lead' });
    const details = await openPresetDetails(user, 'Breakwater Bass');
    await user.click(within(details).getByRole('button', { name: 'Load into session… (Breakwater Bass)' }));
    const panel = await screen.findByRole('region', { name: 'Load “Breakwater Bass” into a session' });
    const menu = await within(panel).findByRole('combobox', { name: 'Session' });
    // Archived sessions are not offered.
    expect(within(menu).getAllByRole('option').map((option) => option.textContent)).toEqual(['Choose a session…', 'Harbour night cue', 'Tide-pool loops']);

    await user.click(within(panel).getByRole('button', { name: 'Load preset' }));
    expect(await within(panel).findByText('Choose a session')).toBeTruthy();
    expect(api.requestsTo('POST', '/api/sessions/session-harbour/load-preset')).toHaveLength(0);

    await user.selectOptions(menu, 'Harbour night cue');
    await user.click(within(panel).getByRole('button', { name: 'Load preset' }));
    // Asked first: nothing is sent until the lead confirms.
    await within(panel).findByText('Replace the string of “Harbour night cue” for everyone in it?');
    expect(api.requestsTo('POST', '/api/sessions/session-harbour/load-preset')).toHaveLength(0);
    await user.click(within(panel).getByRole('button', { name: 'Yes, load it' }));
    const link = await within(panel).findByRole('link', { name: 'Open “Harbour night cue”' });
    expect(link.getAttribute('href')).toBe('/sessions/session-harbour');
    expect(api.requestsTo('POST', '/api/sessions/session-harbour/load-preset')[0].body).toEqual({ presetId: 'preset-breakwater' });
    await user.click(link);
    expect(router.state.location.pathname).toBe('/sessions/session-harbour');
  });

  it('edits tags as a comma-separated list', async () => {
    const { api, user } = renderPresetsPage({ role: 'lead' });
    const details = await openPresetDetails(user, 'Glasswing Quill');
    await user.click(within(details).getByRole('button', { name: 'Edit tags of Glasswing Quill' }));
    const field = await screen.findByRole('textbox', { name: 'Tags' });
    expect((field as HTMLInputElement).value).toBe('bright, pluck');
    expect(document.activeElement).toBe(field);
    await user.clear(field);
    await user.type(field, 'bright, quill, airy{Enter}');
    expect(await screen.findByText('Tags of “Glasswing Quill” saved: bright, quill, airy.')).toBeTruthy();
    expect(api.requestsTo('PATCH', '/api/presets/preset-glasswing')[0].body).toEqual({ tags: ['bright', 'quill', 'airy'] });
    const updated = await findPresetRow('Glasswing Quill');
    await waitFor(() => expect(within(updated).getAllByRole('listitem').map((chip) => chip.textContent)).toEqual(['bright', 'quill', 'airy']));
  });

  it('checks tags in the browser with the shared rules', async () => {
    const { api, user } = renderPresetsPage({ role: 'lead' });
    const details = await openPresetDetails(user, 'Glasswing Quill');
    await user.click(within(details).getByRole('button', { name: 'Edit tags of Glasswing Quill' }));
    const field = await screen.findByRole('textbox', { name: 'Tags' });
    await user.type(field, `, ${'x'.repeat(40)}{Enter}`);
    expect(await screen.findByText('Tag 3: must be at most 32 characters')).toBeTruthy();
    expect(field.getAttribute('aria-invalid')).toBe('true');
    expect(api.requestsTo('PATCH', '/api/presets/preset-glasswing')).toHaveLength(0);
  });

  it('deletes only after the confirmation step', async () => {
    const { api, user } = renderPresetsPage({ role: 'lead' });
    const details = await openPresetDetails(user, 'Glasswing Quill');
    await user.click(within(details).getByRole('button', { name: 'Delete Glasswing Quill' }));
    const panel = await screen.findByRole('region', { name: 'Delete “Glasswing Quill”?' });
    await user.click(within(panel).getByRole('button', { name: 'Keep it' }));
    expect(api.requestsTo('DELETE', '/api/presets/preset-glasswing')).toHaveLength(0);
    expect(presetNamesInTable()).toContain('Glasswing Quill');

    await user.click(within(details).getByRole('button', { name: 'Delete Glasswing Quill' }));
    await user.click(within(await screen.findByRole('region', { name: 'Delete “Glasswing Quill”?' })).getByRole('button', { name: 'Delete preset' }));
    expect(await screen.findByText('“Glasswing Quill” deleted.')).toBeTruthy();
    expect(api.requestsTo('DELETE', '/api/presets/preset-glasswing')).toHaveLength(1);
    expect(presetNamesInTable()).toEqual(['Breakwater Bass', 'Kelp-Line Nylon']);
  });
});
