import { spawn, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { PROJECT_ROOT } from './run-cli';

export interface AppProcess {
  baseUrl: string;
  child: ChildProcess;
  output: () => string;
  stop: () => Promise<void>;
}

/**
 * Starts Tautline the way `npm start` does (server/start.ts: builds the client if needed, migrates,
 * seeds the demo) on a fresh database and a free port, with mail going to the local mailbox.
 */
export function startAppProcess(): Promise<AppProcess> {
  const dir = mkdtempSync(join(tmpdir(), 'tautline-e2e-'));
  const env: NodeJS.ProcessEnv = { ...process.env, DATABASE_PATH: join(dir, 'tautline.sqlite'), JWT_SECRET: randomBytes(32).toString('hex'), PORT: '0' };
  delete env.SMTP_URL;
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['--import', 'tsx', 'server/start.ts'], { cwd: PROJECT_ROOT, env });
    let output = '';
    const timer = setTimeout(() => reject(new Error(`the app did not start within 120 s:\n${output}`)), 120_000);
    child.stdout?.on('data', (chunk: Buffer) => {
      output += chunk.toString();
      const match = /listening on http:\/\/localhost:(\d+)/.exec(output);
      if (match) {
        clearTimeout(timer);
        resolve({
          baseUrl: `http://localhost:${match[1]}`,
          child,
          output: () => output,
          stop: () =>
            new Promise((done) => {
              child.once('exit', () => done());
              child.kill('SIGTERM');
            }),
        });
      }
    });
    child.stderr?.on('data', (chunk: Buffer) => (output += chunk.toString()));
    child.on('exit', (code) => {
      clearTimeout(timer);
      reject(new Error(`the app exited (${code}) before listening:\n${output}`));
    });
  });
}
