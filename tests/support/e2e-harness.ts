import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { startAppProcess, type AppProcess } from './app-process';
import { launchBrowser } from './browser';
import { PROJECT_ROOT } from './run-cli';

/** Screenshots for review land here (git-ignored). */
export const SCREENSHOTS_DIR = join(PROJECT_ROOT, 'test-results', 'screenshots');

export interface E2eHarness {
  app: AppProcess;
  browser: Browser;
  /** A fresh browser context (its own cookies) on the app, and a page in it. */
  newPage(options?: { colorScheme?: 'light' | 'dark'; height?: number }): Promise<Page>;
  /** Signs a page in through the sign-in form. */
  signIn(page: Page, email: string, password: string): Promise<void>;
  close(): Promise<void>;
}

/** The app started as `npm start` starts it, on a fresh database, and Debian's Chromium to drive it. */
export async function startE2eHarness(): Promise<E2eHarness> {
  mkdirSync(SCREENSHOTS_DIR, { recursive: true });
  const app = await startAppProcess();
  const browser = await launchBrowser();
  const contexts: BrowserContext[] = [];
  return {
    app,
    browser,
    async newPage({ colorScheme = 'light', height = 860 } = {}) {
      const context = await browser.newContext({ baseURL: app.baseUrl, colorScheme, viewport: { width: 1280, height } });
      contexts.push(context);
      return context.newPage();
    },
    async signIn(page, email, password) {
      await page.goto('/sign-in');
      await page.getByLabel('E-mail').fill(email);
      await page.getByLabel('Password').fill(password);
      await page.getByRole('button', { name: 'Sign in' }).click();
    },
    async close() {
      for (const context of contexts) await context.close();
      await browser.close();
      await app.stop();
    },
  };
}
