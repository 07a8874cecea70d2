import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../server/seed/demo-seed';
import { SCREENSHOTS_DIR as SHOTS, startE2eHarness, type E2eHarness } from '../support/e2e-harness';

/** The renders page against the app as `npm start` runs it: the seeded producer exports a session. */

let harness: E2eHarness;

beforeAll(async () => {
  harness = await startE2eHarness();
}, 180_000);

afterAll(() => harness?.close());

const account = (role: string) => DEMO_ACCOUNTS.find((candidate) => candidate.role === role)!;

async function rendersPage(role: string): Promise<Page> {
  const page = await harness.newPage({ height: 1400 });
  await harness.signIn(page, account(role).email, DEMO_PASSWORD);
  await page.getByRole('link', { name: 'Lighthouse stair climb' }).waitFor();
  await page.getByRole('link', { name: 'Renders' }).click();
  await page.getByRole('heading', { name: 'New render' }).waitFor();
  return page;
}

describe('the renders page in a real browser', () => {
  it('a producer starts a render of a session, watches its progress, plays it and downloads a WAV; a designer cannot start one', async () => {
    const page = await rendersPage('producer');
    await page.getByLabel('Source').selectOption({ label: 'Lighthouse stair climb' });
    await page.getByLabel('Name (optional)').fill('Stair climb, quay take');
    await page.getByRole('button', { name: 'Start render' }).click();

    // The row appears with a progress bar, and ends done with its figures.
    const row = page.getByRole('row').filter({ hasText: 'Stair climb, quay take' });
    await row.waitFor({ timeout: 10_000 });
    await expect.poll(async () => row.getByRole('link', { name: /Download/ }).count(), { timeout: 60_000 }).toBeGreaterThan(0);
    await expect.poll(() => row.textContent(), { timeout: 10_000 }).toMatch(/LUFS|−18|-18/);

    // Download: a WAV file whose header the browser received.
    const [download] = await Promise.all([page.waitForEvent('download'), row.getByRole('link', { name: /Download/ }).click()]);
    expect(download.suggestedFilename()).toMatch(/\.wav$/);
    const path = await download.path();
    const { readFileSync } = await import('node:fs');
    const bytes = readFileSync(path);
    expect(bytes.toString('ascii', 0, 4)).toBe('RIFF');
    expect(bytes.toString('ascii', 8, 12)).toBe('WAVE');

    // Play: the caution first, then the file plays through the master volume.
    await row.getByRole('button', { name: /Play/ }).click();
    const caution = page.getByRole('button', { name: 'Play at this level' });
    if (await caution.isVisible().catch(() => false)) await caution.click();
    await expect.poll(() => page.evaluate(() => document.body.innerText.includes('Stop')), { timeout: 10_000 }).toBe(true);

    for (const scheme of ['light', 'dark'] as const) {
      await page.emulateMedia({ colorScheme: scheme });
      await page.waitForTimeout(100);
      await page.screenshot({ path: join(SHOTS, `renders-${scheme}.png`), fullPage: true });
    }

    const designer = await rendersPage('designer');
    await expect.poll(() => designer.getByRole('button', { name: 'Start render' }).isDisabled()).toBe(true);
    await designer.getByText(/only leads and producers can export renders/).first().waitFor();
  }, 120_000);
});
