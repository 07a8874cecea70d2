import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { previewSampleRateHz } from '../../shared/engine/preview-sample-rate';
import { LIMITS } from '../../shared/limits';
import type { Patch } from '../../shared/patch/patch-schema';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../server/seed/demo-seed';
import { SCREENSHOTS_DIR as SHOTS, startE2eHarness, type E2eHarness } from '../support/e2e-harness';
import { testPatch } from '../support/patches';
import { signedInDemoPage, openSessionFromList } from '../support/e2e-demo-pages';

const MARGIN_PX = 36;

let harness: E2eHarness;

beforeAll(async () => {
  harness = await startE2eHarness();
}, 180_000);

afterAll(() => harness?.close());

const signedInPage = (role: string): Promise<Page> => signedInDemoPage(harness, role, 'Lighthouse stair climb', 1000);
const openSession = (page: Page): Promise<string> => openSessionFromList(page, 'Lighthouse stair climb');

async function storedPatch(page: Page, sessionId: string): Promise<Patch> {
  const response = await page.request.get(`/api/sessions/${sessionId}`);
  return (await response.json()).session.patch as Patch;
}

/** The stored patch once it has stopped changing (drags arrive in steps; the patch JSON follows within 200 ms). */
async function settledPatch(page: Page, sessionId: string): Promise<Patch> {
  let previous = JSON.stringify(await storedPatch(page, sessionId));
  for (let attempt = 0; attempt < 50; attempt++) {
    await page.waitForTimeout(300);
    const current = JSON.stringify(await storedPatch(page, sessionId));
    if (current === previous) return JSON.parse(current) as Patch;
    previous = current;
  }
  throw new Error('the stored patch kept changing');
}

/** Where the tallest interior point of the pluck is drawn, from the same mapping the canvas uses. */
async function pluckPointPx(page: Page, patch: Patch): Promise<{ x: number; y: number; index: number }> {
  const box = (await page.locator('canvas').first().boundingBox())!;
  const interior = patch.excitation.displacementM.slice(1, -1);
  const index = interior.reduce((best, point, i) => (Math.abs(point[1]) > Math.abs(interior[best][1]) ? i : best), 0);
  const range = Number(await page.locator('[data-display-range-m]').getAttribute('data-display-range-m'));
  const [xM, yM] = interior[index];
  const x = box.x + MARGIN_PX + (xM / patch.string.lengthM) * (box.width - 2 * MARGIN_PX);
  // The canvas fills its pane: its drawn height is the stage's height.
  const y = box.y + box.height / 2 - (yM / range) * (box.height / 2 - MARGIN_PX);
  return { x, y, index };
}

async function drag(page: Page, from: { x: number; y: number }, dxPx: number): Promise<void> {
  await page.mouse.move(from.x, from.y);
  await page.mouse.down();
  for (let step = 1; step <= 10; step++) await page.mouse.move(from.x + (dxPx * step) / 10, from.y, { steps: 1 });
  await page.mouse.up();
}

