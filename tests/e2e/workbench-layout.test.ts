import { join } from 'node:path';
import type { BrowserContext, Locator, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../server/seed/demo-seed';
import { SCREENSHOTS_DIR as SHOTS, startE2eHarness, type E2eHarness } from '../support/e2e-harness';

/**
 * The session workbench fits one screen: at 1440×900 and 1280×720, light and dark, reached by a
 * click and by a direct load, the canvas, the playback controls, the mode chart and the losses
 * panel's fields are inside the window with no page scroll either way; the dividers are remembered
 * after a reload; the canvas is dark on a direct load in the dark theme.
 */

let harness: E2eHarness;
const contexts: BrowserContext[] = [];

beforeAll(async () => {
  harness = await startE2eHarness();
}, 180_000);

afterAll(async () => {
  for (const context of contexts) await context.close().catch(() => undefined);
  await harness?.close();
});

const SIZES = [
  { widthPx: 1440, heightPx: 900 },
  { widthPx: 1280, heightPx: 720 },
] as const;

async function signedInPage(widthPx: number, heightPx: number, colorScheme: 'light' | 'dark'): Promise<Page> {
  const context = await harness.browser.newContext({ baseURL: harness.app.baseUrl, colorScheme, viewport: { width: widthPx, height: heightPx } });
  contexts.push(context);
  const page = await context.newPage();
  const designer = DEMO_ACCOUNTS.find((candidate) => candidate.role === 'designer')!;
  await harness.signIn(page, designer.email, DEMO_PASSWORD);
  await page.getByRole('link', { name: 'Lighthouse stair climb' }).waitFor();
  return page;
}

async function waitForWorkbench(page: Page): Promise<void> {
  await page.getByTestId('result-figures').waitFor({ state: 'attached', timeout: 20_000 });
  await page.getByRole('figure', { name: 'Modes' }).locator('svg').first().waitFor({ timeout: 20_000 });
}

/** The element's box lies wholly inside the window. */
async function expectInsideWindow(page: Page, locator: Locator, what: string): Promise<void> {
  const box = await locator.boundingBox();
  const { width, height } = page.viewportSize()!;
  expect(box, `${what} is laid out`).not.toBeNull();
  const inside = box!.x >= 0 && box!.y >= 0 && box!.x + box!.width <= width + 0.5 && box!.y + box!.height <= height + 0.5;
  expect(inside, `${what} at ${JSON.stringify(box)} is inside ${width}×${height}`).toBe(true);
}

async function expectNoPageScroll(page: Page): Promise<void> {
  const extent = await page.evaluate(() => {
    const root = document.scrollingElement!;
    return { scrollHeight: root.scrollHeight, scrollWidth: root.scrollWidth, innerHeight: window.innerHeight, innerWidth: window.innerWidth };
  });
  expect(extent.scrollHeight, 'no vertical page scroll').toBeLessThanOrEqual(extent.innerHeight + 1);
  expect(extent.scrollWidth, 'no horizontal page scroll').toBeLessThanOrEqual(extent.innerWidth + 1);
}

async function expectWorkbenchFits(page: Page, size: { widthPx: number; heightPx: number }): Promise<void> {
  await expectNoPageScroll(page);
  await expectInsideWindow(page, page.locator('[data-display-range-m] canvas').first(), 'the string canvas');
  await expectInsideWindow(page, page.getByRole('button', { name: /Play preview|Stop/ }), 'the play button');
  await expectInsideWindow(page, page.getByRole('figure', { name: 'Modes' }), 'the mode chart');
  const losses = page.getByRole('region', { name: 'Losses' });
  const fields = losses.locator('input, select');
  expect(await fields.count()).toBeGreaterThan(0);
  for (let i = 0; i < (await fields.count()); i++) await expectInsideWindow(page, fields.nth(i), `losses field ${i + 1}`);
  // The header stays on one row: the brand, the studio sections and the sign-out share a line.
  const brand = (await page.getByRole('link', { name: 'Tautline' }).boundingBox())!;
  const signOut = (await page.getByRole('button', { name: 'Sign out' }).boundingBox())!;
  expect(Math.abs(brand.y + brand.height / 2 - (signOut.y + signOut.height / 2))).toBeLessThan(4);
  if (size.widthPx >= 1440) {
    // At 1440×900 every parameter panel's heading is on screen too.
    for (const name of ['String', 'Losses', 'Pickup', 'Render']) await expectInsideWindow(page, page.getByRole('region', { name }).getByRole('heading', { name }), `the ${name} panel's title`);
  }
}

/** The canvas's colour a few pixels in from its top-left corner, where only the background is drawn. */
async function canvasBackground(page: Page): Promise<[number, number, number]> {
  return page.evaluate(() => {
    const canvas = document.querySelector('[data-display-range-m] canvas') as HTMLCanvasElement;
    const [r, g, b] = canvas.getContext('2d')!.getImageData(3, 3, 1, 1).data;
    return [r, g, b] as [number, number, number];
  });
}

const luminance = ([r, g, b]: [number, number, number]) => 0.2126 * r + 0.7152 * g + 0.0722 * b;

describe('the session workbench fits one screen', () => {
  for (const size of SIZES) {
    for (const scheme of ['light', 'dark'] as const) {
      it(`at ${size.widthPx}×${size.heightPx}, ${scheme}: opened from the list and loaded directly`, async () => {
        const page = await signedInPage(size.widthPx, size.heightPx, scheme);
        await page.getByRole('link', { name: 'Lighthouse stair climb' }).click();
        await page.waitForURL(/\/sessions\//);
        await waitForWorkbench(page);
        await expectWorkbenchFits(page, size);

        // A direct load of the same address (what a reload or a shared link does).
        await page.goto(page.url());
        await waitForWorkbench(page);
        await expectWorkbenchFits(page, size);
        const background = await canvasBackground(page);
        if (scheme === 'dark') expect(luminance(background), `canvas background ${background.join(',')} is dark`).toBeLessThan(60);
        else expect(luminance(background), `canvas background ${background.join(',')} is light`).toBeGreaterThan(200);
        await page.waitForTimeout(400);
        await page.screenshot({ path: join(SHOTS, `workbench-${size.widthPx}x${size.heightPx}-${scheme}.png`) });
      }, 90_000);
    }
  }

  it('the dividers are dragged and the layout is remembered after a reload', async () => {
    const page = await signedInPage(1440, 900, 'light');
    await page.getByRole('link', { name: 'Lighthouse stair climb' }).click();
    await waitForWorkbench(page);
    const divider = page.getByRole('separator', { name: 'Resize the canvas and the parameter panels' });
    const canvasWidthBefore = (await page.locator('[data-display-range-m] canvas').first().boundingBox())!.width;
    const box = (await divider.boundingBox())!;
    await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
    await page.mouse.down();
    for (let step = 1; step <= 10; step++) await page.mouse.move(box.x + box.width / 2 + 15 * step, box.y + box.height / 2);
    await page.mouse.up();
    const share = Number(await divider.getAttribute('aria-valuenow'));
    expect(share).toBeGreaterThan(60);
    await expect.poll(async () => (await page.locator('[data-display-range-m] canvas').first().boundingBox())!.width).toBeGreaterThan(canvasWidthBefore + 100);
    // The keyboard moves the lower divider too.
    const lower = page.getByRole('separator', { name: 'Resize the canvas and the charts' });
    const lowerBefore = Number(await lower.getAttribute('aria-valuenow'));
    await lower.focus();
    await page.keyboard.press('ArrowUp');
    await page.keyboard.press('ArrowUp');
    expect(Number(await lower.getAttribute('aria-valuenow'))).toBe(lowerBefore - 4);

    await page.reload();
    await waitForWorkbench(page);
    expect(Number(await page.getByRole('separator', { name: 'Resize the canvas and the parameter panels' }).getAttribute('aria-valuenow'))).toBe(share);
    expect(Number(await page.getByRole('separator', { name: 'Resize the canvas and the charts' }).getAttribute('aria-valuenow'))).toBe(lowerBefore - 4);
    await expect.poll(async () => (await page.locator('[data-display-range-m] canvas').first().boundingBox())!.width).toBeGreaterThan(canvasWidthBefore + 100);
    await expectNoPageScroll(page);
  }, 90_000);
});
