// @vitest-environment happy-dom
import { act, cleanup, screen, waitFor, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { RENDER_EVENTS, type RenderProgressMessage } from '../../../shared/protocol/render-protocol';
import { lastSocket, sockets } from './fake-socket-io';
import { DONE_RENDER, findRenderRow, LIST_PATH, renderRendersPage, RUNNING_RENDER, FAILED_RENDER, STORAGE, STUDIO_ID } from './renders-page-kit';

vi.mock('socket.io-client', async () => await import('./fake-socket-io'));

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
  sockets.length = 0;
});

const progress = (state: RenderProgressMessage['state'], progressPercent: number): RenderProgressMessage => ({ type: 'progress', studioId: STUDIO_ID, renderId: RUNNING_RENDER.id, state, progressPercent, error: null });

describe('renders page: the table', () => {
  it('shows a done render’s settings and measured figures, with play, download and patch', async () => {
    renderRendersPage({ role: 'lead' });
    const row = await findRenderRow('Harbour bell, loud');
    const cells = within(row).getAllByRole('cell');
    const headers = within(screen.getByRole('table')).getAllByRole('columnheader').map((header) => header.textContent);
    const cell = (header: string) => cells[headers.indexOf(header)];
    expect(cell('Source and settings').textContent).toBe('Saltglass harbour bell (session)48 kHz · 24-bit · stereo · loudness −16 LUFS / −1 dBTP');
    expect(within(row).getByText('48 kHz · 24-bit · stereo · loudness −16 LUFS / −1 dBTP')).toBeTruthy();
    expect(within(cell('Length (s)')).getByText('4.21')).toBeTruthy();
    expect(cell('Peak (dBFS)').textContent).toBe('−1.4');
    expect(cell('True peak (dBTP)').textContent).toBe('−1.0');
    expect(cell('Loudness (LUFS)').textContent).toBe('−16.0');
    expect(cell('Size').textContent).toBe('1.2 MB');
    expect(within(cell('Made')).getByText('by Wren Halloway')).toBeTruthy();
    expect(cell('State').textContent).toBe('Done');
    expect(within(row).queryByRole('progressbar')).toBeNull();

    expect(within(row).getByRole('button', { name: 'Play Harbour bell, loud' })).toBeTruthy();
    const download = within(row).getByRole('link', { name: 'Download WAV of Harbour bell, loud' });
    expect(download.getAttribute('href')).toBe('/api/renders/render-bell/file');
    expect(download.hasAttribute('download')).toBe(true);
    expect(within(row).getByRole('link', { name: 'Patch JSON of Harbour bell, loud' }).getAttribute('href')).toBe('/api/renders/render-bell/patch.json');
    expect(within(row).queryByRole('button', { name: /^Cancel/ })).toBeNull();
    expect(screen.getByText('1.2 GB of 2 GB used')).toBeTruthy();
  });

  it('shows a running note set’s progress bar and cancel, and a failed render’s reason', async () => {
    renderRendersPage({ role: 'producer' });
    const row = await findRenderRow('Kelp-Line Nylon · note set');
    const bar = within(row).getByRole('progressbar', { name: 'Progress of Kelp-Line Nylon · note set' });
    expect(bar.getAttribute('aria-valuenow')).toBe('42');
    expect(within(row).getByText('C2–C6 every 3 · 3 strengths · by tension')).toBeTruthy();
    // No file yet: nothing to play or download, but the patch it was made from is there.
    expect(within(row).queryByRole('button', { name: /^Play/ })).toBeNull();
    expect(within(row).queryByRole('link', { name: /^Download/ })).toBeNull();
    expect(within(row).getByRole('link', { name: 'Patch JSON of Kelp-Line Nylon · note set' })).toBeTruthy();
    expect((within(row).getByRole('button', { name: 'Cancel Kelp-Line Nylon · note set' }) as HTMLButtonElement).disabled).toBe(false);

    const failed = await findRenderRow('Tidewall lute, first take');
    expect(within(failed).getByText('the server stopped before this render finished; start it again')).toBeTruthy();
  });

  it('moves the bar on a progress message without refetching, and refetches when the job is done', async () => {
    let finished = false;
    const { sent } = renderRendersPage({
      role: 'lead',
      list: () => ({ renders: [finished ? { ...RUNNING_RENDER, state: 'done', progressPercent: 100, durationS: 3, sizeBytes: 9_000_000, fileCount: 51 } : RUNNING_RENDER, DONE_RENDER], storage: STORAGE }),
    });
    const row = await findRenderRow('Kelp-Line Nylon · note set');
    const socket = lastSocket();
    act(() => socket.open());
    expect(socket.emitted).toContainEqual({ event: RENDER_EVENTS.subscribe, payload: { studioId: STUDIO_ID } });
    act(() => socket.receive(RENDER_EVENTS.joined, { type: 'joined', studioId: STUDIO_ID }));
    expect(await screen.findByText('Progress updates live.')).toBeTruthy();

    const listFetches = sent('GET', LIST_PATH).length;
    act(() => socket.receive(RENDER_EVENTS.progress, progress('rendering', 77)));
    // The cache tells its observers on the next tick.
    await waitFor(() => expect(within(row).getByRole('progressbar').getAttribute('aria-valuenow')).toBe('77'));
    // A message of another studio is not ours.
    act(() => socket.receive(RENDER_EVENTS.progress, { ...progress('rendering', 5), studioId: 'studio-other' }));
    await act(() => new Promise((resolve) => setTimeout(resolve, 20)));
    expect(within(row).getByRole('progressbar').getAttribute('aria-valuenow')).toBe('77');
    expect(sent('GET', LIST_PATH)).toHaveLength(listFetches);

    finished = true;
    act(() => socket.receive(RENDER_EVENTS.progress, progress('done', 100)));
    const done = await findRenderRow('Kelp-Line Nylon · note set');
    await waitFor(() => expect(within(done).getByText('8.6 MB')).toBeTruthy());
    expect(within(done).queryByRole('progressbar')).toBeNull();
    expect(within(done).getByRole('link', { name: 'Download ZIP of Kelp-Line Nylon · note set' })).toBeTruthy();
    expect(sent('GET', LIST_PATH).length).toBeGreaterThan(listFetches);
  });

  it('filters by session on the server, archived sessions included', async () => {
    const { user, sent } = renderRendersPage({ role: 'listener' });
    await findRenderRow('Harbour bell, loud');
    const filter = screen.getByRole('combobox', { name: 'Session' });
    expect(within(filter).getAllByRole('option').map((option) => option.textContent)).toEqual(['All sessions and presets', 'Saltglass harbour bell', 'Tidewall lute', 'Old lighthouse sketch (archived)']);
    await user.selectOptions(filter, 'Tidewall lute');
    await waitFor(() => expect(sent('GET', LIST_PATH).some((call) => call.path.endsWith('?sessionId=session-tidewall'))).toBe(true));
  });

  it('says so when the studio has no renders yet', async () => {
    renderRendersPage({ role: 'lead', list: { renders: [], storage: { usedBytes: 0, quotaBytes: STORAGE.quotaBytes } } });
    expect(await screen.findByText('No renders yet')).toBeTruthy();
    expect(screen.getByText('0 bytes of 2 GB used')).toBeTruthy();
  });

  it('cancels a running job and deletes a render only after the confirmation', async () => {
    const { user, sent } = renderRendersPage({
      role: 'lead',
      handlers: {
        [`POST /api/renders/${RUNNING_RENDER.id}/cancel`]: () => ({ body: { render: { ...RUNNING_RENDER, state: 'cancelled' } } }),
        [`DELETE /api/renders/${FAILED_RENDER.id}`]: () => ({ status: 204 }),
      },
    });
    const running = await findRenderRow('Kelp-Line Nylon · note set');
    await user.click(within(running).getByRole('button', { name: 'Cancel Kelp-Line Nylon · note set' }));
    expect(sent('POST', `/api/renders/${RUNNING_RENDER.id}/cancel`)).toHaveLength(1);

    const failed = await findRenderRow('Tidewall lute, first take');
    await user.click(within(failed).getByRole('button', { name: 'Delete Tidewall lute, first take' }));
    const question = within(failed).getByRole('group', { name: 'Delete “Tidewall lute, first take” and its file for everyone?' });
    expect(document.activeElement?.textContent).toBe('Keep it');
    await user.click(within(question).getByRole('button', { name: 'Keep it' }));
    expect(sent('DELETE', `/api/renders/${FAILED_RENDER.id}`)).toHaveLength(0);

    await user.click(within(failed).getByRole('button', { name: 'Delete Tidewall lute, first take' }));
    await user.click(within(failed).getByRole('button', { name: 'Delete file' }));
    await waitFor(() => expect(sent('DELETE', `/api/renders/${FAILED_RENDER.id}`)).toHaveLength(1));
  });
});
