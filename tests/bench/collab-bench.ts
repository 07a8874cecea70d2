/**
 * Collaboration figures (part of `npm run bench`), against the real server in its own process on
 * loopback, with simulated editors dragging points at 30 Hz. Prints JSON:
 * - edit → mode table at the editor (the editor's own edit back as a table that covers it, decoded),
 *   with one editor, and with 8 editors dragging in one session (the web app's SessionConnection);
 * - propagation of an edit to the teammates in the session;
 * - server CPU ms per edit, bytes per table, tables per second;
 * - capacity: sessions × 4 editors stepping through COLLAB_BENCH_STEPS sessions (lightweight simulated
 *   editors, tests/bench/light-editor.ts), each step COLLAB_BENCH_STEP_S seconds.
 * Lengths: COLLAB_BENCH_SECONDS (each of the first two runs, default 6), COLLAB_BENCH_STEP_S (default 5),
 * COLLAB_BENCH_STEPS (default 5,10,20,40,80); COLLAB_BENCH_NODE_ARGS go to the server's node. The simulated editors share the machine's two cores
 * with the server: each figure says how busy this process was.
 */
import WebSocket from 'ws';
import * as Y from 'yjs';
import { movePoint } from '../../shared/collab/point-edits';
import { patchDoc } from '../../shared/collab/patch-doc';
import { tensionForPitchN } from '../../shared/designer/tension-for-pitch';
import { defaultPatch } from '../../shared/patch/default-patch';
import type { Patch } from '../../shared/patch/patch-schema';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../server/seed/demo-seed';
import { SessionConnection } from '../../src/lib/live-session/session-connection';
import { api, logIn } from './bench-api';
import { latencySummary, machineBusyS, processStats, round, startBenchServer, stopBenchServer } from './bench-server';
import { coveredClock, LightEditor, settleCoveredEdits, stampKey } from './light-editor';

// Each y-websocket provider registers a process exit listener.
process.setMaxListeners(64);

const DRAG_HZ = 30;
const RUN_S = Number(process.env.COLLAB_BENCH_SECONDS ?? 6);
const STEP_S = Number(process.env.COLLAB_BENCH_STEP_S ?? 5);
const STEPS = (process.env.COLLAB_BENCH_STEPS ?? '5,10,20,40,80').split(',').map(Number);
const EDITORS_PER_CAPACITY_SESSION = 4;
const WARM_UP_MS = 1000;
/** The capacity goals of the issue. */
const PROPAGATION_P95_LIMIT_MS = 50;
const COMPUTE_P95_LIMIT_MS = 100;

/** What every simulated editor offers the runs below. */
interface BenchEditor {
  readonly propagationMs: number[];
  readonly computeMs: number[];
  readonly tableBytes: number[];
  tables: number;
  edits: number;
  movesRefused: number;
  recording: boolean;
  drag(t: number): void;
  close(): void;
}

/**
 * The measured patch: 256 modes below 24 kHz (f0 = 80 Hz, no stiffness), a 2 s preview at 48 kHz,
 * and one interior point per editor for each to drag.
 */
function benchPatch(editors: number): Patch {
  const base = defaultPatch('Bench string');
  const lengthM = base.string.lengthM;
  const interior = Array.from({ length: editors }, (_, index): [number, number] => [(lengthM * (index + 1)) / (editors + 1), 0.002]);
  return {
    ...base,
    string: { ...base.string, inharmonicityB: 0, tensionN: tensionForPitchN(lengthM, base.string.linearDensityKgPerM, 80) },
    excitation: { displacementM: [[0, 0], ...interior, [lengthM, 0]] },
    render: { sampleRateHz: 48000, durationS: 2, maxModes: 256 },
  };
}

/** The web app's own live-session client as a measured editor (what a browser tab runs, minus the page). */
class AppEditor implements BenchEditor {
  readonly connection: SessionConnection;
  readonly propagationMs: number[] = [];
  readonly computeMs: number[] = [];
  readonly tableBytes: number[] = [];
  tables = 0;
  edits = 0;
  movesRefused = 0;
  recording = false;
  private readonly waiting: Array<{ clock: number; at: number }> = [];
  private readonly seen = new Map<string, number>();

