// @vitest-environment happy-dom
import { cleanup, screen, waitFor, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { STUDIO_ID } from './fake-api';
import { findPresetRow, openPresetDetails, presetNamesInTable, renderPresetsPage } from './presets-page-kit';

const LIST = `/api/studios/${STUDIO_ID}/presets`;

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

describe('presets page: the library', () => {
  it('lists the studio presets with their tags, version and author', async () => {
    const { user } = renderPresetsPage({ role: 'lead' });
    expect(screen.getByRole('status')).toBeTruthy();
    const row = await findPresetRow('Kelp-Line Nylon');
    const chips = within(within(row).getByRole('list', { name: 'Tags' })).getAllByRole('listitem');
    expect(chips.map((chip) => chip.textContent)).toEqual(['nylon', 'pluck', 'warm']);
    expect(within(row).getByText('v3')).toBeTruthy();
    expect(presetNamesInTable()).toEqual(['Breakwater Bass', 'Glasswing Quill', 'Kelp-Line Nylon']);
    // Author and download moved from the row into the details beside the table.
    const details = await openPresetDetails(user, 'Kelp-Line Nylon');
    expect(await within(details).findByText('Wren Halloway')).toBeTruthy();
    const download = within(details).getByRole('link', { name: 'Download Kelp-Line Nylon' });
    expect(download.getAttribute('href')).toBe('/api/presets/preset-kelp/download');
    expect(download.hasAttribute('download')).toBe(true);
  });

  it('searches on the server with q once typing settles', async () => {
    const { api, user } = renderPresetsPage({ role: 'lead' });
    await findPresetRow('Kelp-Line Nylon');
    await user.type(screen.getByRole('searchbox', { name: 'Search presets' }), 'harbour');
    await waitFor(() => expect(presetNamesInTable()).toEqual(['Breakwater Bass']));
    const sent = api.requestsTo('GET', LIST).map((request) => request.url.searchParams.get('q'));
    // Debounced: one request for the settled text, none per key press.
    expect(sent.filter((q) => q !== null)).toEqual(['harbour']);
  });

  it('filters by a tag of the studio and sorts on the server', async () => {
    const { api, user } = renderPresetsPage({ role: 'lead' });
    await findPresetRow('Kelp-Line Nylon');
    const tagMenu = screen.getByRole('combobox', { name: 'Tag' });
    const options = within(tagMenu).getAllByRole('option').map((option) => option.textContent);
    expect(options).toEqual(['All tags', 'bass', 'bright', 'nylon', 'pluck', 'warm', 'wound']);
    await user.selectOptions(tagMenu, 'pluck');
    await waitFor(() => expect(presetNamesInTable()).toEqual(['Glasswing Quill', 'Kelp-Line Nylon']));
    expect(api.requestsTo('GET', LIST).some((request) => request.url.searchParams.get('tag') === 'pluck')).toBe(true);
    // The menu still offers every tag, not only those of the rows left.
    expect(within(tagMenu).getAllByRole('option')).toHaveLength(options.length);

    await user.selectOptions(tagMenu, '');
    await user.selectOptions(screen.getByRole('combobox', { name: 'Sort by' }), 'date');
    await waitFor(() => expect(presetNamesInTable()).toEqual(['Breakwater Bass', 'Kelp-Line Nylon', 'Glasswing Quill']));
    expect(api.requestsTo('GET', LIST).at(-1)?.url.searchParams.get('sort')).toBe('date');
  });

  it('says so when nothing matches', async () => {
    const { user } = renderPresetsPage({ role: 'lead' });
    await findPresetRow('Kelp-Line Nylon');
    await user.type(screen.getByRole('searchbox', { name: 'Search presets' }), 'zither');
    expect(await screen.findByText('No preset matches')).toBeTruthy();
  });

  it('shows an error when the list cannot load', async () => {
    renderPresetsPage({ role: 'lead', listFailure: 500 });
    expect(await screen.findByText('Cannot load the presets')).toBeTruthy();
    expect(screen.getAllByText('Something went wrong on the server').length).toBeGreaterThan(0);
  });

  it('shows the fundamental and first-mode decay in Details, with no sound', async () => {
    const { api, user } = renderPresetsPage({ role: 'lead' });
    const row = await findPresetRow('Kelp-Line Nylon');
    await user.click(within(row).getByRole('button', { name: 'Details of Kelp-Line Nylon' }));
    const panel = await screen.findByRole('region', { name: 'Details — “Kelp-Line Nylon”' });
    // f0 = √(T/μ)/(2L) = √(60.47 / 9.316e-4) / 1.3 = 195.98 Hz, next to G3 (196.00 Hz).
    expect(await within(panel).findByText('196.0 Hz')).toBeTruthy();
    expect(within(panel).getByText(/nearest note G3/)).toBeTruthy();
    // σ1 = b1 + b2·(π/L)² = 1.1 + 2e-4 · 23.36 = 1.105 /s; T60 = 3 ln 10 / σ1 = 6.25 s.
    expect(within(panel).getByText('6.25 s')).toBeTruthy();
    expect(within(panel).getByText('A warm fingertip pluck near the middle of the string.')).toBeTruthy();
    expect(api.requestsTo('GET', '/api/presets/preset-kelp')).toHaveLength(1);
    expect(document.activeElement?.textContent).toBe('Details — “Kelp-Line Nylon”');
    await user.keyboard('{Escape}');
    expect(screen.queryByRole('region', { name: /Details/ })).toBeNull();
    // Focus returns to the button that opened the panel.
    expect(document.activeElement?.textContent).toBe('Details of Kelp-Line Nylon');
  });
});
