// @vitest-environment happy-dom
import { cleanup, screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { ACTION_REASONS } from '../../../shared/access/roles';
import { findPresetRow, openPresetDetails, renderPresetsPage } from './presets-page-kit';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

describe('presets page: what each role may do', () => {
  it('shows a listener edit, delete, load and upload disabled, each with its reason', async () => {
    const { api, user } = renderPresetsPage({ role: 'listener' });
    const row = await findPresetRow('Kelp-Line Nylon');
    const details = await openPresetDetails(user, 'Kelp-Line Nylon');

    for (const name of ['Edit tags of Kelp-Line Nylon', 'Delete Kelp-Line Nylon']) {
      const button = within(details).getByRole('button', { name }) as HTMLButtonElement;
      expect(button.disabled).toBe(true);
      expect(button.getAttribute('title')).toBe(ACTION_REASONS.managePresets);
    }
    const load = within(details).getByRole('button', { name: 'Load into session… (Kelp-Line Nylon)' }) as HTMLButtonElement;
    expect(load.disabled).toBe(true);
    expect(load.getAttribute('title')).toBe(ACTION_REASONS.editSessions);

    const upload = screen.getByRole('button', { name: 'Upload preset' }) as HTMLButtonElement;
    expect(upload.disabled).toBe(true);
    expect(upload.getAttribute('title')).toBe(ACTION_REASONS.managePresets);
    expect((screen.getByLabelText('Patch JSON file') as HTMLInputElement).disabled).toBe(true);

    // Looking and taking a copy stay open to every member.
    expect((within(row).getByRole('button', { name: 'Details of Kelp-Line Nylon' }) as HTMLButtonElement).disabled).toBe(false);
    expect((within(row).getByRole('button', { name: 'Play Kelp-Line Nylon' }) as HTMLButtonElement).disabled).toBe(false);
    expect(within(details).getByRole('link', { name: 'Download Kelp-Line Nylon' })).toBeTruthy();
    expect(api.state.requests.some((request) => request.method !== 'GET')).toBe(false);
  });

  it('lets a lead use every action', async () => {
    const { user } = renderPresetsPage({ role: 'lead' });
    const row = await findPresetRow('Kelp-Line Nylon');
    const details = await openPresetDetails(user, 'Kelp-Line Nylon');
    for (const button of [...within(row).getAllByRole('button'), ...within(details).getAllByRole('button')]) {
      expect((button as HTMLButtonElement).disabled).toBe(false);
      expect(button.getAttribute('title')).toBeNull();
    }
    expect((screen.getByRole('button', { name: 'Upload preset' }) as HTMLButtonElement).disabled).toBe(false);
  });
});