  constructor(baseUrl: string, sessionId: string, token: string, private readonly index: number, private readonly editors: number) {
    const connection = new SessionConnection({ baseUrl, sessionId, token, presence: { name: `dragger-${index}`, colour: '#4cc7b8' }, WebSocketPolyfill: WebSocket as unknown as typeof globalThis.WebSocket });
    this.connection = connection;
    let shown: unknown = null;
    connection.subscribe(() => {
      const result = connection.getSnapshot().result;
      if (!result || result === shown) return;
      shown = result;
      const now = performance.now();
      const covered = coveredClock(result.wire.stateVector, connection.doc.clientID);
      settleCoveredEdits(this.waiting, covered, now, this.recording ? this.computeMs : null);
      if (!this.recording) return;
      this.tables++;
      this.tableBytes.push(result.byteLength);
    });
    connection.doc.on('update', (_update: Uint8Array, origin: unknown) => {
      if (origin === connection.localOrigin || !this.recording) return;
      const now = performance.now();
      const extras = patchDoc(connection.doc).extras;
      for (let other = 0; other < editors; other++) {
        if (other === index) continue;
        const sent = extras.get(stampKey(other)) as number | undefined;
        if (sent === undefined || this.seen.get(stampKey(other)) === sent) continue;
        this.seen.set(stampKey(other), sent);
        this.propagationMs.push(now - sent);
      }
    });
  }

  ready(): Promise<void> {
    return new Promise((resolve) => {
      const check = () => (this.connection.getSnapshot().synced && this.connection.getSnapshot().result ? resolve() : setTimeout(check, 20));
      check();
    });
  }

  drag(t: number): void {
    const { index, editors, connection } = this;
    const at = performance.now();
    connection.edit((doc, origin) => {
      const parts = patchDoc(doc);
      const lengthM = parts.string.get('lengthM') as number;
      const centreM = (lengthM * (index + 1)) / (editors + 1);
      if (!movePoint(doc, 'displacement', index, centreM + 0.01 * Math.sin(t * 3 + index), 0.002 + 0.001 * Math.sin(t * 5 + index), origin).ok) this.movesRefused++;
      parts.extras.set(stampKey(index), at);
    });
    this.edits++;
    this.waiting.push({ clock: Y.getState(connection.doc.store, connection.doc.clientID), at });
  }

  close(): void {
    this.connection.destroy();
  }
}

/**
 * Every editor drags at DRAG_HZ, each on its own timer, their phases spread over one period (people
 * do not move in step); measurements are kept after a warm-up, for `seconds`.
 */
async function drive(editors: BenchEditor[], seconds: number, serverPid: number) {
  const periodMs = 1000 / DRAG_HZ;
  const started = performance.now();
  const timers: NodeJS.Timeout[] = [];
  editors.forEach((editor, k) => {
    const begin = setTimeout(() => {
      timers.push(setInterval(() => editor.drag((performance.now() - started) / 1000), periodMs));
    }, (k / editors.length) * periodMs);
    timers.push(begin);
  });
  await new Promise((resolve) => setTimeout(resolve, WARM_UP_MS));
  for (const editor of editors) editor.recording = true;
  const editsBefore = editors.reduce((sum, editor) => sum + editor.edits, 0);
  const serverBefore = processStats(serverPid);
  const cpuBefore = process.cpuUsage();
  const machineBefore = machineBusyS();
  const windowStart = performance.now();
  await new Promise((resolve) => setTimeout(resolve, seconds * 1000));
  for (const timer of timers) clearInterval(timer);
  const windowS = (performance.now() - windowStart) / 1000;
  const serverAfter = processStats(serverPid);
  const benchCpu = process.cpuUsage(cpuBefore);
  const machineS = machineBusyS() - machineBefore;
  const edits = editors.reduce((sum, editor) => sum + editor.edits, 0) - editsBefore;
  // Let the last tables arrive before the figures are read.
  await new Promise((resolve) => setTimeout(resolve, 300));
  for (const editor of editors) editor.recording = false;
  const all = (pick: (editor: BenchEditor) => number[]) => editors.flatMap(pick);
  const bytes = all((editor) => editor.tableBytes);
  const serverCpuMs = (serverAfter.cpuS - serverBefore.cpuS) * 1000;
  return {
    seconds: round(windowS),
    editsPerS: round(edits / windowS),
    movesRefused: editors.reduce((sum, editor) => sum + editor.movesRefused, 0),
    tablesRefused: editors.reduce((sum, editor) => sum + (editor instanceof LightEditor ? editor.badTables : editor instanceof AppEditor ? editor.connection.malformed.count() : 0), 0),
    editToTableMs: latencySummary(all((editor) => editor.computeMs)),
    propagationMs: latencySummary(all((editor) => editor.propagationMs)),
    tablesPerSPerEditor: round(editors.reduce((sum, editor) => sum + editor.tables, 0) / editors.length / windowS),
    bytesPerTable: { mean: round(bytes.reduce((sum, value) => sum + value, 0) / Math.max(1, bytes.length)), max: Math.max(0, ...bytes) },
    server: {
      cpuPercentOfOneCore: round((serverCpuMs / 1000 / windowS) * 100),
      mainThreadCpuPercent: round(((serverAfter.mainThreadCpuS - serverBefore.mainThreadCpuS) / windowS) * 100),
      cpuMsPerEdit: round(serverCpuMs / Math.max(1, edits)),
      mainThreadMsPerEdit: round(((serverAfter.mainThreadCpuS - serverBefore.mainThreadCpuS) * 1000) / Math.max(1, edits)),
      rssMB: round(serverAfter.rssMB),
    },
    benchProcessCpuPercentOfOneCore: round(((benchCpu.user + benchCpu.system) / 1e6 / windowS) * 100),
    /** What the rest of the machine took meanwhile (other programs on the same two cores): the figures are only as quiet as this. */
    otherProcessesCpuPercentOfOneCore: round(Math.max(0, (machineS - serverCpuMs / 1000 - (benchCpu.user + benchCpu.system) / 1e6) / windowS) * 100),
  };
}

