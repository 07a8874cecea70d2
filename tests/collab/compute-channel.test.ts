import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { io } from 'socket.io-client';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { patchDoc } from '../../shared/collab/patch-doc';
import { modeWavenumber } from '../../shared/engine/mode-frequencies';
import { COMPUTE_EVENTS, PROTOCOL_VERSION, type RefusedMessage } from '../../shared/protocol/compute-protocol';
import type { ComputeResult, SessionConnection } from '../../src/lib/live-session/session-connection';
import { openClient, waitForSnapshot } from '../support/collab-client';
import { openRawCollabClient } from '../support/raw-collab-client';
import { runCli } from '../support/run-cli';
import { createStudioFixture, type StudioFixture } from '../support/studio-fixture';
import { registerUser, startLiveTestServer, type LiveTestServer } from '../support/test-server';

let server: LiveTestServer;
let fixture: StudioFixture;
const clients: SessionConnection[] = [];

beforeAll(async () => {
  server = await startLiveTestServer({ previewDurationS: 0.5 });
  fixture = await createStudioFixture(server);
});
afterAll(async () => {
  for (const client of clients) client.destroy();
  await server.close();
});

function client(role: keyof StudioFixture['members']): SessionConnection {
  const opened = openClient(server.baseUrl, fixture.sessionId, fixture.members[role].token, role);
  clients.push(opened);
  return opened;
}

describe('compute channel', () => {
  it('sends a mode table equal to the command line’s for the same patch, and a binary preview', async () => {
    const listener = client('listener');
    const snapshot = await waitForSnapshot(listener, (s) => s.synced && s.patch !== null && s.result !== null, 10_000, 'first result');
    const result = snapshot.result as ComputeResult;
    expect(result.frequencyHz).toBeInstanceOf(Float64Array);
    expect(result.preview).toBeInstanceOf(Float32Array);

    const dir = mkdtempSync(join(tmpdir(), 'tautline-compute-'));
    const patchPath = join(dir, 'patch.json');
    writeFileSync(patchPath, JSON.stringify(snapshot.patch));
    const cli = await runCli(['modes', patchPath]);
    expect(cli.code).toBe(0);
    const expected = JSON.parse(cli.stdout);
    expect(result.f0Hz).toBe(expected.f0Hz);
    expect(result.waveSpeedMPerS).toBe(expected.waveSpeedMPerS);
    expect(result.totalEnergyJ).toBe(expected.totalEnergyJ);
    expect(result.modeCount).toBe(expected.modes.length);
    expected.modes.forEach((mode: { n: number; frequencyHz: number; aM: number; vMPerS: number; energyJ: number; t60S: number | null }, m: number) => {
      expect(result.frequencyHz[m]).toBe(mode.frequencyHz);
      expect(result.aM[m]).toBe(mode.aM);
      expect(result.vMPerS[m]).toBe(mode.vMPerS);
      expect(result.energyJ[m]).toBe(mode.energyJ);
      expect((3 * Math.LN10) / result.decayRatePerS[m]).toBeCloseTo(mode.t60S as number, 9);
    });

    const rate = result.previewSampleRateHz;
    expect(rate).toBeLessThanOrEqual(48000);
    expect(result.preview.length).toBe(Math.round(Math.min(0.5, snapshot.patch!.render.durationS) * rate));
    expect(Math.max(...Array.from(result.preview, Math.abs))).toBeCloseTo(1, 6);
    expect(result.previewPhysicalPeak).toBeGreaterThan(0);
  });

  it('coalesces a burst of 100 edits into a handful of results, the last one for the final state', async () => {
    const writer = client('designer');
    const watcher = client('lead');
    for (const connection of [writer, watcher]) await waitForSnapshot(connection, (s) => s.synced && s.result !== null, 10_000, 'first result');
    const before = watcher.getSnapshot().result!.sequence;
    const received: ComputeResult[] = [];
    const stop = watcher.subscribe(() => {
      const result = watcher.getSnapshot().result;
      if (result && result.sequence > before && received.at(-1) !== result) received.push(result);
    });
    for (let i = 1; i <= 100; i++) writer.edit((doc) => patchDoc(doc).damping.set('b1PerS', i / 25));
    const patch = await waitForSnapshot(watcher, (s) => s.patch?.damping.b1PerS === 4, 10_000, 'final edit arrives');
    const lengthM = patch.patch!.string.lengthM;
    const k1 = modeWavenumber(lengthM, 1);
    const finalSigma = 4 + patch.patch!.damping.b2M2PerS * k1 * k1;
    await waitForSnapshot(watcher, (s) => Math.abs((s.result?.decayRatePerS[0] ?? 0) - finalSigma) < 1e-12, 10_000, 'result for the final state');
    await new Promise((resolve) => setTimeout(resolve, 300));
    stop();
    expect(received.length).toBeGreaterThanOrEqual(1);
    expect(received.length).toBeLessThanOrEqual(6);
    expect(received.at(-1)!.decayRatePerS[0]).toBeCloseTo(finalSigma, 12);
    const sequences = received.map((result) => result.sequence);
    expect([...sequences].sort((a, b) => a - b)).toEqual(sequences);
  });

  it('never computes a patch that breaks its rules: the live document refuses the edit, and results go on', async () => {
    const watcher = client('listener');
    const first = await waitForSnapshot(watcher, (s) => s.synced && s.result !== null, 10_000, 'first result');
    const attacker = openRawCollabClient(server.baseUrl, fixture.sessionId, fixture.members.designer.token);
    await attacker.synced;
    attacker.sendUpdate(attacker.change((doc) => doc.getMap('string').set('tensionN', -5)));
    expect((await attacker.closed).reason).toContain('string.tensionN must be > 0');
    const writer = client('designer');
    await waitForSnapshot(writer, (s) => s.synced && s.patch !== null, 10_000, 'writer synced');
    writer.edit((doc) => patchDoc(doc).string.set('tensionN', 61));
    const next = await waitForSnapshot(watcher, (s) => s.result !== null && s.result.sequence > (first.result?.sequence ?? 0) && s.patch?.string.tensionN === 61, 10_000, 'next result');
    expect(next.computeIssues).toEqual([]);
    expect(next.patch?.string.tensionN).toBe(61);
  });

  it('refuses sockets without a valid token, and subscriptions to a foreign session', async () => {
    const anonymous = io(server.baseUrl, { path: '/socket.io/', transports: ['websocket'], reconnection: false });
    const error = await new Promise<Error>((resolve) => anonymous.on('connect_error', resolve));
    expect(error.message).toBe('unauthenticated');
    anonymous.close();

    const outsider = await registerUser(server.app, 'compute-outsider@gannet-rock.example', 'Outsider');
    const socket = io(server.baseUrl, { path: '/socket.io/', transports: ['websocket'], auth: { token: outsider.token }, reconnection: false });
    const refused = await new Promise<RefusedMessage>((resolve) => {
      socket.on(COMPUTE_EVENTS.refused, resolve);
      socket.on('connect', () => socket.emit(COMPUTE_EVENTS.subscribe, { protocolVersion: PROTOCOL_VERSION, sessionId: fixture.sessionId }));
    });
    expect(refused).toMatchObject({ code: 'not_found', sessionId: fixture.sessionId });
    const wrongVersion = await new Promise<RefusedMessage>((resolve) => {
      socket.once(COMPUTE_EVENTS.refused, resolve);
      socket.emit(COMPUTE_EVENTS.subscribe, { protocolVersion: 0, sessionId: fixture.sessionId });
    });
    expect(wrongVersion.code).toBe('protocol');
    socket.close();
  });
});
