import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { polylinesFromParts } from '../../shared/collab/excitation-polyline';
import type { PluckPart } from '../../shared/patch/excitation-part';
import type { Patch } from '../../shared/patch/patch-schema';
import { SCREENSHOTS_DIR as SHOTS, startE2eHarness, type E2eHarness } from '../support/e2e-harness';
import { signedInDemoPage } from '../support/e2e-demo-pages';

const MARGIN_PX = 36;
const SESSION = 'Lighthouse stair climb';

let harness: E2eHarness;

beforeAll(async () => {
  harness = await startE2eHarness();
}, 180_000);

afterAll(() => harness?.close());

const signedInPage = (role: string): Promise<Page> => signedInDemoPage(harness, role, SESSION);

async function openSession(page: Page, sessionId: string): Promise<void> {
  await page.goto(`/sessions/${sessionId}`);
  await page.getByTestId('result-figures').waitFor({ timeout: 20_000 });
}

async function storedPatch(page: Page, sessionId: string): Promise<Patch> {
  const response = await page.request.get(`/api/sessions/${sessionId}`);
  return (await response.json()).session.patch as Patch;
}

/** Polls the stored patch until `ready` holds (the live document reaches the database within a moment), or fails with the last one seen. */
async function storedPatchWhen(page: Page, sessionId: string, ready: (patch: Patch) => boolean): Promise<Patch> {
  let patch = await storedPatch(page, sessionId);
  const deadline = Date.now() + 15_000;
  while (!ready(patch) && Date.now() < deadline) {
    await page.waitForTimeout(150);
    patch = await storedPatch(page, sessionId);
  }
  return patch;
}

/** The pluck's handle as the page describes it: its place along the string, and its centre on screen. */
async function pluckHandle(page: Page): Promise<{ positionMm: number; x: number; y: number }> {
  const item = page.getByTestId('excitation-part').first();
  const box = (await page.locator('canvas').first().boundingBox())!;
  return {
    positionMm: Number(await item.getAttribute('data-position-mm')),
    x: box.x + Number(await item.getAttribute('data-x-px')),
    y: box.y + Number(await item.getAttribute('data-y-px')),
  };
}

/** The tallest point of the stored shape: the pluck's apex. */
function apexOf(patch: Patch): readonly [number, number] {
  return patch.excitation.displacementM.reduce((best, point) => (point[1] > best[1] ? point : best));
}

