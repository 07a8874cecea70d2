import { vi } from 'vitest';
import type { Role } from '../../../shared/access/roles';
import type { MeResponse, PresetDetail, PresetSummary, SessionSummary } from '../../../shared/api/responses';
import type { Patch } from '../../../shared/patch/patch-schema';

/**
 * A small stand-in for the Tautline API, answering the requests the presets page makes. Demo data
 * belongs to the invented studio Kestrel Lantern Audio; the patch values are invented too.
 */

export const STUDIO_ID = 'studio-kla';
export const STUDIO_NAME = 'Kestrel Lantern Audio';

/** A nylon-like string near G3: f0 = √(60.47 / 9.316e-4) / (2 · 0.65) ≈ 195.98 Hz. */
export const NYLON_PATCH: Patch = {
  name: 'Kelp-Line Nylon',
  string: { lengthM: 0.65, tensionN: 60.47, linearDensityKgPerM: 9.316e-4, inharmonicityB: 9.2e-5 },
  excitation: {
    displacementM: [
      [0, 0],
      [0.167, 0.003],
      [0.65, 0],
    ],
  },
  damping: { b1PerS: 1.1, b2M2PerS: 2e-4 },
  pickup: { positionM: 0.09, output: 'displacement' },
  render: { sampleRateHz: 48000, durationS: 3, maxModes: 4096 },
};

const person = (id: string, displayName: string) => ({ id, displayName });
const WREN = person('user-wren', 'Wren Halloway');
const TAMSIN = person('user-tamsin', 'Tamsin Okafor');

function preset(id: string, name: string, tags: string[], description: string, updatedAt: string, author = WREN, version = 1): PresetDetail {
  return {
    id,
    studioId: STUDIO_ID,
    name,
    tags,
    description,
    version,
    createdAt: '2026-11-02T09:00:00.000Z',
    updatedAt,
    author,
    patch: { ...NYLON_PATCH, name },
  };
}

export function demoPresets(): PresetDetail[] {
  return [
    preset('preset-kelp', 'Kelp-Line Nylon', ['nylon', 'pluck', 'warm'], 'A warm fingertip pluck near the middle of the string.', '2026-11-20T10:00:00.000Z', WREN, 3),
    preset('preset-breakwater', 'Breakwater Bass', ['bass', 'wound'], 'A heavy wound string for the harbour theme.', '2026-11-28T16:30:00.000Z', TAMSIN),
    preset('preset-glasswing', 'Glasswing Quill', ['bright', 'pluck'], 'A thin, bright quill pluck.', '2026-11-10T08:15:00.000Z', TAMSIN, 2),
  ];
}

export function demoSessions(): SessionSummary[] {
  const session = (id: string, name: string, archived: boolean): SessionSummary => ({
    id,
    studioId: STUDIO_ID,
    name,
    archived,
    createdAt: '2026-11-01T09:00:00.000Z',
    updatedAt: '2026-11-29T09:00:00.000Z',
    createdBy: WREN,
    updatedBy: WREN,
  });
  return [session('session-harbour', 'Harbour night cue', false), session('session-tidepool', 'Tide-pool loops', false), session('session-old', 'Old lighthouse sketch', true)];
}

export interface RecordedRequest {
  method: string;
  url: URL;
  body: unknown;
}

type UploadAnswer = { status: 201 } | { status: 400 | 422; body: unknown };

export interface FakeApiOptions {
  role: Role;
  /** How the upload route answers; 201 adds the uploaded preset to the library. */
  upload?: UploadAnswer;
  /** When set, the preset list answers with this server error. */
  listFailure?: 500 | 503;
}

const json = (status: number, body: unknown) => new Response(body === undefined ? null : JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });
const summary = ({ patch: _patch, ...rest }: PresetDetail): PresetSummary => rest;

