/**
 * Collaboration figures (part of `npm run bench`): eight clients dragging a point at 60 Hz for 10 s in
 * each of two sessions, against the real server in its own process on loopback. Prints JSON:
 * propagation latency between clients, compute round trip, server CPU and memory.
 * The run lasts COLLAB_BENCH_SECONDS (default 10).
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import WebSocket from 'ws';
import { insertPoint, movePoint } from '../../shared/collab/point-edits';
import { patchDoc } from '../../shared/collab/patch-doc';
import { tensionForPitchN } from '../../shared/designer/tension-for-pitch';
import { modeWavenumber } from '../../shared/engine/mode-frequencies';
import { defaultPatch } from '../../shared/patch/default-patch';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../server/seed/demo-seed';
import { SessionConnection } from '../../src/lib/live-session/session-connection';
import { api, logIn } from './bench-api';

// Each y-websocket provider registers a process exit listener; sixteen of them are expected here.
process.setMaxListeners(64);

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const CLIENTS_PER_SESSION = 8;
const DRAG_HZ = 60;
const RUN_S = Number(process.env.COLLAB_BENCH_SECONDS ?? 10);

function percentile(values: number[], p: number): number {
  if (values.length === 0) return NaN;
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))];
}

const round = (value: number) => Math.round(value * 100) / 100;

function startServer(): Promise<{ child: ChildProcess; port: number }> {
  const dir = mkdtempSync(join(tmpdir(), 'tautline-collab-bench-'));
  const env = { ...process.env, DATABASE_PATH: join(dir, 'bench.sqlite'), JWT_SECRET: randomBytes(32).toString('hex'), PORT: '0', SMTP_URL: 'smtp://127.0.0.1:9' };
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['--import', 'tsx', 'server/main.ts'], { cwd: ROOT, env });
    let output = '';
    child.stdout?.on('data', (chunk: Buffer) => {
      output += chunk.toString();
      const match = /listening on http:\/\/localhost:(\d+)/.exec(output);
      if (match) resolve({ child, port: Number(match[1]) });
    });
    child.stderr?.on('data', (chunk: Buffer) => (output += chunk.toString()));
    child.on('exit', (code) => reject(new Error(`server exited ${code}: ${output}`)));
  });
}

/** CPU seconds and resident memory of a process, from /proc (Linux). */
function processStats(pid: number): { cpuS: number; rssMB: number } {
  const stat = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1].split(' ');
  const ticks = Number(stat[11]) + Number(stat[12]);
  const rssPages = Number(readFileSync(`/proc/${pid}/statm`, 'utf8').split(' ')[1]);
  return { cpuS: ticks / 100, rssMB: (rssPages * 4096) / 2 ** 20 };
}

