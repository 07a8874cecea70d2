import { spawn } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { PROJECT_ROOT } from '../support/run-cli';

/** The environment without SMTP_URL: mail goes to the local mailbox. */
function withoutMail(env: NodeJS.ProcessEnv): NodeJS.ProcessEnv {
  const copy = { ...env };
  delete copy.SMTP_URL;
  return copy;
}

/** Starts `server/main.ts` as its own process and returns its output so far once it listens. */
async function startMain(env: Record<string, string>): Promise<{ port: number; output: () => string; stop: () => void }> {
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/main.ts'], { cwd: PROJECT_ROOT, env: { ...withoutMail(process.env), ...env } });
  let output = '';
  const port = await new Promise<number>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`server did not start: ${output}`)), 30_000);
    child.stdout?.on('data', (chunk: Buffer) => {
      output += chunk.toString();
      const match = /listening on http:\/\/[^:]+:(\d+)/.exec(output);
      if (match) {
        clearTimeout(timer);
        resolve(Number(match[1]));
      }
    });
    child.stderr?.on('data', (chunk: Buffer) => (output += chunk.toString()));
    child.on('exit', (code) => reject(new Error(`server exited ${code}: ${output}`)));
  });
  return { port, output: () => output, stop: () => child.kill('SIGKILL') };
}

describe('a server bound where other machines can reach it, with no SMTP_URL', () => {
  it.each([
    ['HOST=0.0.0.0', { HOST: '0.0.0.0' }, 404, 'NOT served'],
    ['HOST=0.0.0.0 and DEV_MAILBOX_REMOTE=true', { HOST: '0.0.0.0', DEV_MAILBOX_REMOTE: 'true' }, 200, 'answers ANY client'],
    ['the default HOST (loopback)', {}, 200, 'readable from this machine only'],
  ])('with %s serves the local mailbox only as the settings say, and says so loudly at start', async (_label, settings, status, words) => {
    const dir = mkdtempSync(join(tmpdir(), 'tautline-open-host-'));
    const server = await startMain({ ...settings, PORT: '0', DATABASE_PATH: join(dir, 'db.sqlite'), RENDERS_DIR: join(dir, 'renders'), JWT_SECRET: randomBytes(32).toString('hex') });
    try {
      const response = await fetch(`http://127.0.0.1:${server.port}/api/dev/mailbox`);
      expect(response.status).toBe(status);
      expect(server.output()).toContain(words);
    } finally {
      server.stop();
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
