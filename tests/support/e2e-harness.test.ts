import { describe, expect, it } from 'vitest';
import { processGroupAlive, type AppProcess } from './app-process';
import { startE2eHarness } from './e2e-harness';

describe('the end-to-end harness', () => {
  it('stops the app it started (its whole process group) when the browser fails to launch', async () => {
    let app: AppProcess | undefined;
    const failed = await startE2eHarness({ chromiumPath: '/nonexistent/chromium-for-this-test', onAppStarted: (started) => (app = started) }).then(
      () => null,
      (error: Error) => error,
    );
    expect(failed?.message).toMatch(/need Chromium at \/nonexistent\/chromium-for-this-test; install it with: apt-get/);
    expect(app).toBeDefined();
    const started = app as AppProcess;
    expect(started.processGroup).toBe(started.child.pid);
    // Before the fix the app kept running (and listening) after this failure.
    expect(processGroupAlive(started.processGroup)).toBe(false);
    expect(() => process.kill(started.child.pid as number, 0)).toThrow();
    await expect(fetch(`${started.baseUrl}/api/health`)).rejects.toThrow();
  }, 180_000);
});