/** The collaboration figures, against the server in its own process. */
export async function collabBench() {
  const { child, port } = await startServer();
  const baseUrl = `http://127.0.0.1:${port}`;
  try {
    const lead = DEMO_ACCOUNTS.find((account) => account.role === 'lead')!;
    const token = await logIn(baseUrl, lead.email, DEMO_PASSWORD);
    const studioId = (await api(baseUrl, '/api/me', token)).studios[0].id as string;

    // The measured patch: 256 modes below 24 kHz (f0 = 80 Hz) and a 2 s preview at 48 kHz.
    const base = defaultPatch('Bench string');
    const patch = {
      ...base,
      string: { ...base.string, inharmonicityB: 0, tensionN: tensionForPitchN(base.string.lengthM, base.string.linearDensityKgPerM, 80) },
      render: { sampleRateHz: 48000, durationS: 2, maxModes: 256 },
    };
    const sessionIds: string[] = [];
    for (const name of ['Bench session A', 'Bench session B']) {
      sessionIds.push((await api(baseUrl, `/api/studios/${studioId}/sessions`, token, 'POST', { name, patch })).session.id);
    }

    const clients: SessionConnection[] = [];
    const latenciesMs: number[] = [];
    for (const sessionId of sessionIds) {
      for (let index = 0; index < CLIENTS_PER_SESSION; index++) {
        const client = new SessionConnection({ baseUrl, sessionId, token, presence: { name: `dragger-${index}`, colour: '#4cc7b8' }, WebSocketPolyfill: WebSocket as unknown as typeof globalThis.WebSocket });
        const own = `stamp-${sessionId}-${index}`;
        // Each client records how long others' stamps took to reach it.
        client.doc.on('update', (_update: Uint8Array, origin: unknown) => {
          if (origin === client.localOrigin) return;
          const extras = patchDoc(client.doc).extras;
          const now = performance.now();
          for (let other = 0; other < CLIENTS_PER_SESSION; other++) {
            const key = `stamp-${sessionId}-${other}`;
            if (key === own) continue;
            const sent = extras.get(key) as number | undefined;
            const seen = (client as unknown as { seen?: Map<string, number> }).seen ?? new Map<string, number>();
            (client as unknown as { seen: Map<string, number> }).seen = seen;
            if (sent !== undefined && seen.get(key) !== sent) {
              seen.set(key, sent);
              latenciesMs.push(now - sent);
            }
          }
        });
        clients.push(client);
      }
    }
    await Promise.all(clients.map((client) => new Promise<void>((resolve) => {
      const check = () => (client.getSnapshot().synced && client.getSnapshot().result ? resolve() : setTimeout(check, 20));
      check();
    })));

    // Give each dragger a point of its own in the displacement layer.
    for (let offset = 0; offset < sessionIds.length; offset++) {
      clients[offset * CLIENTS_PER_SESSION].edit((doc, origin) => {
        const parts = patchDoc(doc);
        parts.displacement.delete(0, parts.displacement.length);
        const lengthM = parts.string.get('lengthM') as number;
        for (let index = 0; index < CLIENTS_PER_SESSION; index++) insertPoint(doc, 'displacement', (lengthM * (index + 1)) / (CLIENTS_PER_SESSION + 1), 0.002, origin);
      });
    }
    await new Promise((resolve) => setTimeout(resolve, 500));

    // Compute round trip: one probe in session A changes b1 to a unique value and waits for its result.
    const probe = clients[1];
    const roundTripsMs: number[] = [];
    const workerComputeMs: number[] = [];
    let lastSequence = 0;
    let probeValue = 1;
    let probeSentAt = 0;
    let expectedSigma = 0;
    probe.subscribe(() => {
      const result = probe.getSnapshot().result;
      if (result && result.sequence !== lastSequence) {
        lastSequence = result.sequence;
        workerComputeMs.push(result.computeMs);
      }
      if (probeSentAt > 0 && result && Math.abs(result.decayRatePerS[0] - expectedSigma) < 1e-9) {
        roundTripsMs.push(performance.now() - probeSentAt);
        probeSentAt = 0;
      }
    });

    const startStats = processStats(child.pid as number);
    const clientCpuStart = process.cpuUsage();
    const rssSamples: number[] = [];
    const started = performance.now();
    const lengthM = patch.string.lengthM;
    let tick = 0;
    await new Promise<void>((resolve) => {
      const dragTimer = setInterval(() => {
        tick++;
        const t = (performance.now() - started) / 1000;
        clients.forEach((client, index) => {
          const local = index % CLIENTS_PER_SESSION;
          if (client === probe) return;
          const sessionId = sessionIds[Math.floor(index / CLIENTS_PER_SESSION)];
          client.edit((doc, origin) => {
            const parts = patchDoc(doc);
            if (parts.displacement.length <= local) return;
            const centre = (lengthM * (local + 1)) / (CLIENTS_PER_SESSION + 1);
            movePoint(doc, 'displacement', local, centre + 0.01 * Math.sin(t * 3 + local), 0.002 + 0.001 * Math.sin(t * 5 + local), origin);
            parts.extras.set(`stamp-${sessionId}-${local}`, performance.now());
          });
        });
        if (tick % Math.round(DRAG_HZ / 4) === 0 && probeSentAt === 0) {
          probeValue = probeValue === 1 ? 1.5 : 1;
          const b2 = probe.getSnapshot().patch?.damping.b2M2PerS ?? 0;
          const k1 = modeWavenumber(lengthM, 1);
          expectedSigma = probeValue + b2 * k1 * k1;
          probeSentAt = performance.now();
          probe.edit((doc) => patchDoc(doc).damping.set('b1PerS', probeValue));
        }
        if (tick % DRAG_HZ === 0) rssSamples.push(processStats(child.pid as number).rssMB);
        if (performance.now() - started >= RUN_S * 1000) {
          clearInterval(dragTimer);
          resolve();
        }
      }, 1000 / DRAG_HZ);
    });
    await new Promise((resolve) => setTimeout(resolve, 500));
    const endStats = processStats(child.pid as number);
    const elapsedS = (performance.now() - started) / 1000;
    for (const client of clients) client.destroy();

    return {
      note: 'server in its own process; the 16 simulated clients share the same 2 cores',
      sessions: sessionIds.length,
      clientsPerSession: CLIENTS_PER_SESSION,
      dragHz: DRAG_HZ,
      seconds: round(elapsedS),
      propagationMs: { samples: latenciesMs.length, p50: round(percentile(latenciesMs, 50)), p95: round(percentile(latenciesMs, 95)), p99: round(percentile(latenciesMs, 99)) },
      computeRoundTripMs: { modes: 256, previewS: 2, previewSampleRateHz: 48000, samples: roundTripsMs.length, p50: round(percentile(roundTripsMs, 50)), p95: round(percentile(roundTripsMs, 95)) },
      workerComputeMs: { results: workerComputeMs.length, p50: round(percentile(workerComputeMs, 50)), p95: round(percentile(workerComputeMs, 95)) },
      benchClientsCpuPercentOfOneCore: round((process.cpuUsage(clientCpuStart).user + process.cpuUsage(clientCpuStart).system) / 1e4 / elapsedS),
      server: {
        cpuPercentOfOneCore: round(((endStats.cpuS - startStats.cpuS) / elapsedS) * 100),
        rssMBAtStart: round(startStats.rssMB),
        rssMBAfter2s: round(rssSamples[1] ?? NaN),
        rssMBAtEnd: round(endStats.rssMB),
        rssMBMax: round(Math.max(...rssSamples, endStats.rssMB)),
      },
      goals: {
        propagationP95Under20ms: percentile(latenciesMs, 95) < 20,
        computeRoundTripP95Under50ms: percentile(roundTripsMs, 95) < 50,
        memoryFlat: endStats.rssMB <= (rssSamples[1] ?? endStats.rssMB) * 1.1,
      },
    };
  } finally {
    child.kill('SIGTERM');
  }
}
