import { screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { vi } from 'vitest';
import type { Role } from '../../../shared/access/roles';
import type { MeResponse, PresetSummary, SessionSummary } from '../../../shared/api/responses';
import type { RenderView } from '../../../shared/renders/render-settings';
import RendersPage from '../../../src/app/routes/renders-page';
import type { RenderList } from '../../../src/features/renders/api/get-renders';
import { fakeFetch, renderAt, type FakeResponse } from '../render-page';

/**
 * The renders page against a fake API. Demo data belongs to the invented studio Kestrel Lantern
 * Audio and its game Saltglass Reach; every figure is invented.
 */

export const STUDIO_ID = 'studio-kla';
export const LIST_PATH = `/api/studios/${STUDIO_ID}/renders`;
const WREN = { id: 'user-wren', displayName: 'Wren Halloway' };
const JOAQUIN = { id: 'user-joaquin', displayName: 'Joaquín Reyes' };

export function meAs(role: Role): MeResponse {
  return {
    user: { id: WREN.id, email: 'wren@kestrel-lantern.example', displayName: WREN.displayName, createdAt: '2026-10-01T09:00:00.000Z' },
    studios: [{ id: STUDIO_ID, name: 'Kestrel Lantern Audio', slug: 'kestrel-lantern-audio', role, createdAt: '2026-10-01T09:00:00.000Z' }],
  };
}

const session = (id: string, name: string, archived = false): SessionSummary => ({
  id,
  studioId: STUDIO_ID,
  name,
  archived,
  createdAt: '2026-11-01T09:00:00.000Z',
  updatedAt: '2026-11-29T09:00:00.000Z',
  createdBy: WREN,
  updatedBy: WREN,
});

export const SESSIONS: SessionSummary[] = [session('session-harbour', 'Saltglass harbour bell'), session('session-tidewall', 'Tidewall lute'), session('session-old', 'Old lighthouse sketch', true)];

export const PRESETS: PresetSummary[] = [
  { id: 'preset-kelp', studioId: STUDIO_ID, name: 'Kelp-Line Nylon', tags: ['nylon'], description: '', version: 1, createdAt: '2026-11-02T09:00:00.000Z', updatedAt: '2026-11-20T10:00:00.000Z', author: WREN },
];

/** A done stereo render of a session, levelled to −16 LUFS. */
export const DONE_RENDER: RenderView = {
  id: 'render-bell',
  studioId: STUDIO_ID,
  kind: 'single',
  name: 'Harbour bell, loud',
  state: 'done',
  progressPercent: 100,
  source: { kind: 'session', id: 'session-harbour', name: 'Saltglass harbour bell' },
  output: {
    sampleRateHz: 48000,
    format: 'pcm24',
    channels: { kind: 'stereo', secondPickupPositionM: 0.14 },
    length: { kind: 'untilDecayed', thresholdDb: -90, fadeMs: 20, maxDurationS: 30 },
    normalization: { kind: 'loudness', targetLufs: -16, truePeakCeilingDbtp: -1 },
  },
  noteSet: null,
  durationS: 4.2133,
  sizeBytes: 1_213_440,
  peakDbfs: -1.42,
  truePeakDbtp: -1.03,
  integratedLufs: -16.004,
  fileCount: 1,
  error: null,
  createdBy: WREN,
  createdAt: '2026-12-01T10:00:00.000Z',
  finishedAt: '2026-12-01T10:00:09.000Z',
};

/** A note set of a preset, 42 % through. */
export const RUNNING_RENDER: RenderView = {
  id: 'render-kelp-set',
  studioId: STUDIO_ID,
  kind: 'noteSet',
  name: 'Kelp-Line Nylon · note set',
  state: 'rendering',
  progressPercent: 42,
  source: { kind: 'preset', id: 'preset-kelp', name: 'Kelp-Line Nylon' },
  output: {
    sampleRateHz: 44100,
    format: 'pcm16',
    channels: { kind: 'mono' },
    length: { kind: 'fixed', durationS: 3 },
    normalization: { kind: 'peak', ceilingDbfs: -1 },
  },
  noteSet: { fromMidi: 36, toMidi: 84, stepSemitones: 3, strengths: 3, retuneBy: 'tension' },
  durationS: null,
  sizeBytes: null,
  peakDbfs: null,
  truePeakDbtp: null,
  integratedLufs: null,
  fileCount: null,
  error: null,
  createdBy: JOAQUIN,
  createdAt: '2026-12-01T11:00:00.000Z',
  finishedAt: null,
};

export const FAILED_RENDER: RenderView = {
  ...DONE_RENDER,
  id: 'render-lute',
  name: 'Tidewall lute, first take',
  state: 'failed',
  progressPercent: 12,
  source: { kind: 'session', id: 'session-tidewall', name: 'Tidewall lute' },
  durationS: null,
  sizeBytes: null,
  peakDbfs: null,
  truePeakDbtp: null,
  integratedLufs: null,
  fileCount: null,
  error: 'the server stopped before this render finished; start it again',
  createdAt: '2026-11-30T15:00:00.000Z',
  finishedAt: '2026-11-30T15:01:00.000Z',
};

export const STORAGE = { usedBytes: 1_288_490_189, quotaBytes: 2 * 1024 ** 3 };

export interface RendersPageOptions {
  role: Role;
  /** The list the server answers with; a function is asked on every GET (so a test can change it). */
  list?: RenderList | (() => RenderList);
  /** Further routes, e.g. `POST /api/studios/studio-kla/renders`. */
  handlers?: Record<string, (body: unknown) => FakeResponse>;
}

/** Renders the renders page at /studios/studio-kla/renders with a fake fetch. */
export function renderRendersPage({ role, list = { renders: [RUNNING_RENDER, DONE_RENDER, FAILED_RENDER], storage: STORAGE }, handlers = {} }: RendersPageOptions) {
  const api = fakeFetch({
    'GET /api/me': () => ({ body: meAs(role) }),
    [`GET /api/studios/${STUDIO_ID}/sessions`]: () => ({ body: { sessions: SESSIONS } }),
    [`GET /api/studios/${STUDIO_ID}/presets`]: () => ({ body: { presets: PRESETS } }),
    [`GET ${LIST_PATH}`]: () => ({ body: typeof list === 'function' ? list() : list }),
    ...handlers,
  });
  vi.stubGlobal('fetch', api.fetchImpl);
  const user = userEvent.setup();
  const view = renderAt(`/studios/${STUDIO_ID}/renders`, [{ path: '/studios/:studioId/renders', element: <RendersPage /> }]);
  const sent = (method: string, path: string) => api.calls.filter((call) => call.method === method && call.path.split('?')[0] === path);
  return { ...view, api, user, sent };
}

/** The table row of a render, found by its name. */
export async function findRenderRow(name: string): Promise<HTMLElement> {
  const table = await screen.findByRole('table', { name: 'Renders of this studio' });
  const cell = await within(table).findByText(name, { selector: 'p' });
  const row = cell.closest('tr');
  if (!row) throw new Error(`${name} is not in a table row`);
  return row;
}

/** The new-render form, once the page has loaded its sources. */
export async function findRenderForm(): Promise<HTMLElement> {
  const form = await screen.findByRole('form', { name: 'New render' });
  await within(form).findByRole('option', { name: 'Saltglass harbour bell' });
  return form;
}
