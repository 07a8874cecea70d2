import { join } from 'node:path';
import type { BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../server/seed/demo-seed';
import { SCREENSHOTS_DIR as SHOTS, startE2eHarness, type E2eHarness } from '../support/e2e-harness';
import { testPatch } from '../support/patches';

/**
 * The Presets page in a real browser at 1440×900 and 1280×720, light and dark: no horizontal page
 * scroll with a preset's details open; on these widths the details sit in a column to the right of
 * the table, and below it on a narrower window; a long name is cut short in its row with the full
 * name as its tooltip. Screenshots land in test-results/screenshots/presets-layout-*.png.
 */

let harness: E2eHarness;
const contexts: BrowserContext[] = [];
const LONG_NAME = 'Saltglass Reach harbour-mouth bell-wire with the long damped tail, second take';

beforeAll(async () => {
  harness = await startE2eHarness();
}, 180_000);

afterAll(async () => {
  for (const context of contexts) await context.close().catch(() => undefined);
  await harness?.close();
});

async function presetsPage(widthPx: number, heightPx: number, colorScheme: 'light' | 'dark'): Promise<Page> {
  const context = await harness.browser.newContext({ baseURL: harness.app.baseUrl, colorScheme, viewport: { width: widthPx, height: heightPx } });
  contexts.push(context);
  const page = await context.newPage();
  const lead = DEMO_ACCOUNTS.find((candidate) => candidate.role === 'lead')!;
  await harness.signIn(page, lead.email, DEMO_PASSWORD);
  await page.getByRole('link', { name: 'Presets' }).click();
  await page.getByRole('table', { name: 'Presets of this studio' }).getByText('Lantern Room Harp', { exact: true }).waitFor({ timeout: 20_000 });
  return page;
}

async function horizontalExtent(page: Page) {
  return page.evaluate(() => ({ scrollWidth: document.scrollingElement!.scrollWidth, innerWidth: window.innerWidth }));
}

async function shoot(page: Page, name: string) {
  // Colours ease for 150 ms after a theme change; let them settle before the picture.
  await page.waitForTimeout(400);
  await page.screenshot({ path: join(SHOTS, `${name}.png`), fullPage: true });
}

describe('presets page layout', () => {
  it('adds a preset with a long name (for the truncation check)', async () => {
    const page = await presetsPage(1440, 900, 'light');
    const studioId = /\/studios\/([^/]+)\/presets/.exec(page.url())![1];
    const answer = await page.request.post(`/api/studios/${studioId}/presets/upload`, {
      multipart: { file: { name: 'long.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(testPatch({ name: LONG_NAME }))) }, name: LONG_NAME, tags: 'harbour, bell, long, wire' },
    });
    expect(answer.status()).toBe(201);
  }, 60_000);

  for (const [widthPx, heightPx] of [
    [1440, 900],
    [1280, 720],
  ] as const) {
    for (const scheme of ['light', 'dark'] as const) {
      it(`fits ${widthPx}×${heightPx} (${scheme}) with the details beside the table`, async () => {
        const page = await presetsPage(widthPx, heightPx, scheme);
        const table = page.getByRole('table', { name: 'Presets of this studio' });
        const longRow = table.getByRole('row').filter({ hasText: LONG_NAME });
        const longName = longRow.locator('p[title]');
        await longName.waitFor();
        expect(await longName.getAttribute('title')).toBe(LONG_NAME);
        // Cut short: the text is wider than its box.
        expect(await longName.evaluate((element) => element.scrollWidth > element.clientWidth)).toBe(true);
        await shoot(page, `presets-layout-${widthPx}-${scheme}-none`);

        const row = table.getByRole('row').filter({ hasText: 'Lantern Room Harp' }).first();
        await row.getByRole('cell').nth(1).click();
        const details = page.getByRole('region', { name: 'Details — “Lantern Room Harp”' });
        await details.getByText('Fundamental').waitFor();
        expect(await row.getAttribute('aria-selected')).toBe('true');
        const tableBox = (await table.boundingBox())!;
        const detailsBox = (await details.boundingBox())!;
        expect(detailsBox.x, 'the details sit to the right of the table').toBeGreaterThanOrEqual(tableBox.x + tableBox.width);
        expect(detailsBox.x + detailsBox.width).toBeLessThanOrEqual(widthPx);
        const extent = await horizontalExtent(page);
        expect(extent.scrollWidth, 'no horizontal page scroll').toBeLessThanOrEqual(extent.innerWidth);
        await shoot(page, `presets-layout-${widthPx}-${scheme}-details`);

        await details.getByRole('button', { name: /^Load into session/ }).click();
        await details.getByRole('combobox', { name: 'Session' }).waitFor();
        const withPanel = await horizontalExtent(page);
        expect(withPanel.scrollWidth, 'no horizontal page scroll with the load panel open').toBeLessThanOrEqual(withPanel.innerWidth);
        await shoot(page, `presets-layout-${widthPx}-${scheme}-load`);
      }, 60_000);
    }
  }

  it('puts the details below the table on a narrow window', async () => {
    // 1200 px: narrower than the two-column layout (1280 px); the app's header itself needs about 1130 px.
    const page = await presetsPage(1200, 900, 'light');
    const table = page.getByRole('table', { name: 'Presets of this studio' });
    const row = table.getByRole('row').filter({ hasText: 'Glasswing Quill' }).first();
    await row.focus();
    await page.keyboard.press('Enter');
    const details = page.getByRole('region', { name: 'Details — “Glasswing Quill”' });
    await details.getByText('Fundamental').waitFor();
    const tableBox = (await table.boundingBox())!;
    const detailsBox = (await details.boundingBox())!;
    expect(detailsBox.y).toBeGreaterThanOrEqual(tableBox.y + tableBox.height);
    const extent = await horizontalExtent(page);
    await shoot(page, 'presets-layout-1200-light-details');
    expect(extent.scrollWidth, 'no horizontal page scroll').toBeLessThanOrEqual(extent.innerWidth);
  }, 60_000);
});
