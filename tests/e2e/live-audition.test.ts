import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { polylinesFromParts } from '../../shared/collab/excitation-polyline';
import type { PluckPart } from '../../shared/patch/excitation-part';
import type { Patch } from '../../shared/patch/patch-schema';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../server/seed/demo-seed';
import { startE2eHarness, type E2eHarness } from '../support/e2e-harness';
import { openSessionFromList, screenshotsForReview } from '../support/e2e-demo-pages';

/**
 * Live audition in a real browser: a designer loops the preview and drags the pluck; the sound
 * follows the drag. Read through the app's read-only audition probe (src/lib/audio/audition-probe.ts),
 * which exists only because this test sets its flag before the app loads.
 */

const SESSION = 'Lighthouse stair climb';
const MARGIN_PX = 36;
const DRAG_S = 1.6;
/** A deliberate drag: a move every 100 ms, so the worker completes previews between moves even on a loaded machine. */
const MOVE_EVERY_MS = 100;

let harness: E2eHarness;

beforeAll(async () => {
  harness = await startE2eHarness();
}, 180_000);

afterAll(() => harness?.close());

interface ProbeView {
  counts: { starts: number; crossfades: number; extensions: number; stops: number; ended: number; gaps: number };
  loopEvents: Array<{ kind: string; sequence: number; atS: number }>;
  voices: Array<{ sequence: number; readySamples: number; fingerprint: number }>;
  silentWindows: number;
  heardWindows: number;
  contextState: string | null;
  tables: number;
}

/** What the probe has seen so far (plain data out of the page). */
const probe = (page: Page) =>
  page.evaluate(`(() => {
    const p = window.__tautlineAudition;
    return { counts: { ...p.counts }, loopEvents: p.loopEvents.map((e) => ({ kind: e.kind, sequence: e.sequence, atS: e.atS })), voices: p.voices.slice(), silentWindows: p.silentWindows, heardWindows: p.heardWindows, contextState: p.contextState(), tables: p.tables.length };
  })()`) as Promise<ProbeView>;

/** A designer's page with the audition probe switched on, signed in, the session open. */
async function designerWithProbe(): Promise<{ page: Page; sessionId: string }> {
  const page = await harness.newPage({ height: 900 });
  await page.addInitScript('window.__TAUTLINE_TEST_PROBE__ = true;');
  const account = DEMO_ACCOUNTS.find((candidate) => candidate.role === 'designer')!;
  await harness.signIn(page, account.email, DEMO_PASSWORD);
  await page.getByRole('link', { name: SESSION }).waitFor();
  const sessionId = await openSessionFromList(page, SESSION);
  return { page, sessionId };
}

describe('live audition while dragging', () => {
  it('with Loop on, dragging the pluck crossfades each new preview into the playing sound: the context keeps running, the buffer changes, no gap', async () => {
    const { page, sessionId } = await designerWithProbe();

    // The session's string plucked by a fingertip at 250 mm, 4 mm high, 12 mm of contact (as the pluck-drag test sets it).
    const start = (await (await page.request.get(`/api/sessions/${sessionId}`)).json()).session.patch as Patch;
    const pluck: PluckPart = { kind: 'pluck', positionM: 0.25, heightM: 0.004, widthM: 0.012, contact: 'fingertip' };
    const made = polylinesFromParts(start.string.lengthM, [pluck]);
    if (!made.ok) throw new Error(made.reason);
    const plucked = { ...start, excitation: { displacementM: [[0, 0], ...made.displacement!, [start.string.lengthM, 0]], parts: [pluck] } };
    expect((await page.request.patch(`/api/sessions/${sessionId}`, { data: { patch: plucked } })).status()).toBe(200);
    const item = page.getByTestId('excitation-part').first();
    await expect.poll(async () => Number(await item.getAttribute('data-position-mm')), { timeout: 10_000 }).toBe(250);

    // Loop on, play; the first play asks about the level first.
    await page.getByLabel('Loop').check();
    await page.getByRole('button', { name: 'Play preview' }).click();
    await page.getByRole('button', { name: 'Play at this level' }).click();
    await expect.poll(async () => (await probe(page)).counts.starts, { timeout: 10_000 }).toBe(1);
    await expect.poll(async () => (await probe(page)).contextState, { timeout: 10_000 }).toBe('running');
    await page.getByRole('button', { name: '■ Stop' }).waitFor();
    // Heard before anything moves.
    await expect.poll(async () => (await probe(page)).heardWindows, { timeout: 10_000 }).toBeGreaterThan(3);
    const before = await probe(page);

    // The drag: the pluck's handle along the string from 250 mm towards 100 mm and part of the way back, a move every 100 ms for 1.6 s.
    const canvas = (await page.locator('canvas').first().boundingBox())!;
    const handle = { x: canvas.x + Number(await item.getAttribute('data-x-px')), y: canvas.y + Number(await item.getAttribute('data-y-px')) };
    const pxPerM = (canvas.width - 2 * MARGIN_PX) / start.string.lengthM;
    await page.mouse.move(handle.x, handle.y);
    await page.mouse.down();
    const moves = Math.round((DRAG_S * 1000) / MOVE_EVERY_MS);
    for (let step = 1; step <= moves; step++) {
      const along = Math.sin((0.75 * Math.PI * step) / moves); // out to 1 (100 mm), back to about 0.7 (145 mm)
      await page.mouse.move(handle.x - along * 0.15 * pxPerM, handle.y);
      await page.waitForTimeout(MOVE_EVERY_MS);
    }
    await page.mouse.up();
    // The drag's previews are followed: at least three newer ones crossfaded in (the last may arrive after the release).
    const newSequences = (view: ProbeView) => new Set(view.loopEvents.slice(before.loopEvents.length).filter((event) => event.kind === 'crossfade').map((event) => event.sequence)).size;
    await expect.poll(async () => newSequences(await probe(page)), { timeout: 15_000 }).toBeGreaterThanOrEqual(3);
    const after = await probe(page);

    // The context kept running and the loop still plays.
    expect(after.contextState).toBe('running');
    await expect(page.getByRole('button', { name: '■ Stop' }).isVisible()).resolves.toBe(true);
    // Several newer previews were crossfaded in (new sequences), and the buffer's content changed with them.
    const crossfades = after.loopEvents.slice(before.loopEvents.length).filter((event) => event.kind === 'crossfade');
    const sequences = new Set(crossfades.map((event) => event.sequence));
    expect(sequences.size).toBeGreaterThanOrEqual(3);
    expect([...sequences].every((sequence) => sequence > before.loopEvents[0].sequence)).toBe(true);
    const fingerprints = new Set(after.voices.slice(before.voices.length).map((voice) => voice.fingerprint.toPrecision(8)));
    expect(fingerprints.size).toBeGreaterThanOrEqual(3);
    // Never a moment without a voice: no gap reported by the loop, no silent analyser window on the summed voices.
    expect(after.counts.gaps).toBe(0);
    expect(after.silentWindows).toBe(0);
    expect(after.heardWindows - before.heardWindows).toBeGreaterThan(20);
    // Nothing restarted the sound: one start, for the Play press.
    expect(after.counts.starts).toBe(1);

    await screenshotsForReview(page, 'live-audition');

    // Stop fades the loop out.
    await page.getByRole('button', { name: '■ Stop' }).click();
    await expect.poll(async () => (await probe(page)).counts.stops, { timeout: 5_000 }).toBe(1);
    expect((await probe(page)).counts.gaps).toBe(0);
  }, 120_000);
});