async function withTimeout<T>(promise: Promise<T>, ms: number, what: string): Promise<T> {
  let timer: NodeJS.Timeout | undefined;
  try {
    return await Promise.race([promise, new Promise<never>((_, reject) => (timer = setTimeout(() => reject(new Error(`bench: timed out waiting for ${what}`)), ms)))]);
  } finally {
    clearTimeout(timer);
  }
}

/** Why a capacity step did not hold, in words: the limits it broke and which side ran out of CPU. */
function whyBroken(step: Awaited<ReturnType<typeof drive>> & { sessions: number }): string {
  const broken: string[] = [];
  if (!(step.propagationMs.p95 < PROPAGATION_P95_LIMIT_MS)) broken.push(`propagation p95 ${step.propagationMs.p95} ms ≥ ${PROPAGATION_P95_LIMIT_MS}`);
  if (!(step.editToTableMs.p95 < COMPUTE_P95_LIMIT_MS)) broken.push(`compute p95 ${step.editToTableMs.p95} ms ≥ ${COMPUTE_P95_LIMIT_MS}`);
  const target = step.sessions * EDITORS_PER_CAPACITY_SESSION * DRAG_HZ;
  const causes: string[] = [];
  const machine = step.server.cpuPercentOfOneCore + step.benchProcessCpuPercentOfOneCore + step.otherProcessesCpuPercentOfOneCore;
  if (machine > 180) causes.push(`the two cores are full (server ${step.server.cpuPercentOfOneCore} %, simulated editors ${step.benchProcessCpuPercentOfOneCore} %, other programs ${step.otherProcessesCpuPercentOfOneCore} % of a core)`);
  if (step.otherProcessesCpuPercentOfOneCore > 50) causes.push(`other programs on the machine took ${step.otherProcessesCpuPercentOfOneCore} % of a core during the step`);
  if (step.benchProcessCpuPercentOfOneCore > 90) causes.push('the simulated editors’ process is at one full core, so it also delays what it measures');
  causes.push(`the server’s event loop was busy ${step.server.mainThreadCpuPercent} % of the time`);
  if (step.editsPerS < target * 0.9) causes.push(`only ${step.editsPerS} of ${target} edits/s were made`);
  return `${broken.join('; ')}${causes.length ? ` — ${causes.join('; ')}` : ''}`;
}

