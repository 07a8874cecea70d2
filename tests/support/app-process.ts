import { spawn, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { PROJECT_ROOT } from './run-cli';

export interface AppProcess {
  baseUrl: string;
  child: ChildProcess;
  /** The process group the app runs in (its pid): stopping kills the whole group. */
  processGroup: number;
  output: () => string;
  stop: () => Promise<void>;
}

/** Process groups started here and not yet stopped; killed on exit whatever happened. */
const running = new Set<number>();

function killGroup(group: number, signal: NodeJS.Signals): void {
  try {
    process.kill(-group, signal);
  } catch {
    // already gone
  }
}

process.once('exit', () => {
  for (const group of running) killGroup(group, 'SIGKILL');
});

/** True while any process of the group is alive (signal 0 only checks). */
export function processGroupAlive(group: number): boolean {
  try {
    process.kill(-group, 0);
    return true;
  } catch {
    return false;
  }
}

/** Stops a process group: SIGTERM, then SIGKILL after `graceMs`; resolves once the group is gone. */
export async function stopProcessGroup(group: number, graceMs = 5000): Promise<void> {
  killGroup(group, 'SIGTERM');
  const deadline = Date.now() + graceMs;
  while (processGroupAlive(group) && Date.now() < deadline) await new Promise((resolve) => setTimeout(resolve, 50));
  if (processGroupAlive(group)) killGroup(group, 'SIGKILL');
  while (processGroupAlive(group)) await new Promise((resolve) => setTimeout(resolve, 20));
  running.delete(group);
}

/**
 * Starts Tautline the way `npm start` does (server/start.ts: builds the client if needed, migrates,
 * seeds the demo) on a fresh database and a free port, with mail going to the local mailbox.
 * The app runs in its own process group, which is killed whatever fails: when it does not start,
 * when `stop` is called, and when this process exits.
 */
export function startAppProcess(): Promise<AppProcess> {
  const dir = mkdtempSync(join(tmpdir(), 'tautline-e2e-'));
  // TAUTLINE_EXIT_WITH_STDIN: the app stops when our end of its stdin closes, so even a test worker killed outright leaves no app behind.
  const env: NodeJS.ProcessEnv = { ...process.env, DATABASE_PATH: join(dir, 'tautline.sqlite'), JWT_SECRET: randomBytes(32).toString('hex'), PORT: '0', TAUTLINE_EXIT_WITH_STDIN: '1' };
  delete env.SMTP_URL;
  // vitest sets NODE_ENV=test; passed on, Vite would build the client with React's development build (jsxDEV, several times slower), unlike `npm start` from a shell.
  delete env.NODE_ENV;
  delete env.HOST;
  delete env.DEV_MAILBOX_REMOTE;
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['--import', 'tsx', 'server/start.ts'], { cwd: PROJECT_ROOT, env, detached: true, stdio: ['pipe', 'pipe', 'pipe'] });
    const group = child.pid as number;
    running.add(group);
    const stop = async () => {
      await stopProcessGroup(group);
      rmSync(dir, { recursive: true, force: true });
    };
    let output = '';
    let settled = false;
    const fail = (message: string) => {
      if (settled) return;
      settled = true;
      clearTimeout(timer);
      void stop().then(() => reject(new Error(message)));
    };
    const timer = setTimeout(() => fail(`the app did not start within 120 s:\n${output}`), 120_000);
    child.stdout?.on('data', (chunk: Buffer) => {
      output += chunk.toString();
      const match = /listening on http:\/\/localhost:(\d+)/.exec(output);
      if (match && !settled) {
        settled = true;
        clearTimeout(timer);
        resolve({ baseUrl: `http://localhost:${match[1]}`, child, processGroup: group, output: () => output, stop });
      }
    });
    child.stderr?.on('data', (chunk: Buffer) => (output += chunk.toString()));
    child.on('error', (error) => fail(`the app could not be started: ${error.message}`));
    child.on('exit', (code) => fail(`the app exited (${code}) before listening:\n${output}`));
  });
}
