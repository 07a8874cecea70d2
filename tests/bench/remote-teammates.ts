/**
 * What the Chromium benchmarks share: a session whose shape has eight free points (one for each
 * editor to drag, as the collaboration benchmark's simulated editors do), one headless Chromium
 * page opened on it with the audition probe switched on, and remote teammates simulated in Node
 * with the web app's own SessionConnection over real websockets, each dragging its own point at
 * 30 Hz (an edit and a presence update per move, one undo step per drag, as the canvas does).
 *
 * Points rather than plucks: a pluck's move rewrites the whole polyline its plucks make (with eight
 * plucks about 120 points per edit), and at 7 × 30 such edits a second the page froze for tens of
 * seconds and the teammates' connections dropped (measured here; see docs/performance.md).
 */
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { movePoint } from '../../shared/collab/point-edits';
import type { Patch } from '../../shared/patch/patch-schema';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../server/seed/demo-seed';
import { CANVAS_MARGIN_PX } from '../../src/features/editor/components/string-canvas';
import type { SessionConnection } from '../../src/lib/live-session/session-connection';
import { openClient, waitForSnapshot } from '../support/collab-client';
import type { E2eHarness } from '../support/e2e-harness';
import { PROJECT_ROOT } from '../support/run-cli';
import { api, logIn } from './bench-api';

export const BENCH_SESSION = 'Lighthouse stair climb';
/** Editors in the loaded case: the measuring page and seven teammates. */
export const EDITORS = 8;
export const TEAMMATE_DRAG_HZ = 30;
/** How far each teammate's point swings either side of where it lies, m, and the swing's period, s. */
const SWING_M = 0.012;
const SWING_PERIOD_S = 1.1;

/** Which React build the served client is: a development build (jsxDEV) is several times slower and must not be measured. */
export function clientBuildKind(): 'production' | 'development' {
  return readdirSync(join(PROJECT_ROOT, 'dist', 'assets')).some((name) => name.startsWith('jsx-dev-runtime')) ? 'development' : 'production';
}

export const round = (value: number) => Math.round(value * 100) / 100;

export function percentile(values: number[], p: number): number {
  if (values.length === 0) return NaN;
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))];
}

export function spread(values: number[]) {
  return { count: values.length, p50: round(percentile(values, 50)), p95: round(percentile(values, 95)), max: round(Math.max(...values)) };
}

/** A plain pluck shape with eight interior points, evenly along the string, 2 and 3 mm high by turns: one for each editor to move. */
export function eightPointPatch(start: Patch): Patch {
  const lengthM = start.string.lengthM;
  const points = Array.from({ length: EDITORS }, (_, index): [number, number] => [Math.round(((index + 1) * lengthM * 1000) / (EDITORS + 1)) / 1000, index % 2 === 0 ? 0.002 : 0.003]);
  return { ...start, excitation: { displacementM: [[0, 0], ...points, [lengthM, 0]] } };
}

export interface BenchSession {
  baseUrl: string;
  sessionId: string;
  patch: Patch;
  /** Tokens of the two demo accounts that may edit (lead, designer). */
  editorTokens: string[];
}

/** Signs the demo lead and designer in, gives the demo session the eight-point shape through the API. */
export async function prepareBenchSession(harness: E2eHarness): Promise<BenchSession> {
  const baseUrl = harness.app.baseUrl;
  const lead = DEMO_ACCOUNTS.find((account) => account.role === 'lead')!;
  const designer = DEMO_ACCOUNTS.find((account) => account.role === 'designer')!;
  const editorTokens = [await logIn(baseUrl, lead.email, DEMO_PASSWORD), await logIn(baseUrl, designer.email, DEMO_PASSWORD)];
  const studioId = (await api(baseUrl, '/api/me', editorTokens[0])).studios[0].id as string;
  const { sessions } = (await api(baseUrl, `/api/studios/${studioId}/sessions`, editorTokens[0])) as { sessions: Array<{ id: string; name: string }> };
  const sessionId = sessions.find((session) => session.name === BENCH_SESSION)!.id;
  const start = (await api(baseUrl, `/api/sessions/${sessionId}`, editorTokens[0])).session.patch as Patch;
  await api(baseUrl, `/api/sessions/${sessionId}`, editorTokens[0], 'PATCH', { patch: eightPointPatch(start) });
  const patch = (await api(baseUrl, `/api/sessions/${sessionId}`, editorTokens[0])).session.patch as Patch;
  return { baseUrl, sessionId, patch, editorTokens };
}

