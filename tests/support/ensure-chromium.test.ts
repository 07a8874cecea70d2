import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { CHROMIUM_INSTALL_COMMAND } from './browser';
import { chromiumPlan } from './ensure-chromium';
import { PROJECT_ROOT } from './run-cli';

const base = { present: false, isRoot: true, hasAptGet: true, checkOnly: false, path: '/usr/bin/chromium' };

describe('npm test gets its browser (pretest)', () => {
  it('does nothing when Chromium is there', () => {
    expect(chromiumPlan({ ...base, present: true })).toEqual({ action: 'ready' });
  });

  it('installs Debian\'s chromium when missing, as root with apt-get', () => {
    expect(chromiumPlan(base)).toEqual({ action: 'install' });
  });

  it('otherwise stops with one line giving the exact command', () => {
    const plan = chromiumPlan({ ...base, isRoot: false });
    expect(plan.action).toBe('stop');
    const message = (plan as { message: string }).message;
    expect(message.split('\n')).toHaveLength(1);
    expect(message).toContain(`sudo sh -c '${CHROMIUM_INSTALL_COMMAND}'`);
    expect(message).toContain('/usr/bin/chromium');
  });

  it('the script stops at once, with that one line and exit code 1, when the browser is missing and it may not install', () => {
    const run = spawnSync(process.execPath, ['--import', 'tsx', 'tests/support/ensure-chromium.ts', '--check-only'], {
      cwd: PROJECT_ROOT,
      env: { ...process.env, CHROMIUM_PATH: '/nonexistent/chromium-for-this-test' },
      encoding: 'utf8',
    });
    expect(run.status).toBe(1);
    expect(run.stderr.trim().split('\n')).toHaveLength(1);
    expect(run.stderr).toContain('needs Chromium at /nonexistent/chromium-for-this-test');
    expect(run.stderr).toContain('apt-get install -y chromium');
  });

  it('the script passes quietly when the browser is there', () => {
    const run = spawnSync(process.execPath, ['--import', 'tsx', 'tests/support/ensure-chromium.ts'], {
      cwd: PROJECT_ROOT,
      env: { ...process.env, CHROMIUM_PATH: process.execPath },
      encoding: 'utf8',
    });
    expect(run.status).toBe(0);
    expect(run.stdout + run.stderr).toBe('');
  });
});
