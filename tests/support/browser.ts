import { existsSync } from 'node:fs';
import { chromium, type Browser } from 'playwright-core';

/** Debian's Chromium, installed by .ci/run (or `npm test`'s pretest) with apt-get; playwright-core never downloads a browser. */
export const CHROMIUM_PATH = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

/** The one command that installs the browser the end-to-end tests drive. */
export const CHROMIUM_INSTALL_COMMAND = 'apt-get update && DEBIAN_FRONTEND=noninteractive apt-get install -y chromium';

/** A fresh headless browser (playwright gives it an empty profile of its own). */
export async function launchBrowser(executablePath = CHROMIUM_PATH): Promise<Browser> {
  if (!existsSync(executablePath)) {
    throw new Error(`The end-to-end tests need Chromium at ${executablePath}; install it with: ${CHROMIUM_INSTALL_COMMAND} (as root), or set CHROMIUM_PATH`);
  }
  return chromium.launch({
    executablePath,
    headless: true,
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
}