/** The designer's page with the audition probe on (set before the app loads), the session open with its canvas drawn. */
export async function openMeasuringPage(harness: E2eHarness, height = 860): Promise<Page> {
  const page = await harness.newPage({ height });
  await page.addInitScript('window.__TAUTLINE_TEST_PROBE__ = true;');
  const designer = DEMO_ACCOUNTS.find((account) => account.role === 'designer')!;
  await harness.signIn(page, designer.email, DEMO_PASSWORD);
  await page.getByRole('link', { name: BENCH_SESSION }).click();
  await page.waitForURL(/\/sessions\//);
  await page.locator('[data-display-range-m] canvas').first().waitFor({ timeout: 30_000 });
  await page.getByTestId('result-figures').waitFor({ timeout: 30_000 });
  return page;
}

/** Where interior point `index` of `patch` is drawn, from the same mapping the canvas uses. */
export async function pointPx(page: Page, patch: Patch, index: number): Promise<{ x: number; y: number }> {
  const box = (await page.locator('[data-display-range-m] canvas').first().boundingBox())!;
  const range = Number(await page.locator('[data-display-range-m]').getAttribute('data-display-range-m'));
  const [xM, yM] = patch.excitation.displacementM[index + 1];
  return {
    x: box.x + CANVAS_MARGIN_PX + (xM / patch.string.lengthM) * (box.width - 2 * CANVAS_MARGIN_PX),
    y: box.y + box.height / 2 - (yM / range) * (box.height / 2 - CANVAS_MARGIN_PX),
  };
}

/** Selects interior point `index` on the page's canvas (a click on it) and gives the canvas the keyboard. */
export async function selectPoint(page: Page, patch: Patch, index: number): Promise<void> {
  const point = await pointPx(page, patch, index);
  await page.mouse.click(point.x, point.y);
  await page.locator('[data-display-range-m]').focus();
}

/** Remote teammates in Node, each with a point of its own (interior points 0…count−1). */
export class RemoteTeammates {
  private dragging = false;
  private loops: Array<Promise<void>> = [];
  edits = 0;
  refused = 0;

  private constructor(
    readonly connections: SessionConnection[],
    private readonly patch: Patch,
  ) {}

  static async open(session: BenchSession, count: number): Promise<RemoteTeammates> {
    const connections = Array.from({ length: count }, (_, index) => openClient(session.baseUrl, session.sessionId, session.editorTokens[index % session.editorTokens.length], `Teammate ${index + 1}`));
    await Promise.all(connections.map((connection) => waitForSnapshot(connection, (snapshot) => snapshot.synced && snapshot.patch !== null && snapshot.role !== null, 20_000, 'a teammate to sync')));
    return new RemoteTeammates(connections, session.patch);
  }

  /** Starts every teammate dragging its point back and forth at TEAMMATE_DRAG_HZ, on the clock. */
  startDragging(): void {
    this.dragging = true;
    this.loops = this.connections.map((connection, index) => this.drag(connection, index));
  }

  async stopDragging(): Promise<void> {
    this.dragging = false;
    await Promise.all(this.loops);
  }

  private async drag(connection: SessionConnection, index: number): Promise<void> {
    const [homeM, heightM] = this.patch.excitation.displacementM[index + 1];
    const stepMs = 1000 / TEAMMATE_DRAG_HZ;
    const phase = (index * 2 * Math.PI) / this.connections.length;
    connection.beginGesture();
    connection.setPresence({ dragging: { layer: 'displacement', index }, pointerXM: homeM });
    const started = performance.now();
    for (let step = 1; this.dragging; step++) {
      const wait = started + step * stepMs - performance.now();
      if (wait > 0) await new Promise((resolve) => setTimeout(resolve, wait));
      const t = (performance.now() - started) / 1000;
      const positionM = homeM + SWING_M * (Math.sin((2 * Math.PI * t) / SWING_PERIOD_S + phase) - Math.sin(phase));
      let result: { ok: boolean } = { ok: false };
      connection.edit((doc, origin) => {
        // The document holds the interior points only: its point `index` is the patch's `index + 1`.
        result = movePoint(doc, 'displacement', index, positionM, heightM, origin);
      });
      if (result.ok) this.edits++;
      else this.refused++;
      connection.setPresence({ pointerXM: positionM });
    }
    connection.setPresence({ dragging: null, pointerXM: null });
    connection.endGesture();
  }

  close(): void {
    for (const connection of this.connections) connection.destroy();
  }
}

/** The probe's lists, read out of the page (plain data). */
export interface ProbeRecords {
  edits: Array<{ atMs: number; clientId: number; clock: number }>;
  tables: Array<{ atMs: number; sequence: number; stateVector: Record<number, number> }>;
  playable: Array<{ atMs: number; sequence: number; readySamples: number }>;
}

export const readProbe = (page: Page) =>
  page.evaluate(`(() => { const p = window.__tautlineAudition; return { edits: p.edits.slice(), tables: p.tables.slice(), playable: p.playable.slice() }; })()`) as Promise<ProbeRecords>;

/**
 * Edit → mode table and edit → first 250 ms playable, per edit the page made after `sinceMs`:
 * the first table whose state vector includes the edit (its client's clock at least the clock
 * after the edit), and the first preview of that table or a later one with 250 ms ready.
 */
export function editLatencies(records: ProbeRecords, sinceMs: number) {
  const toTable: number[] = [];
  const toAudio: number[] = [];
  let unmatched = 0;
  for (const edit of records.edits) {
    if (edit.atMs < sinceMs) continue;
    const table = records.tables.find((candidate) => candidate.atMs >= edit.atMs && (candidate.stateVector[edit.clientId] ?? 0) >= edit.clock);
    if (!table) {
      unmatched++;
      continue;
    }
    toTable.push(table.atMs - edit.atMs);
    const playable = records.playable.find((candidate) => candidate.sequence >= table.sequence && candidate.atMs >= table.atMs);
    if (playable) toAudio.push(playable.atMs - edit.atMs);
  }
  return { toTable, toAudio, unmatched };
}