export function createFakeApi({ role, upload = { status: 201 }, listFailure }: FakeApiOptions) {
  const state = { presets: demoPresets(), sessions: demoSessions(), requests: [] as RecordedRequest[], upload };
  const me: MeResponse = {
    user: { id: role === 'lead' ? WREN.id : 'user-pell', email: 'someone@kestrel-lantern.example', displayName: role === 'lead' ? WREN.displayName : 'Pell Ashby', createdAt: '2026-10-01T09:00:00.000Z' },
    studios: [{ id: STUDIO_ID, name: STUDIO_NAME, slug: 'kestrel-lantern-audio', role, createdAt: '2026-10-01T09:00:00.000Z' }],
  };

  async function answer(input: RequestInfo | URL, init: RequestInit = {}): Promise<Response> {
    const url = new URL(typeof input === 'string' ? input : input instanceof URL ? input.href : input.url, 'http://localhost');
    const method = init.method ?? 'GET';
    const body = typeof init.body === 'string' ? (JSON.parse(init.body) as unknown) : init.body;
    state.requests.push({ method, url, body });
    const path = url.pathname;
    const presetMatch = /^\/api\/presets\/([^/]+)$/.exec(path);

    if (method === 'GET' && path === '/api/me') return json(200, me);
    if (method === 'GET' && path === `/api/studios/${STUDIO_ID}/sessions`) {
      const includeArchived = url.searchParams.get('archived') === 'true';
      return json(200, { sessions: state.sessions.filter((session) => includeArchived || !session.archived) });
    }
    if (method === 'GET' && path === `/api/studios/${STUDIO_ID}/presets`) {
      if (listFailure) return json(listFailure, { error: { code: 'internal', message: 'Something went wrong on the server' } });
      const q = url.searchParams.get('q')?.toLowerCase();
      const tag = url.searchParams.get('tag');
      const sort = url.searchParams.get('sort') ?? 'name';
      const rows = state.presets
        .filter((row) => !q || row.name.toLowerCase().includes(q) || row.description.toLowerCase().includes(q))
        .filter((row) => !tag || row.tags.includes(tag))
        .sort((a, b) =>
          sort === 'date' ? Date.parse(b.updatedAt) - Date.parse(a.updatedAt) : sort === 'author' ? (a.author?.displayName ?? '').localeCompare(b.author?.displayName ?? '') || a.name.localeCompare(b.name) : a.name.localeCompare(b.name),
        );
      return json(200, { presets: rows.map(summary) });
    }
    if (method === 'POST' && path === `/api/studios/${STUDIO_ID}/presets/upload`) {
      if (role !== 'lead') return json(403, { error: { code: 'forbidden', message: 'Not allowed' } });
      if (state.upload.status !== 201) return json(state.upload.status, state.upload.body);
      const form = body as FormData;
      const file = form.get('file') as File;
      const name = (form.get('name') as string | null) ?? file.name.replace(/\.json$/, '');
      const tags = ((form.get('tags') as string | null) ?? '').split(',').map((tag) => tag.trim().toLowerCase()).filter(Boolean);
      const created = preset(`preset-${state.presets.length + 1}`, name, tags, '', '2026-12-01T12:00:00.000Z');
      state.presets.push(created);
      return json(201, { preset: created });
    }
    if (presetMatch) {
      const found = state.presets.find((row) => row.id === presetMatch[1]);
      if (!found) return json(404, { error: { code: 'not_found', message: 'Preset not found' } });
      if (method === 'GET') return json(200, { preset: found });
      if (method === 'PATCH') {
        Object.assign(found, body, { updatedAt: '2026-12-01T12:30:00.000Z' });
        return json(200, { preset: found });
      }
      if (method === 'DELETE') {
        state.presets = state.presets.filter((row) => row !== found);
        return json(204, undefined);
      }
    }
    const loadMatch = /^\/api\/sessions\/([^/]+)\/load-preset$/.exec(path);
    if (method === 'POST' && loadMatch) {
      const session = state.sessions.find((row) => row.id === loadMatch[1]);
      const source = state.presets.find((row) => row.id === (body as { presetId: string }).presetId);
      if (!session || !source) return json(404, { error: { code: 'not_found', message: 'Session not found' } });
      return json(200, { session: { ...session, patch: source.patch } });
    }
    return json(404, { error: { code: 'not_found', message: `No fake route for ${method} ${path}` } });
  }

  return {
    state,
    fetch: vi.fn(answer),
    /** The requests so far to one path, e.g. the studio's preset list. */
    requestsTo: (method: string, path: string) => state.requests.filter((request) => request.method === method && request.url.pathname === path),
  };
}
