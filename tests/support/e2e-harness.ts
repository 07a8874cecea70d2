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

export interface E2eHarnessOptions {
  /** The browser to launch (default CHROMIUM_PATH). */
  chromiumPath?: string;
  /** Called as soon as the app runs, before the browser starts (the clean-up test reads its process group). */
  onAppStarted?: (app: AppProcess) => void;
}

/**
 * The app started as `npm start` starts it, on a fresh database, and Debian's Chromium to drive it.
 * If the browser does not start, the app is stopped before the error is passed on; `close` stops
 * everything it can even when one step fails.
 */
export async function startE2eHarness(options: E2eHarnessOptions = {}): Promise<E2eHarness> {
  mkdirSync(SCREENSHOTS_DIR, { recursive: true });
  const app = await startAppProcess();
  options.onAppStarted?.(app);
  let browser: Browser;
  try {
    browser = await launchBrowser(options.chromiumPath);
  } catch (error) {
    await app.stop();
    throw error;
  }
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
      const failures: unknown[] = [];
      const attempt = async (step: () => Promise<void>) => {
        try {
          await step();
        } catch (error) {
          failures.push(error);
        }
      };
      for (const context of contexts) await attempt(() => context.close());
      await attempt(() => browser.close());
      await attempt(() => app.stop());
      if (failures.length > 0) throw failures[0];
    },
  };
}