describe('the pluck as an object you drag', () => {
  it('a designer drags the pluck from 250 mm to 80 mm; the lead sees it move during the drag; the stored apex follows; undo returns it', async () => {
    const designer = await signedInPage('designer');
    const lead = await signedInPage('lead');
    await designer.getByRole('link', { name: SESSION }).click();
    await designer.waitForURL(/\/sessions\//);
    const sessionId = designer.url().split('/sessions/')[1];

    // The session's string plucked by a fingertip at 250 mm, 4 mm high, 12 mm of contact, set through the API.
    const start = await storedPatch(designer, sessionId);
    const pluck: PluckPart = { kind: 'pluck', positionM: 0.25, heightM: 0.004, widthM: 0.012, contact: 'fingertip' };
    const made = polylinesFromParts(start.string.lengthM, [pluck]);
    if (!made.ok) throw new Error(made.reason);
    const plucked = { ...start, excitation: { displacementM: [[0, 0], ...made.displacement!, [start.string.lengthM, 0]], parts: [pluck] } };
    expect((await designer.request.patch(`/api/sessions/${sessionId}`, { data: { patch: plucked } })).status()).toBe(200);

    await openSession(designer, sessionId);
    await openSession(lead, sessionId);
    await designer.getByTestId('peer').filter({ hasText: 'Wren Halloway (lead' }).waitFor({ timeout: 10_000 });
    await expect.poll(async () => (await pluckHandle(lead)).positionMm, { timeout: 10_000 }).toBe(250);
    const handle = await pluckHandle(designer);
    expect(handle.positionMm).toBe(250);
    const canvas = (await designer.locator('canvas').first().boundingBox())!;
    const targetX = canvas.x + MARGIN_PX + (0.08 / start.string.lengthM) * (canvas.width - 2 * MARGIN_PX);

    // The drag, in 24 steps along the string at the handle's height; halfway, the lead's page must already show it moving.
    await designer.mouse.move(handle.x, handle.y);
    await designer.mouse.down();
    const steps = 24;
    let seenMidDrag: number | null = null;
    for (let step = 1; step <= steps; step++) {
      await designer.mouse.move(handle.x + ((targetX - handle.x) * step) / steps, handle.y);
      if (step === steps / 2) {
        await expect.poll(async () => (await pluckHandle(lead)).positionMm, { timeout: 10_000 }).toBeLessThan(240);
        seenMidDrag = (await pluckHandle(lead)).positionMm;
        // The designer's pointer and drag show on the lead's page while the button is still down.
        await lead.getByTestId('peer').filter({ hasText: 'Tamsin Okafor (designer, dragging)' }).waitFor({ timeout: 10_000 });
      }
    }
    await designer.mouse.up();
    expect(seenMidDrag).toBeGreaterThan(90);
    expect(seenMidDrag).toBeLessThan(240);
    await expect.poll(async () => (await pluckHandle(lead)).positionMm, { timeout: 10_000 }).toBeCloseTo(80, 0);

    // After release: the stored patch's pluck and its polyline's apex are at 80 ± 1 mm, with the same height and contact width.
    const dragged = await storedPatchWhen(designer, sessionId, (patch) => Math.abs(apexOf(patch)[0] - 0.08) <= 0.001);
    const [apexXM, apexYM] = apexOf(dragged);
    expect(Math.abs(apexXM - 0.08)).toBeLessThanOrEqual(0.001);
    expect(apexYM).toBeCloseTo(0.004, 9);
    const part = dragged.excitation.parts![0] as PluckPart;
    expect(Math.abs(part.positionM - 0.08)).toBeLessThanOrEqual(0.001);
    expect(part.heightM).toBeCloseTo(0.004, 9);
    expect(part.widthM).toBe(0.012);
    expect(part.contact).toBe('fingertip');
    // The stored polyline is exactly the one the pluck makes where it now is.
    const remade = polylinesFromParts(dragged.string.lengthM, [part]);
    if (!remade.ok) throw new Error(remade.reason);
    expect(dragged.excitation.displacementM.slice(1, -1)).toEqual(remade.displacement);

    await lead.screenshot({ path: join(SHOTS, 'pluck-drag-lead-light.png') });
    await designer.emulateMedia({ colorScheme: 'dark' });
    await designer.waitForTimeout(400);
    await designer.screenshot({ path: join(SHOTS, 'pluck-drag-designer-dark.png') });

    // One undo takes back the whole drag, for everyone.
    await designer.getByRole('button', { name: 'Undo', exact: true }).click();
    const undone = await storedPatchWhen(designer, sessionId, (patch) => apexOf(patch)[0] === 0.25);
    expect(undone.excitation.parts).toEqual([pluck]);
    expect(undone.excitation.displacementM).toEqual(plucked.excitation.displacementM);
    await expect.poll(async () => (await pluckHandle(lead)).positionMm, { timeout: 10_000 }).toBe(250);

    // The keyboard: with the canvas focused, ] steps through the handles (the pluck, then the pickup:
    // the shape's points move with the pluck, so they are not stops) and an arrow moves the pluck 1 mm.
    await designer.locator('[data-display-range-m]').focus();
    const heading = designer.getByRole('region', { name: 'Selected handle' }).getByRole('heading');
    // The drag left the pluck selected; ] goes on to the pickup and back round to the pluck.
    await expect.poll(() => heading.first().textContent()).toBe('Pluck 1');
    await designer.keyboard.press(']');
    await expect.poll(() => heading.first().textContent()).toBe('Pickup');
    await designer.keyboard.press(']');
    await expect.poll(() => heading.first().textContent()).toBe('Pluck 1');
    await designer.keyboard.press('ArrowRight');
    await expect.poll(async () => (await pluckHandle(lead)).positionMm, { timeout: 10_000 }).toBe(251);
    await designer.keyboard.press('Control+z');
    await expect.poll(async () => (await pluckHandle(lead)).positionMm, { timeout: 10_000 }).toBe(250);

    // The contact's right grip dragged 20 px outward widens the contact by twice that, the pluck staying where it is.
    const item = designer.getByTestId('excitation-part').first();
    const gripX = canvas.x + Number(await item.getAttribute('data-right-grip-x-px'));
    const gripY = (await pluckHandle(designer)).y;
    await designer.mouse.move(gripX, gripY);
    await designer.mouse.down();
    for (let step = 1; step <= 5; step++) await designer.mouse.move(gripX + 4 * step, gripY);
    await designer.mouse.up();
    const widerM = 0.012 + (2 * 20 * start.string.lengthM) / (canvas.width - 2 * MARGIN_PX);
    const widened = await storedPatchWhen(designer, sessionId, (patch) => Math.abs((patch.excitation.parts?.[0]?.widthM ?? 0) - widerM) < 2e-4);
    expect(widened.excitation.parts![0].widthM).toBeCloseTo(widerM, 3);
    expect(widened.excitation.parts![0].positionM).toBe(0.25);
    expect(apexOf(widened)).toEqual([0.25, 0.004]);
    await designer.getByRole('button', { name: 'Undo', exact: true }).click();
    expect((await storedPatchWhen(designer, sessionId, (patch) => patch.excitation.parts?.[0]?.widthM === 0.012)).excitation.parts).toEqual([pluck]);
  }, 120_000);

  // The session still holds the pluck the first test laid down (and put back with undo).
  it('adds a strike beside the pluck and drags it up; shows the workbench with both handles at 1440×900 and 1280×720, light and dark, for review', async () => {
    const page = await signedInPage('designer');
    await page.getByRole('link', { name: SESSION }).click();
    await page.waitForURL(/\/sessions\//);
    await page.getByTestId('result-figures').waitFor({ timeout: 20_000 });
    await page.getByTestId('excitation-part').first().waitFor({ state: 'attached', timeout: 10_000 });

    // A strike added beside the pluck (a pluck plus a strike), then dragged up 30 px: its velocity rises and the
    // handle stays under the pointer (the strike layer's scale holds still during the drag).
    const sessionId = page.url().split('/sessions/')[1];
    const tool = page.getByRole('region', { name: 'Pluck tool' });
    await tool.getByLabel('Position').fill('450');
    await tool.getByLabel('Position').press('Enter');
    await tool.getByRole('button', { name: 'Add strike' }).click();
    const strikeItem = page.locator('[data-testid="excitation-part"][data-kind="strike"]');
    await strikeItem.waitFor({ state: 'attached', timeout: 10_000 });
    const canvas = (await page.locator('canvas').first().boundingBox())!;
    const from = { x: canvas.x + Number(await strikeItem.getAttribute('data-x-px')), y: canvas.y + Number(await strikeItem.getAttribute('data-y-px')) };
    await page.mouse.move(from.x, from.y);
    await page.mouse.down();
    for (let step = 1; step <= 6; step++) await page.mouse.move(from.x, from.y - 5 * step);
    await page.mouse.up();
    const struck = await storedPatchWhen(page, sessionId, (patch) => (patch.excitation.parts?.[1] as { velocityMPerS?: number } | undefined)?.velocityMPerS !== 0.5);
    expect(struck.excitation.parts!.map((part) => part.kind)).toEqual(['pluck', 'strike']);
    expect((struck.excitation.parts![1] as { velocityMPerS: number }).velocityMPerS).toBeGreaterThan(0.5);
    expect(Math.abs(canvas.y + Number(await strikeItem.getAttribute('data-y-px')) - (from.y - 30))).toBeLessThan(1.5);
    expect(struck.excitation.velocityMPerS!.length).toBeGreaterThan(3);
    for (const [width, height] of [
      [1440, 900],
      [1280, 720],
    ] as const) {
      await page.setViewportSize({ width, height });
      for (const scheme of ['light', 'dark'] as const) {
        await page.emulateMedia({ colorScheme: scheme });
        await page.waitForTimeout(400);
        await page.screenshot({ path: join(SHOTS, `pluck-handle-${width}x${height}-${scheme}.png`) });
      }
    }
  }, 60_000);
});