/** The collaboration figures, against the server in its own process. */
export async function collabBench() {
  // e.g. COLLAB_BENCH_NODE_ARGS='--cpu-prof --cpu-prof-dir=/tmp/prof' to profile the server under the load.
  const { child, port } = await startBenchServer((process.env.COLLAB_BENCH_NODE_ARGS ?? '').split(' ').filter(Boolean));
  const baseUrl = `http://127.0.0.1:${port}`;
  const pid = child.pid as number;
  try {
    const lead = DEMO_ACCOUNTS.find((account) => account.role === 'lead')!;
    const token = await logIn(baseUrl, lead.email, DEMO_PASSWORD);
    const studioId = (await api(baseUrl, '/api/me', token)).studios[0].id as string;
    const newSession = async (name: string, editors: number) => (await api(baseUrl, `/api/studios/${studioId}/sessions`, token, 'POST', { name, patch: benchPatch(editors) })).session.id as string;

    /** Runs `count` app editors in one fresh session. */
    async function appRun(count: number, name: string) {
      const sessionId = await newSession(name, count);
      const editors = Array.from({ length: count }, (_, index) => new AppEditor(baseUrl, sessionId, token, index, count));
      await withTimeout(Promise.all(editors.map((editor) => editor.ready())), 20_000, `${count} editors ready`);
      const figures = await drive(editors, RUN_S, pid);
      for (const editor of editors) editor.close();
      await new Promise((resolve) => setTimeout(resolve, 500));
      return { editors: count, dragHz: DRAG_HZ, ...figures };
    }

    const rssAtStart = processStats(pid).rssMB;
    const oneEditor = await appRun(1, 'Bench: one editor');
    const eightEditors = await appRun(8, 'Bench: eight editors');

    // Capacity: a pool of sessions, reused step to step; lightweight editors.
    const pool: string[] = [];
    const steps: Array<Awaited<ReturnType<typeof drive>> & { sessions: number; editors: number; holds: boolean; setupS: number }> = [];
    for (const sessions of STEPS) {
      while (pool.length < sessions) pool.push(await newSession(`Bench capacity ${pool.length + 1}`, EDITORS_PER_CAPACITY_SESSION));
      const setupStarted = performance.now();
      const editors = pool.slice(0, sessions).flatMap((sessionId) => Array.from({ length: EDITORS_PER_CAPACITY_SESSION }, (_, index) => new LightEditor({ baseUrl, sessionId, token, index, editors: EDITORS_PER_CAPACITY_SESSION })));
      try {
        await withTimeout(Promise.all(editors.map((editor) => Promise.all([editor.synced, editor.firstTable]))), 60_000, `${sessions} sessions ready`);
        const setupS = round((performance.now() - setupStarted) / 1000);
        const figures = await drive(editors, STEP_S, pid);
        steps.push({ sessions, editors: editors.length, ...figures, holds: figures.propagationMs.p95 < PROPAGATION_P95_LIMIT_MS && figures.editToTableMs.p95 < COMPUTE_P95_LIMIT_MS, setupS });
      } finally {
        for (const editor of editors) editor.close();
        // Let rooms close and write before the next step.
        await new Promise((resolve) => setTimeout(resolve, 1500));
      }
    }
    const held = steps.filter((step) => step.holds);
    const largest = held.length ? Math.max(...held.map((step) => step.sessions)) : 0;
    const firstBroken = steps.find((step) => !step.holds && step.sessions > largest);

    return {
      note: 'server in its own process; the simulated editors run in this process on the same 2 cores',
      editToTableOneEditor: oneEditor,
      editToTableEightEditors: eightEditors,
      capacity: {
        editorsPerSession: EDITORS_PER_CAPACITY_SESSION,
        dragHz: DRAG_HZ,
        limits: { propagationP95Ms: PROPAGATION_P95_LIMIT_MS, computeP95Ms: COMPUTE_P95_LIMIT_MS },
        steps: steps.map((step) => ({
          sessions: step.sessions,
          editors: step.editors,
          editsPerS: step.editsPerS,
          movesRefused: step.movesRefused,
          tablesRefused: step.tablesRefused,
          propagationP95Ms: step.propagationMs.p95,
          computeP95Ms: step.editToTableMs.p95,
          computeP50Ms: step.editToTableMs.p50,
          serverCpuPercentOfOneCore: step.server.cpuPercentOfOneCore,
          serverMainThreadCpuPercent: step.server.mainThreadCpuPercent,
          serverCpuMsPerEdit: step.server.cpuMsPerEdit,
          serverMainThreadMsPerEdit: step.server.mainThreadMsPerEdit,
          benchProcessCpuPercentOfOneCore: step.benchProcessCpuPercentOfOneCore,
          otherProcessesCpuPercentOfOneCore: step.otherProcessesCpuPercentOfOneCore,
          tablesPerSPerEditor: step.tablesPerSPerEditor,
          setupS: step.setupS,
          holds: step.holds,
        })),
        largestSessionsHeld: largest,
        nextStepBreaksBecause: firstBroken ? whyBroken(firstBroken) : null,
      },
      server: { rssMBAtStart: round(rssAtStart), rssMBAtEnd: round(processStats(pid).rssMB) },
      goals: {
        editToTableP95Under20msOneEditor: oneEditor.editToTableMs.p95 < 20,
        editToTableP95Under60msEightEditors: eightEditors.editToTableMs.p95 < 60,
        tableAtMost16KB: Math.max(oneEditor.bytesPerTable.max, eightEditors.bytesPerTable.max) <= 16 * 1024,
        capacityAtLeast40Sessions: largest >= 40,
      },
    };
  } finally {
    await stopBenchServer(child);
  }
}