describe('the live session editor in a real browser', () => {
  it('a designer drags the pluck, a teammate sees it live with presence, a listener cannot, audition plays, undo restores', async () => {
    const designer = await signedInPage('designer');
    const lead = await signedInPage('lead');
    const sessionId = await openSession(designer);
    await openSession(lead);
    // Who is here, in which role.
    await designer.getByTestId('peer').filter({ hasText: 'Wren Halloway (lead' }).waitFor({ timeout: 10_000 });
    await lead.getByTestId('peer').filter({ hasText: 'Tamsin Okafor (designer' }).waitFor({ timeout: 10_000 });

    // Start from a plain pluck so the dragged point has room to move.
    const figuresFirst = await lead.getByTestId('result-figures').textContent();
    const plain = testPatch({ name: 'Plain pluck', render: { sampleRateHz: 48000, durationS: 2, maxModes: 4096 } });
    expect((await designer.request.patch(`/api/sessions/${sessionId}`, { data: { patch: plain } })).status()).toBe(200);
    await expect.poll(() => lead.getByTestId('result-figures').textContent(), { timeout: 15_000 }).not.toBe(figuresFirst);
    await designer.waitForTimeout(300);
    const before = await settledPatch(designer, sessionId);
    const figuresBefore = await lead.getByTestId('result-figures').textContent();
    const point = await pluckPointPx(designer, before);
    await drag(designer, point, 80);

    // The lead's mode figures change once the drag reaches the server and the compute comes back.
    await expect.poll(() => lead.getByTestId('result-figures').textContent(), { timeout: 15_000 }).not.toBe(figuresBefore);
    const after = await settledPatch(designer, sessionId);
    expect(after.excitation.displacementM[point.index + 1][0]).toBeGreaterThan(before.excitation.displacementM[point.index + 1][0]);
    await lead.screenshot({ path: join(SHOTS, 'editor-two-people-light.png'), fullPage: true });
    await lead.emulateMedia({ colorScheme: 'dark' });
    await lead.waitForTimeout(100);
    await lead.screenshot({ path: join(SHOTS, 'editor-two-people-dark.png'), fullPage: true });

    // A listener's drag changes nothing, and the page says why.
    const listener = await signedInPage('listener');
    await openSession(listener);
    await listener.getByText('You can watch and listen').waitFor();
    const listenerPoint = await pluckPointPx(listener, after);
    await drag(listener, listenerPoint, -120);
    expect((await settledPatch(listener, sessionId)).excitation.displacementM).toEqual(after.excitation.displacementM);

    // Audition: the first play asks first; then the buffer plays at the server's rate and length.
    await designer.getByRole('button', { name: 'Play preview' }).click();
    await designer.getByRole('button', { name: 'Play at this level' }).click();
    const info = await designer.getByTestId('audition-info').textContent({ timeout: 10_000 });
    // The preview follows the patch's length up to 12 s, at a rate that keeps it within the sample budget.
    const previewDurationS = Math.min(after.render.durationS, LIMITS.livePreviewMaxDurationS);
    const previewRateHz = previewSampleRateHz(after.render.sampleRateHz, previewDurationS);
    expect(info).toBe(`${Math.round(previewDurationS * previewRateHz)} samples at ${previewRateHz} Hz · audio running`);

    // A note from the on-screen keyboard (in the workbench's Notes tab): the string retuned and rendered in the browser.
    await designer.getByRole('tab', { name: 'Notes' }).click();
    await designer.getByRole('button', { name: /^Play [A-G]#?\d$/ }).nth(14).click();
    await expect.poll(() => designer.getByTestId('note-played').textContent(), { timeout: 10_000 }).toMatch(/^Played [A-G]#?\d \(\d+\.\d Hz\), computed in \d+ ms$/);

    // Undo brings the point back for everyone.
    await designer.getByRole('button', { name: 'Undo' }).click();
    let undone = after;
    for (let attempt = 0; attempt < 40 && undone.excitation.displacementM[point.index + 1][0] !== before.excitation.displacementM[point.index + 1][0]; attempt++) {
      await designer.waitForTimeout(100);
      undone = await storedPatch(designer, sessionId);
    }
    expect(undone.excitation.displacementM[point.index + 1][0]).toBeCloseTo(before.excitation.displacementM[point.index + 1][0], 12);
  }, 90_000);

  it('lays down a rounded pluck of the given position, height and contact width', async () => {
    const designer = await signedInPage('designer');
    const sessionId = await openSession(designer);
    const tool = designer.getByRole('region', { name: 'Pluck tool' });
    await tool.getByLabel('Position').fill('200');
    await tool.getByLabel('Position').press('Enter');
    await tool.getByLabel('Height').fill('2.5');
    await tool.getByLabel('Height').press('Enter');
    await tool.getByRole('button', { name: 'Lay down pluck' }).click();
    let patch = await storedPatch(designer, sessionId);
    for (let attempt = 0; attempt < 40 && !patch.excitation.displacementM.some(([x, y]) => Math.abs(x - 0.2) < 1e-9 && Math.abs(y - 0.0025) < 1e-9); attempt++) {
      await designer.waitForTimeout(100);
      patch = await storedPatch(designer, sessionId);
    }
    const peak = patch.excitation.displacementM.reduce((best, point) => (point[1] > best[1] ? point : best));
    expect(peak[0]).toBeCloseTo(0.2, 9);
    expect(peak[1]).toBeCloseTo(0.0025, 9);
    expect(patch.excitation.displacementM.length).toBeGreaterThan(10);
    await designer.screenshot({ path: join(SHOTS, 'editor-pluck-light.png'), fullPage: true });

    // A strike layer for a struck tone: added, then a click on the line adds an initial velocity there.
    await designer.getByRole('button', { name: 'Add a strike layer' }).click();
    await designer.getByRole('combobox', { name: 'Clicking the line adds to' }).selectOption('velocity');
    const shaped = await settledPatch(designer, sessionId);
    expect(shaped.excitation.velocityMPerS).toEqual([[0, 0], [shaped.string.lengthM, 0]]);
    const box = (await designer.locator('canvas').first().boundingBox())!;
    const range = Number(await designer.locator('[data-display-range-m]').getAttribute('data-display-range-m'));
    const xM = 0.45;
    const line = shaped.excitation.displacementM;
    const j = line.findIndex(([x]) => x > xM) - 1;
    const yM = line[j][1] + ((line[j + 1][1] - line[j][1]) * (xM - line[j][0])) / (line[j + 1][0] - line[j][0]);
    await designer.mouse.click(box.x + MARGIN_PX + (xM / shaped.string.lengthM) * (box.width - 2 * MARGIN_PX), box.y + box.height / 2 - (yM / range) * (box.height / 2 - MARGIN_PX));
    const struck = await settledPatch(designer, sessionId);
    expect(struck.excitation.velocityMPerS).toHaveLength(3);
    expect(struck.excitation.velocityMPerS![1][0]).toBeCloseTo(xM, 2);
    expect(struck.excitation.velocityMPerS![1][1]).not.toBe(0);
    await designer.screenshot({ path: join(SHOTS, 'editor-strike-light.png'), fullPage: true });
  }, 60_000);
  it('draws freehand, types a point, steps the handles from the keyboard, plays the slow motion, A/B against a preset and a note from a MIDI keyboard', async () => {
    const page = await harness.newPage({ height: 1400 });
    // Headless Chromium has no MIDI device: a stand-in keyboard with one input, driven by the test.
    await page.addInitScript(() => {
      const input = { onmidimessage: null as null | ((event: { data: Uint8Array }) => void) };
      (window as unknown as { __midiInput: typeof input }).__midiInput = input;
      Object.defineProperty(navigator, 'requestMIDIAccess', { configurable: true, value: async () => ({ inputs: new Map([['stand-in', input]]), onstatechange: null }) });
    });
    const designer = DEMO_ACCOUNTS.find((candidate) => candidate.role === 'designer')!;
    await harness.signIn(page, designer.email, DEMO_PASSWORD);
    await page.getByRole('link', { name: 'Lighthouse stair climb' }).waitFor();
    const sessionId = await openSession(page);
    const plain = testPatch({ name: 'Plain pluck', render: { sampleRateHz: 48000, durationS: 2, maxModes: 4096 } });
    expect((await page.request.patch(`/api/sessions/${sessionId}`, { data: { patch: plain } })).status()).toBe(200);
    await expect.poll(async () => (await storedPatch(page, sessionId)).name).toBe('Plain pluck');
    const before = await settledPatch(page, sessionId);

    // Freehand: a stroke across the string becomes the shape, simplified, in one undo step.
    await page.getByRole('radio', { name: 'Draw freehand' }).click();
    const box = (await page.locator('canvas').first().boundingBox())!;
    const range = Number(await page.locator('[data-display-range-m]').getAttribute('data-display-range-m'));
    const drawable = box.width - 2 * MARGIN_PX;
    const halfHeight = box.height / 2 - MARGIN_PX;
    const strokeY = (u: number) => box.y + box.height / 2 - Math.sin(Math.PI * u) * 0.5 * halfHeight;
    await page.mouse.move(box.x + MARGIN_PX + 0.02 * drawable, strokeY(0.02));
    await page.mouse.down();
    for (let step = 1; step <= 80; step++) {
      const u = 0.02 + (0.96 * step) / 80;
      await page.mouse.move(box.x + MARGIN_PX + u * drawable, strokeY(u));
    }
    await page.mouse.up();
    let drawn = before;
    for (let attempt = 0; attempt < 40 && JSON.stringify(drawn.excitation.displacementM) === JSON.stringify(before.excitation.displacementM); attempt++) {
      await page.waitForTimeout(100);
      drawn = await storedPatch(page, sessionId);
    }
    const shape = drawn.excitation.displacementM;
    expect(shape.length).toBeGreaterThan(5);
    expect(shape.length).toBeLessThan(82);
    for (let i = 1; i < shape.length; i++) expect(shape[i][0]).toBeGreaterThan(shape[i - 1][0]);
    // The stroke peaked at half the drawing height: half the displayed range, give or take a pixel.
    const peakM = Math.max(...shape.map(([, y]) => y));
    expect(Math.abs(peakM - 0.5 * range)).toBeLessThan((2 / halfHeight) * range);
    await page.screenshot({ path: join(SHOTS, 'editor-freehand-light.png'), fullPage: true });
    await page.getByRole('button', { name: 'Undo' }).click();
    await expect.poll(async () => JSON.stringify((await storedPatch(page, sessionId)).excitation.displacementM), { timeout: 10_000 }).toBe(JSON.stringify(before.excitation.displacementM));

    // The keyboard and typed numbers: ] selects the first point; its displacement is typed in.
    await page.getByRole('radio', { name: 'Edit points' }).click();
    await page.getByLabel(/^String canvas/).focus();
    await page.keyboard.press(']');
    const handle = page.getByRole('region', { name: 'Selected handle' });
    await handle.getByText('Point 1 of the shape').waitFor();
    await handle.getByLabel('Displacement').fill('1.5');
    await handle.getByLabel('Displacement').press('Enter');
    await expect.poll(async () => (await storedPatch(page, sessionId)).excitation.displacementM[1][1], { timeout: 10_000 }).toBeCloseTo(0.0015, 9);
    await handle.getByLabel('Position').fill('900');
    await handle.getByLabel('Position').press('Enter');
    await handle.getByRole('alert').filter({ hasText: 'between its neighbours' }).waitFor();
    // Arrow keys move the selected point 1 mm along the string.
    const typed = await settledPatch(page, sessionId);
    await page.getByLabel(/^String canvas/).focus();
    await page.keyboard.press('ArrowRight');
    await expect.poll(async () => (await storedPatch(page, sessionId)).excitation.displacementM[1][0], { timeout: 10_000 }).toBeCloseTo(typed.excitation.displacementM[1][0] + 0.001, 9);

    // Slow motion (a tab of the workbench): the string on its own stage moves while it plays.
    await page.getByRole('tab', { name: 'Slow motion' }).click();
    const motion = page.getByTestId('string-motion');
    const still = await motion.screenshot();
    await page.getByRole('button', { name: 'Play motion' }).click();
    await page.waitForTimeout(400);
    expect((await motion.screenshot()).equals(still)).toBe(false);
    await page.getByRole('button', { name: 'Pause' }).click();

    // A/B: the session's preview, then a preset's, through the same output.
    await page.getByRole('button', { name: 'Play preview' }).click();
    await page.getByRole('button', { name: 'Play at this level' }).click();
    await expect.poll(() => page.getByTestId('audition-info').textContent(), { timeout: 10_000 }).toMatch(/samples at 48000 Hz · audio running$/);
    const compare = page.getByRole('combobox', { name: 'Compare with' });
    const presetName = (await compare.locator('option').nth(1).textContent())!;
    await compare.selectOption({ label: presetName });
    await page.getByRole('radio', { name: `B: ${presetName}` }).click();
    await page.getByRole('button', { name: '▶ Play B', exact: true }).click();
    await expect.poll(() => page.getByTestId('audition-info').textContent(), { timeout: 10_000 }).toMatch(new RegExp(`^B: ${presetName.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')} · \\d+\\.\\d\\d s$`));

    // A note-on from the MIDI keyboard plays that note, retuned and rendered.
    await page.getByRole('tab', { name: 'Notes' }).click();
    await page.getByRole('button', { name: 'Use MIDI keyboard' }).click();
    await page.getByText('MIDI: 1 input connected.').waitFor();
    await page.evaluate(() => (window as unknown as { __midiInput: { onmidimessage: (event: { data: Uint8Array }) => void } }).__midiInput.onmidimessage({ data: new Uint8Array([0x90, 64, 100]) }));
    await expect.poll(() => page.getByTestId('note-played').textContent(), { timeout: 10_000 }).toMatch(/^Played E4 \(329\.6 Hz\), computed in \d+ ms$/);
  }, 90_000);
});
