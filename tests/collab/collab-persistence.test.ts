import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { randomBytes } from 'node:crypto';
import request from 'supertest';
import * as Y from 'yjs';
import { describe, expect, it } from 'vitest';
import { movePoint } from '../../shared/collab/point-edits';
import { patchDoc } from '../../shared/collab/patch-doc';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../server/seed/demo-seed';
import type { SessionConnection } from '../../src/lib/live-session/session-connection';
import { eventually, openClient, waitForSnapshot } from '../support/collab-client';
import { PROJECT_ROOT } from '../support/run-cli';
import { createStudioFixture } from '../support/studio-fixture';
import { startLiveTestServer } from '../support/test-server';

const json = (connection: SessionConnection) => JSON.stringify(connection.doc.toJSON());
/** The same state vector means the same history of updates, not just equal-looking content. */
const history = (connection: SessionConnection) => Y.decodeStateVector(Y.encodeStateVector(connection.doc));

describe('persistence', () => {
  it('keeps the document across a server restart', async () => {
    const databasePath = join(mkdtempSync(join(tmpdir(), 'tautline-restart-')), 'tautline.sqlite');
    const jwtSecret = randomBytes(32).toString('hex');
    const first = await startLiveTestServer({ databasePath, jwtSecret });
    const fixture = await createStudioFixture(first);
    const writer = openClient(first.baseUrl, fixture.sessionId, fixture.members.designer.token, 'writer');
    await waitForSnapshot(writer, (s) => s.synced, 5000, 'synced');
    writer.edit((doc, origin) => {
      patchDoc(doc).damping.set('b1PerS', 1.75);
      movePoint(doc, 'displacement', 0, 0.12, 0.002, origin);
    });
    await new Promise((resolve) => setTimeout(resolve, 100));
    const expected = json(writer);
    const expectedHistory = history(writer);
    writer.destroy();
    await first.close();

    const second = await startLiveTestServer({ databasePath, jwtSecret });
    try {
      const reader = openClient(second.baseUrl, fixture.sessionId, fixture.members.listener.token, 'reader');
      await waitForSnapshot(reader, (s) => s.synced && s.patch?.damping.b1PerS === 1.75, 5000, 'restored document');
      expect(json(reader)).toBe(expected);
      expect(history(reader)).toEqual(expectedHistory);
      const rest = await request(second.app).get(`/api/sessions/${fixture.sessionId}`).set('Authorization', `Bearer ${fixture.members.lead.token}`);
      expect(rest.body.session.patch.damping.b1PerS).toBe(1.75);
      reader.destroy();
    } finally {
      await second.close();
    }
  });
});

/** Starts `server/main.ts` as its own process (as `npm run dev` does) and resolves with its port. */
function startServerProcess(env: NodeJS.ProcessEnv): Promise<{ child: ChildProcess; port: number }> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['--import', 'tsx', 'server/main.ts'], { cwd: PROJECT_ROOT, env: { ...process.env, ...env } });
    let output = '';
    const timer = setTimeout(() => reject(new Error(`server did not start: ${output}`)), 30_000);
    child.stdout?.on('data', (chunk: Buffer) => {
      output += chunk.toString();
      const match = /listening on http:\/\/localhost:(\d+)/.exec(output);
      if (match) {
        clearTimeout(timer);
        resolve({ child, port: Number(match[1]) });
      }
    });
    child.stderr?.on('data', (chunk: Buffer) => (output += chunk.toString()));
    child.on('exit', (code) => code !== null && code !== 0 && reject(new Error(`server exited ${code}: ${output}`)));
  });
}

describe('durability under SIGKILL', () => {
  it('loses no update the server received more than 250 ms before a kill -9; clients reconnect and converge', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'tautline-kill-'));
    const env = { DATABASE_PATH: join(dir, 'tautline.sqlite'), JWT_SECRET: randomBytes(32).toString('hex'), PORT: '0', SMTP_URL: 'smtp://127.0.0.1:9' };
    const first = await startServerProcess(env);
    let second: { child: ChildProcess; port: number } | null = null;
    const clients: SessionConnection[] = [];
    try {
      const baseUrl = `http://127.0.0.1:${first.port}`;
      const lead = DEMO_ACCOUNTS.find((account) => account.role === 'lead')!;
      const login = await request(baseUrl).post('/api/auth/login').send({ email: lead.email, password: DEMO_PASSWORD });
      const token = login.body.token as string;
      const studioId = (await request(baseUrl).get('/api/me').set('Authorization', `Bearer ${token}`)).body.studios[0].id;
      const sessionId = (await request(baseUrl).get(`/api/studios/${studioId}/sessions`).set('Authorization', `Bearer ${token}`)).body.sessions[0].id;

      const writer = openClient(baseUrl, sessionId, token, 'writer');
      clients.push(writer);
      await waitForSnapshot(writer, (s) => s.synced, 5000, 'synced');
      for (let i = 1; i <= 60; i++) {
        writer.edit((doc, origin) => {
          patchDoc(doc).damping.set('b1PerS', i / 20);
          movePoint(doc, 'displacement', i % 3, 0.05 + i * 0.004, 0.001 + i * 1e-5, origin);
        });
        await new Promise((resolve) => setTimeout(resolve, 5));
      }
      await new Promise((resolve) => setTimeout(resolve, 300));
      const expected = json(writer);
      const expectedHistory = history(writer);
      first.child.kill('SIGKILL');
      await new Promise((resolve) => first.child.once('exit', resolve));
      writer.provider.disconnect();

      second = await startServerProcess({ ...env, PORT: String(first.port) });
      const reader = openClient(baseUrl, sessionId, token, 'reader');
      clients.push(reader);
      await waitForSnapshot(reader, (s) => s.synced && s.patch?.damping.b1PerS === 3, 10_000, 'reader synced after restart, with the last edit');
      expect(json(reader)).toBe(expected);
      expect(history(reader)).toEqual(expectedHistory);

      // The writer comes back by itself once allowed to, and both converge.
      writer.provider.connect();
      writer.edit((doc) => patchDoc(doc).damping.set('b2M2PerS', 0.00042));
      await eventually(() => json(writer) === json(reader) && reader.getSnapshot().patch?.damping.b2M2PerS === 0.00042, 10_000, 'convergence after reconnect');
    } finally {
      for (const connection of clients) connection.destroy();
      first.child.kill('SIGKILL');
      second?.child.kill('SIGTERM');
    }
  }, 60_000);
});
