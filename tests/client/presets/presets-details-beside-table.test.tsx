// @vitest-environment happy-dom
import { cleanup, screen, waitFor, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { findPresetRow, openPresetDetails, renderPresetsPage } from './presets-page-kit';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

describe('presets page: a compact table with the selected preset beside it', () => {
  it('selects a row by click, shows its details and marks it selected for screen readers', async () => {
    const { api, user } = renderPresetsPage({ role: 'lead' });
    const row = await findPresetRow('Breakwater Bass');
    expect(row.getAttribute('aria-selected')).toBe('false');
    const controls = row.getAttribute('aria-controls');
    expect(controls).toBeTruthy();
    // Nothing selected yet: no details region.
    expect(screen.queryByRole('region', { name: /^Details/ })).toBeNull();

    const details = await openPresetDetails(user, 'Breakwater Bass');
    expect(row.getAttribute('aria-selected')).toBe('true');
    // The row points at the element that holds the details.
    expect(document.getElementById(controls!)?.contains(details)).toBe(true);
    expect(await within(details).findByText('A heavy wound string for the harbour theme.')).toBeTruthy();
    // The fake patch: L = 0.65 m, T = 60.47 N; f0 = √(60.47 / 9.316e-4) / (2 · 0.65) = 195.98 Hz (hand-computed).
    expect(within(details).getByText('0.65 m')).toBeTruthy();
    expect(within(details).getByText('60.47 N')).toBeTruthy();
    expect(within(details).getByText('196.0 Hz')).toBeTruthy();
    expect(within(details).getByText('Damping').nextElementSibling?.textContent).toBe('b₁ 1.1 s⁻¹, b₂ 0.0002 m²/s');
    expect(within(details).getAllByText('Tamsin Okafor').length).toBeGreaterThan(0);
    expect(api.requestsTo('GET', '/api/presets/preset-breakwater')).toHaveLength(1);
    // A row click leaves focus where it was, rather than jumping into the panel.
    expect(details.contains(document.activeElement)).toBe(false);
  });

  it('selects with Enter or Space on the focused row, and Escape returns focus to the row', async () => {
    const { user } = renderPresetsPage({ role: 'lead' });
    const row = await findPresetRow('Glasswing Quill');
    row.focus();
    await user.keyboard('{Enter}');
    const first = await screen.findByRole('region', { name: 'Details — “Glasswing Quill”' });
    expect(row.getAttribute('aria-selected')).toBe('true');
    expect(first).toBeTruthy();

    const other = await findPresetRow('Kelp-Line Nylon');
    other.focus();
    await user.keyboard(' ');
    await screen.findByRole('region', { name: 'Details — “Kelp-Line Nylon”' });
    expect(row.getAttribute('aria-selected')).toBe('false');
    expect(other.getAttribute('aria-selected')).toBe('true');
    // Only one preset's details at a time.
    expect(screen.queryByRole('region', { name: 'Details — “Glasswing Quill”' })).toBeNull();

    await user.click(within(screen.getByRole('region', { name: 'Details — “Kelp-Line Nylon”' })).getByText('Tension'));
    await user.keyboard('{Escape}');
    await waitFor(() => expect(screen.queryByRole('region', { name: /^Details/ })).toBeNull());
    expect(other.getAttribute('aria-selected')).toBe('false');
    expect(document.activeElement).toBe(other);
  });

  it('keeps audition and Details in the row; pressing Play does not select the row', async () => {
    const { user } = renderPresetsPage({ role: 'lead' });
    const row = await findPresetRow('Kelp-Line Nylon');
    const buttons = within(row).getAllByRole('button').map((button) => button.getAttribute('aria-label') ?? button.textContent);
    expect(buttons).toEqual(['Play Kelp-Line Nylon', 'Details of Kelp-Line Nylon']);
    expect(within(row).queryByRole('link')).toBeNull();
    const details = within(row).getByRole('button', { name: 'Details of Kelp-Line Nylon' });
    expect(details.getAttribute('aria-expanded')).toBe('false');
    await user.click(details);
    expect(details.getAttribute('aria-expanded')).toBe('true');
    expect(details.getAttribute('aria-controls')).toBe(row.getAttribute('aria-controls'));
  });

  it('runs the secondary actions from the details: tags saved, then the deleted preset closes its details', async () => {
    const { api, user } = renderPresetsPage({ role: 'lead' });
    let details = await openPresetDetails(user, 'Glasswing Quill');
    await user.click(within(details).getByRole('button', { name: 'Edit tags of Glasswing Quill' }));
    const field = await within(details).findByRole('textbox', { name: 'Tags' });
    await user.clear(field);
    await user.type(field, 'bright, harbour{Enter}');
    expect(await screen.findByText('Tags of “Glasswing Quill” saved: bright, harbour.')).toBeTruthy();
    expect(api.requestsTo('PATCH', '/api/presets/preset-glasswing')[0].body).toEqual({ tags: ['bright', 'harbour'] });
    // The details stay open, and focus is back on the button that opened the tag editor.
    details = screen.getByRole('region', { name: 'Details — “Glasswing Quill”' });
    expect(document.activeElement).toBe(within(details).getByRole('button', { name: 'Edit tags of Glasswing Quill' }));
    const row = await findPresetRow('Glasswing Quill');
    await waitFor(() => expect(within(within(row).getByRole('list', { name: 'Tags' })).getAllByRole('listitem').map((chip) => chip.textContent)).toEqual(['bright', 'harbour']));

    await user.click(within(details).getByRole('button', { name: 'Delete Glasswing Quill' }));
    await user.click(within(await screen.findByRole('region', { name: 'Delete “Glasswing Quill”?' })).getByRole('button', { name: 'Delete preset' }));
    expect(await screen.findByText('“Glasswing Quill” deleted.')).toBeTruthy();
    expect(api.requestsTo('DELETE', '/api/presets/preset-glasswing')).toHaveLength(1);
    expect(screen.queryByRole('region', { name: /^Details/ })).toBeNull();
  });

  it('no longer forces a minimum width on the actions, and a long name truncates with its full name as a tooltip', async () => {
    renderPresetsPage({ role: 'lead' });
    const row = await findPresetRow('Kelp-Line Nylon');
    const table = screen.getByRole('table', { name: 'Presets of this studio' });
    // The old actions cell carried min-w-[28rem] (448 px), which pushed the page wider than 1280 px beside a panel.
    for (const element of [table, ...table.querySelectorAll('*')]) expect(element.getAttribute('class') ?? '').not.toMatch(/\bmin-w-/);
    expect(table.getAttribute('class')).toMatch(/\btable-fixed\b/);
    const name = within(row).getByText('Kelp-Line Nylon', { selector: 'p' });
    expect(name.getAttribute('title')).toBe('Kelp-Line Nylon');
    expect(name.getAttribute('class')).toMatch(/\btruncate\b/);
  });
});
