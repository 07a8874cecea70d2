// @vitest-environment happy-dom
import { cleanup, screen, waitFor, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { ACTION_REASONS } from '../../../shared/access/roles';
import { sockets } from './fake-socket-io';
import { findRenderForm, findRenderRow, LIST_PATH, renderRendersPage, RUNNING_RENDER } from './renders-page-kit';

vi.mock('socket.io-client', async () => await import('./fake-socket-io'));

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
  sockets.length = 0;
});

const field = (form: HTMLElement, label: string) => within(form).getByLabelText(label) as HTMLInputElement;

/** The text under a field that is tied to it as its error. */
function errorOf(input: HTMLElement): string {
  const ids = input.getAttribute('aria-describedby')?.split(' ') ?? [];
  return ids.map((id) => document.getElementById(id)).find((element) => element?.getAttribute('role') === 'alert')?.textContent ?? '';
}

const queued = () => ({ status: 202, body: { render: { ...RUNNING_RENDER, id: 'render-new', name: 'Harbour bell set', state: 'queued', progressPercent: 0 } } });

describe('renders page: the new-render form', () => {
  it('offers the studio’s open sessions and presets, with the defaults set', async () => {
    renderRendersPage({ role: 'lead' });
    const form = await findRenderForm();
    const source = within(form).getByRole('combobox', { name: 'Source' });
    expect(within(source).getAllByRole('option').map((option) => option.textContent)).toEqual(['Choose a session or preset…', 'Saltglass harbour bell', 'Tidewall lute', 'Kelp-Line Nylon']);
    expect((within(form).getByRole('combobox', { name: 'Sample rate' }) as HTMLSelectElement).value).toBe('48000');
    expect((within(form).getByRole('combobox', { name: 'Format' }) as HTMLSelectElement).value).toBe('pcm24');
    expect((within(form).getByRole('combobox', { name: 'Channels' }) as HTMLSelectElement).value).toBe('mono');
    expect((within(form).getByRole('combobox', { name: 'Length' }) as HTMLSelectElement).value).toBe('untilDecayed');
    expect(field(form, 'Decay threshold (dB)').value).toBe('-90');
    expect(field(form, 'Fade (ms)').value).toBe('20');
    expect(field(form, 'Maximum length (s)').value).toBe('30');
    expect((within(form).getByRole('combobox', { name: 'Level' }) as HTMLSelectElement).value).toBe('loudness');
    expect(field(form, 'Loudness target (LUFS)').value).toBe('-18');
    expect(field(form, 'True peak ceiling (dBTP)').value).toBe('-1');
    expect(within(form).getByText(/LUFS per ITU-R BS.1770: how loud it sounds, measured with gating/)).toBeTruthy();
  });

  it('sends a stereo, loudness-levelled note set as the shared schema’s body', async () => {
    const { user, sent } = renderRendersPage({ role: 'producer', handlers: { [`POST ${LIST_PATH}`]: queued } });
    const form = await findRenderForm();
    await user.selectOptions(within(form).getByRole('combobox', { name: 'Source' }), 'Saltglass harbour bell');
    await user.type(field(form, 'Name (optional)'), 'Harbour bell set');
    await user.selectOptions(within(form).getByRole('combobox', { name: 'Format' }), '16-bit PCM with TPDF dither');
    expect(within(form).getByText("TPDF dither: adds a little noise so quiet tails don't distort when cut to 16 bits.")).toBeTruthy();
    await user.selectOptions(within(form).getByRole('combobox', { name: 'Channels' }), 'Stereo (from two pickup positions)');
    await user.clear(field(form, 'Second pickup position (mm)'));
    await user.type(field(form, 'Second pickup position (mm)'), '140');
    await user.clear(field(form, 'Maximum length (s)'));
    await user.type(field(form, 'Maximum length (s)'), '12');
    await user.clear(field(form, 'Loudness target (LUFS)'));
    await user.type(field(form, 'Loudness target (LUFS)'), '-16');

    await user.click(within(form).getByRole('checkbox', { name: 'Multi-note set' }));
    expect(within(form).getByText('36 = C2')).toBeTruthy();
    expect(within(form).getByText('84 = C6')).toBeTruthy();
    expect(within(form).getByText('Makes 51 files: 17 notes × 3 strengths (at most 128).')).toBeTruthy();
    await user.clear(field(form, 'Strengths'));
    await user.type(field(form, 'Strengths'), '2');
    expect(within(form).getByText('Makes 34 files: 17 notes × 2 strengths (at most 128).')).toBeTruthy();
    await user.selectOptions(within(form).getByRole('combobox', { name: 'Retune' }), 'By length');

    await user.click(within(form).getByRole('button', { name: 'Start render' }));
    expect(await screen.findByText('Render queued')).toBeTruthy();
    expect(sent('POST', LIST_PATH).map((call) => call.body)).toEqual([
      {
        kind: 'noteSet',
        name: 'Harbour bell set',
        source: { kind: 'session', sessionId: 'session-harbour' },
        output: {
          sampleRateHz: 48000,
          format: 'pcm16',
          channels: { kind: 'stereo', secondPickupPositionM: 0.14 },
          length: { kind: 'untilDecayed', thresholdDb: -90, fadeMs: 20, maxDurationS: 12 },
          normalization: { kind: 'loudness', targetLufs: -16, truePeakCeilingDbtp: -1 },
        },
        noteSet: { fromMidi: 36, toMidi: 84, stepSemitones: 3, strengths: 2, retuneBy: 'length' },
      },
    ]);
    // The list is fetched again to show the new job.
    await waitFor(() => expect(sent('GET', LIST_PATH).length).toBeGreaterThan(1));
    expect(field(form, 'Name (optional)').value).toBe('');
  });

  it('checks the input in the browser first and sends nothing while it is wrong', async () => {
    const { user, sent } = renderRendersPage({ role: 'lead' });
    const form = await findRenderForm();
    await user.clear(field(form, 'Decay threshold (dB)'));
    await user.type(field(form, 'Decay threshold (dB)'), '-10');
    await user.click(within(form).getByRole('button', { name: 'Start render' }));
    await waitFor(() => expect(errorOf(within(form).getByRole('combobox', { name: 'Source' }))).toBe('Is required'));
    expect(errorOf(field(form, 'Decay threshold (dB)'))).toBe('Must be <= -30');
    expect(field(form, 'Decay threshold (dB)').getAttribute('aria-invalid')).toBe('true');
    expect(sent('POST', LIST_PATH)).toHaveLength(0);
  });

  it('shows the server’s field problems under their fields', async () => {
    const stereo = {
      field: 'output.channels.secondPickupPositionM',
      problem: 'must lie on the string, below its length (0.65 m)',
      got: '0.8',
      message: 'output.channels.secondPickupPositionM must lie on the string, below its length (0.65 m), got 0.8',
    };
    const threshold = { field: 'output.length.thresholdDb', problem: 'must be >= -120', got: '-130', message: 'output.length.thresholdDb must be >= -120, got -130' };
    const { user } = renderRendersPage({
      role: 'lead',
      handlers: { [`POST ${LIST_PATH}`]: () => ({ status: 400, body: { error: { code: 'invalid', message: `${stereo.message} (and 1 more)`, field: stereo.field, issues: [stereo, threshold] } } }) },
    });
    const form = await findRenderForm();
    await user.selectOptions(within(form).getByRole('combobox', { name: 'Source' }), 'Kelp-Line Nylon');
    await user.selectOptions(within(form).getByRole('combobox', { name: 'Channels' }), 'Stereo (from two pickup positions)');
    await user.clear(field(form, 'Second pickup position (mm)'));
    await user.type(field(form, 'Second pickup position (mm)'), '800');
    await user.click(within(form).getByRole('button', { name: 'Start render' }));

    const pickup = field(form, 'Second pickup position (mm)');
    await waitFor(() => expect(errorOf(pickup)).toBe('Must lie on the string, below its length (0.65 m)'));
    expect(pickup.getAttribute('aria-invalid')).toBe('true');
    expect(errorOf(field(form, 'Decay threshold (dB)'))).toBe('Must be >= -120');
    // Every problem sits under its field, so no general notice repeats them.
    expect(screen.queryByText('The render was not started')).toBeNull();
  });

  it('shows a single server problem from its one-item issues list, the problem read from the issue', async () => {
    const fade = { field: 'output.length.fadeMs', problem: 'must be <= 500', got: '900', message: 'output.length.fadeMs must be <= 500, got 900' };
    const { user } = renderRendersPage({
      role: 'lead',
      handlers: { [`POST ${LIST_PATH}`]: () => ({ status: 400, body: { error: { code: 'invalid', message: fade.message, field: fade.field, issues: [fade] } } }) },
    });
    const form = await findRenderForm();
    await user.selectOptions(within(form).getByRole('combobox', { name: 'Source' }), 'Kelp-Line Nylon');
    await user.click(within(form).getByRole('button', { name: 'Start render' }));
    await waitFor(() => expect(errorOf(field(form, 'Fade (ms)'))).toBe('Must be <= 500'));
  });

  it('shows why a full studio cannot start a render (409)', async () => {
    const full = "This studio's render storage is full: 1946.2 MB of 2048.0 MB used, and this render needs up to 212.4 MB. Delete old renders, or shorten this one.";
    const { user } = renderRendersPage({ role: 'lead', handlers: { [`POST ${LIST_PATH}`]: () => ({ status: 409, body: { error: { code: 'render_quota_full', message: full } } }) } });
    const form = await findRenderForm();
    await user.selectOptions(within(form).getByRole('combobox', { name: 'Source' }), 'Tidewall lute');
    await user.click(within(form).getByRole('button', { name: 'Start render' }));
    // Announced at once, as every error notice is.
    const notice = (await screen.findByText(full)).closest('[role="alert"]');
    expect(notice?.textContent).toBe(`The render was not started${full}`);
    expect(screen.queryByText('Render queued')).toBeNull();
  });

  it.each(['listener', 'designer'] as const)('shows a %s the form locked, with the reason', async (role) => {
    const { sent } = renderRendersPage({ role });
    const form = await findRenderForm();
    const start = within(form).getByRole('button', { name: 'Start render' }) as HTMLButtonElement;
    expect(start.disabled).toBe(true);
    expect(start.title).toBe(ACTION_REASONS.exportRenders);
    expect(start.getAttribute('aria-description')).toBe(ACTION_REASONS.exportRenders);
    expect((within(form).getByRole('combobox', { name: 'Source' }) as HTMLSelectElement).disabled).toBe(true);
    expect(field(form, 'Decay threshold (dB)').disabled).toBe(true);
    expect((within(form).getByRole('checkbox', { name: 'Multi-note set' }) as HTMLInputElement).disabled).toBe(true);
    expect(screen.getByText(`You can play and download the studio's renders; ${ACTION_REASONS.exportRenders}.`)).toBeTruthy();

    // In the table they may play and download, not cancel or delete.
    const running = await findRenderRow('Kelp-Line Nylon · note set');
    const cancel = within(running).getByRole('button', { name: 'Cancel Kelp-Line Nylon · note set' }) as HTMLButtonElement;
    expect(cancel.disabled).toBe(true);
    expect(cancel.title).toBe(ACTION_REASONS.exportRenders);
    const done = await findRenderRow('Harbour bell, loud');
    const remove = within(done).getByRole('button', { name: 'Delete Harbour bell, loud' }) as HTMLButtonElement;
    expect(remove.disabled).toBe(true);
    expect(remove.title).toBe(ACTION_REASONS.deleteRenders);
    expect(within(done).getByRole('button', { name: 'Play Harbour bell, loud' })).toBeTruthy();
    expect(sent('POST', LIST_PATH)).toHaveLength(0);
  });

  it('lets a producer cancel but not delete', async () => {
    renderRendersPage({ role: 'producer' });
    const done = await findRenderRow('Harbour bell, loud');
    expect((within(done).getByRole('button', { name: 'Delete Harbour bell, loud' }) as HTMLButtonElement).title).toBe(ACTION_REASONS.deleteRenders);
    const form = await findRenderForm();
    expect((within(form).getByRole('button', { name: 'Start render' }) as HTMLButtonElement).disabled).toBe(false);
  });
});
