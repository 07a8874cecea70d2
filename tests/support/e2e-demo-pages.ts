import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../server/seed/demo-seed';
import { SCREENSHOTS_DIR, type E2eHarness } from './e2e-harness';

/** A fresh page (its own cookies) signed in as the demo account of `role`, once the studio's list shows `sessionName`. */
export async function signedInDemoPage(harness: E2eHarness, role: string, sessionName: string, height = 900): Promise<Page> {
  const page = await harness.newPage({ height });
  const account = DEMO_ACCOUNTS.find((candidate) => candidate.role === role);
  if (!account) throw new Error(`no demo account for the role ${role}`);
  await harness.signIn(page, account.email, DEMO_PASSWORD);
  await page.getByRole('link', { name: sessionName }).waitFor();
  return page;
}

/** Opens `sessionName` from the studio's list and waits for its first results; returns the session's id. */
export async function openSessionFromList(page: Page, sessionName: string, timeoutMs = 20_000): Promise<string> {
  await page.getByRole('link', { name: sessionName }).click();
  await page.waitForURL(/\/sessions\//);
  await page.getByTestId('result-figures').waitFor({ timeout: timeoutMs });
  return page.url().split('/sessions/')[1];
}

/**
 * Screenshots of the page for review at 1440×900 and 1280×720, light and dark, saved as
 * `<name>-<width>-<scheme>.png` in the screenshots folder; the page is left at 1440×900, light.
 */
export async function screenshotsForReview(page: Page, name: string): Promise<void> {
  for (const [width, height] of [[1440, 900], [1280, 720]] as const) {
    for (const colorScheme of ['light', 'dark'] as const) {
      await page.setViewportSize({ width, height });
      await page.emulateMedia({ colorScheme });
      await page.waitForTimeout(500); // colours ease over 150 ms after a theme change
      await page.screenshot({ path: join(SCREENSHOTS_DIR, `${name}-${width}-${colorScheme}.png`) });
    }
  }
  await page.emulateMedia({ colorScheme: 'light' });
  await page.setViewportSize({ width: 1440, height: 900 });
}
