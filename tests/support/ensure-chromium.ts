import { execFileSync } from 'node:child_process';
import { accessSync, constants, existsSync } from 'node:fs';
import { CHROMIUM_INSTALL_COMMAND, CHROMIUM_PATH } from './browser';

/** What `npm test` does about the browser before the suite runs. */
export type ChromiumPlan = { action: 'ready' } | { action: 'install' } | { action: 'stop'; message: string };

/**
 * Ready when the browser is there; install Debian's chromium when we may (root, apt-get present);
 * otherwise stop with one line giving the exact command to run.
 */
export function chromiumPlan(state: { present: boolean; isRoot: boolean; hasAptGet: boolean; checkOnly: boolean; path: string }): ChromiumPlan {
  if (state.present) return { action: 'ready' };
  if (state.isRoot && state.hasAptGet && !state.checkOnly) return { action: 'install' };
  const command = state.isRoot ? CHROMIUM_INSTALL_COMMAND : `sudo sh -c '${CHROMIUM_INSTALL_COMMAND}'`;
  return { action: 'stop', message: `npm test needs Chromium at ${state.path} for the end-to-end tests. Install it with: ${command} (or set CHROMIUM_PATH to a Chromium you have)` };
}

function executable(path: string): boolean {
  try {
    accessSync(path, constants.X_OK);
    return true;
  } catch {
    return false;
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const state = () => ({
    present: executable(CHROMIUM_PATH),
    isRoot: process.getuid?.() === 0,
    hasAptGet: existsSync('/usr/bin/apt-get'),
    checkOnly: process.argv.includes('--check-only'),
    path: CHROMIUM_PATH,
  });
  const plan = chromiumPlan(state());
  if (plan.action === 'install') {
    console.log(`Chromium is missing at ${CHROMIUM_PATH}: installing Debian's chromium (${CHROMIUM_INSTALL_COMMAND})`);
    try {
      execFileSync('apt-get', ['update'], { stdio: 'inherit' });
      execFileSync('apt-get', ['install', '-y', 'chromium'], { stdio: 'inherit', env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' } });
    } catch {
      // reported below
    }
    if (!executable(CHROMIUM_PATH)) {
      console.error(`Installing chromium did not put it at ${CHROMIUM_PATH}. Run: ${CHROMIUM_INSTALL_COMMAND} (or set CHROMIUM_PATH)`);
      process.exit(1);
    }
  } else if (plan.action === 'stop') {
    console.error(plan.message);
    process.exit(1);
  }
}
