import { screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { vi } from 'vitest';
import PresetsPage from '../../../src/app/routes/presets-page';
import { renderAt } from '../render-page';
import { createFakeApi, STUDIO_ID, type FakeApiOptions } from './fake-api';

/** Renders the presets page at /studios/:studioId/presets against a fresh fake API and query cache. */
export function renderPresetsPage(options: FakeApiOptions) {
  const api = createFakeApi(options);
  vi.stubGlobal('fetch', api.fetch);
  const user = userEvent.setup();
  const view = renderAt(`/studios/${STUDIO_ID}/presets`, [
    { path: '/studios/:studioId/presets', element: <PresetsPage /> },
    { path: '/sessions/:sessionId', element: <p>Session page</p> },
  ]);
  return { ...view, api, user };
}

/** The table row of a preset, found by its name in the library table. */
export async function findPresetRow(name: string): Promise<HTMLElement> {
  const table = await screen.findByRole('table', { name: 'Presets of this studio' });
  const cell = await within(table).findByText(name, { selector: 'p' });
  const row = cell.closest('tr');
  if (!row) throw new Error(`${name} is not in a table row`);
  return row;
}

/**
 * Selects a preset's row (a click on the row itself, not one of its buttons) and returns the
 * details panel that opens beside the table, where the download, load, tag and delete actions are.
 */
export async function openPresetDetails(user: ReturnType<typeof userEvent.setup>, name: string): Promise<HTMLElement> {
  const row = await findPresetRow(name);
  await user.click(within(row).getAllByRole('cell')[1]);
  return screen.findByRole('region', { name: `Details — “${name}”` });
}

/** The preset names in the table, top to bottom. */
export function presetNamesInTable(): string[] {
  const table = screen.getByRole('table', { name: 'Presets of this studio' });
  return within(table)
    .getAllByRole('row')
    .slice(1)
    .map((row) => within(row).getAllByRole('cell')[0].querySelector('p')?.textContent ?? '');
}
