/**
 * Editor frame rate (part of `npm run bench`): three people (lead, designer and an invited second
 * designer) each drag a point of their own on the string canvas of the same session for
 * EDITOR_BENCH_SECONDS (default 5), each in a headless Chromium page of its own, against the app
 * started as `npm start` starts it. Reports per page the frames drawn (requestAnimationFrame), the
 * frame intervals, long tasks and the compute results that arrived meanwhile, beside the goals.
 * Run alone with `npx tsx tests/bench/editor-fps-bench.ts`.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { pathToFileURL } from 'node:url';
import type { Browser, Page } from 'playwright-core';
import type { Patch } from '../../shared/patch/patch-schema';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../server/seed/demo-seed';
import { CANVAS_MARGIN_PX } from '../../src/features/editor/components/string-canvas';
import { startE2eHarness } from '../support/e2e-harness';
import { testPatch } from '../support/patches';
import { api, logIn } from './bench-api';

const DRAG_S = Number(process.env.EDITOR_BENCH_SECONDS ?? 5);
const STEP_MS = 16;
const MAX_MOVES_IN_FLIGHT = 4;
const IDLE_PROBE_MS = 1000;
const SESSION_NAME = 'Lighthouse stair climb';
const VIEWPORT = { width: 1280, height: 860 };
const GOALS = { fpsGoal: 60, frameIntervalP95GoalMs: 20 };
/** A frame interval longer than this counts as a dropped frame. */
const DROPPED_OVER_MS = 20;
/** The third editor, invited by the lead as a designer (invented for the demo studio). */
const INVITEE = { email: 'marlo@kestrel-lantern.example', displayName: 'Marlo Finch', password: 'tidal-ember-lamp-58' };
/** How far each point swings while dragged: along the string and up and down, pixels and seconds. */
const SWING = { alongPx: 30, alongPeriodS: 1.3, upDownPx: 8, upDownPeriodS: 0.9 };

const round = (value: number) => Math.round(value * 100) / 100;

function percentile(values: number[], p: number): number {
  if (values.length === 0) return NaN;
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))];
}

/** What the in-page recorders kept: frame stamps and long tasks (ms, page clock), compute results shown. */
interface Recorded {
  frames: number[];
  longTasks: Array<{ startTime: number; duration: number }>;
  results: number;
}

/** The lead invites the third person as a designer; the link comes from the local mailbox; the invitee accepts. */
async function inviteThirdDesigner(baseUrl: string, leadToken: string, studioId: string): Promise<void> {
  await api(baseUrl, `/api/studios/${studioId}/invitations`, leadToken, 'POST', { email: INVITEE.email, role: 'designer' });
  let token: string | null = null;
  for (let attempt = 0; attempt < 50 && !token; attempt++) {
    const { messages } = (await api(baseUrl, '/api/dev/mailbox', leadToken)) as { messages: Array<{ to: string[]; links: string[] }> };
    const link = messages.find((message) => message.to.includes(INVITEE.email))?.links.find((candidate) => candidate.includes('/invitations/accept?token='));
    token = link ? new URL(link).searchParams.get('token') : null;
    if (!token) await new Promise((resolve) => setTimeout(resolve, 100));
  }
  if (!token) throw new Error(`no invitation mail to ${INVITEE.email}`);
  const accepted = await fetch(`${baseUrl}/api/invitations/accept`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ token, displayName: INVITEE.displayName, password: INVITEE.password }),
  });
  if (!accepted.ok) throw new Error(`accepting the invitation: ${accepted.status} ${await accepted.text()}`);
}

/** A plain pluck with three interior points, one for each person to drag. */
function threePointPluck(): Patch {
  const lengthM = 0.65;
  return testPatch({
    name: 'Plain pluck, three handles',
    excitation: { displacementM: [[0, 0], [0.16, 0.002], [0.325, 0.003], [0.49, 0.002], [lengthM, 0]] },
    render: { sampleRateHz: 48000, durationS: 2, maxModes: 4096 },
  }) as Patch;
}

/** Where interior point `index` is drawn, from the same mapping the canvas uses. */
async function pointPx(page: Page, patch: Patch, index: number): Promise<{ x: number; y: number }> {
  const box = (await page.locator('[data-display-range-m] canvas').first().boundingBox())!;
  const range = Number(await page.locator('[data-display-range-m]').getAttribute('data-display-range-m'));
  const [xM, yM] = patch.excitation.displacementM[index + 1];
  return {
    x: box.x + CANVAS_MARGIN_PX + (xM / patch.string.lengthM) * (box.width - 2 * CANVAS_MARGIN_PX),
    y: box.y + box.height / 2 - (yM / range) * (box.height / 2 - CANVAS_MARGIN_PX),
  };
}

/*
 * The in-page scripts are plain JavaScript text: functions passed to page.evaluate from a file run
 * by tsx carry esbuild's `__name` helper, which the page does not have.
 */

/** Starts the frame, long-task and compute-result recorders in the page. */
const INSTALL_RECORDER = `(() => {
  window.__recording = true;
  window.__frames = [];
  window.__longTasks = [];
  window.__results = 0;
  const tick = () => {
    if (!window.__recording) return;
    window.__frames.push(performance.now());
    requestAnimationFrame(tick);
  };
  requestAnimationFrame(tick);
  new PerformanceObserver((list) => {
    if (window.__recording) for (const entry of list.getEntries()) window.__longTasks.push({ startTime: entry.startTime, duration: entry.duration });
  }).observe({ type: 'longtask' });
  const figures = document.querySelector('[data-testid="result-figures"]');
  let last = figures ? figures.textContent : '';
  if (figures) {
    new MutationObserver(() => {
      const now = figures.textContent;
      if (window.__recording && now !== last) window.__results++;
      last = now;
    }).observe(figures, { subtree: true, childList: true, characterData: true });
  }
})()`;

const STOP_RECORDER = `(() => {
  window.__recording = false;
  return { frames: window.__frames, longTasks: window.__longTasks, results: window.__results };
})()`;

/** Frames per second with nothing happening, to tell throttled rAF from a busy page. */
const IDLE_FPS = `new Promise((resolve) => {
  const stamps = [];
  const tick = () => {
    stamps.push(performance.now());
    if (stamps[stamps.length - 1] - stamps[0] < ${IDLE_PROBE_MS}) requestAnimationFrame(tick);
    else resolve(((stamps.length - 1) * 1000) / (stamps[stamps.length - 1] - stamps[0]));
  };
  requestAnimationFrame(tick);
})`;

const installRecorder = (page: Page) => page.evaluate(INSTALL_RECORDER);
const stopRecorder = (page: Page) => page.evaluate(STOP_RECORDER) as Promise<Recorded>;
const idleFps = (page: Page) => page.evaluate(IDLE_FPS) as Promise<number>;

/**
 * What the rAF recorder costs by itself here: the machine's busy share with three plain pages of
 * the same size at rest, then with a rAF loop in each (headless Chromium composites in software, so
 * producing frames at all is not free). Uses pages of its own, closed before the measurement.
 */
async function rafCalibration(browser: Browser, pageCount: number, serverPid: number) {
  const contexts = await Promise.all(Array.from({ length: pageCount }, () => browser.newContext({ viewport: VIEWPORT })));
  try {
    const pages = await Promise.all(
      contexts.map(async (context) => {
        const page = await context.newPage();
        await page.setContent('<h1>Calibration</h1><p>A plain page with nothing moving.</p>');
        return page;
      }),
    );
    await new Promise((resolve) => setTimeout(resolve, 500));
    const restStart = cpuSample(serverPid);
    await new Promise((resolve) => setTimeout(resolve, 2000));
    const atRest = cpuBetween(restStart, cpuSample(serverPid));
    const loopStart = cpuSample(serverPid);
    const fps = await Promise.all(pages.map((page) => idleFps(page)));
    const withLoop = cpuBetween(loopStart, cpuSample(serverPid));
    return { pages: pageCount, content: 'a plain page', chromiumCpuPercentOfOneCore: { atRest: atRest.chromium, withRafLoop: withLoop.chromium }, otherProcessesCpuPercentOfOneCore: withLoop.otherProcesses, fps: fps.map(round) };
  } finally {
    for (const context of contexts) await context.close();
  }
}

/**
 * Presses on the point, swings it back and forth in small steps every STEP_MS for DRAG_S, lets go.
 * Moves go out on the clock like a real mouse's, not one after the other's acknowledgement; at most
 * MAX_MOVES_IN_FLIGHT wait for the page at once (further steps are skipped and counted). The time the
 * page takes to acknowledge each move (CDP Input.dispatchMouseEvent) is kept as its input delay.
 */
async function dragFor(page: Page, from: { x: number; y: number }, phase: number): Promise<{ sent: number; skipped: number; seconds: number; ackMs: number[] }> {
  await page.mouse.move(from.x, from.y);
  await page.mouse.down();
  const started = performance.now();
  const ackMs: number[] = [];
  const pending = new Set<Promise<void>>();
  let sent = 0;
  let skipped = 0;
  for (let step = 1; ; step++) {
    const wait = started + step * STEP_MS - performance.now();
    if (wait > 0) await new Promise((resolve) => setTimeout(resolve, wait));
    const t = (performance.now() - started) / 1000;
    if (t >= DRAG_S) break;
    if (pending.size >= MAX_MOVES_IN_FLIGHT) {
      skipped++;
      continue;
    }
    // Offset so that the swing starts where the point is (t = 0 gives `from`).
    const x = from.x + SWING.alongPx * (Math.sin((2 * Math.PI * t) / SWING.alongPeriodS + phase) - Math.sin(phase));
    const y = from.y + SWING.upDownPx * (Math.sin((2 * Math.PI * t) / SWING.upDownPeriodS + phase) - Math.sin(phase));
    const issued = performance.now();
    const move: Promise<void> = page.mouse.move(x, y).then(() => {
      ackMs.push(performance.now() - issued);
      pending.delete(move);
    });
    pending.add(move);
    sent++;
  }
  const seconds = (performance.now() - started) / 1000;
  await Promise.all(pending);
  await page.mouse.up();
  return { sent, skipped, seconds, ackMs };
}

/** CPU seconds so far, from /proc (Linux, clock ticks of 1/100 s): the machine, and this bench's own processes. */
interface CpuSample {
  atMs: number;
  machineBusyS: number;
  /** The bench's process tree, split: Chromium (all its processes), the app server (with its worker threads), the rest (this driver). */
  browserS: number;
  serverS: number;
  driverS: number;
}

function cpuSample(serverPid: number): CpuSample {
  const fields = readFileSync('/proc/stat', 'utf8').split('\n')[0].trim().split(/\s+/).slice(1).map(Number);
  const machineBusyS = (fields.reduce((sum, value) => sum + value, 0) - fields[3] - (fields[4] ?? 0)) / 100;
  const processes = new Map<number, { parent: number; name: string; cpuS: number }>();
  for (const entry of readdirSync('/proc')) {
    if (!/^\d+$/.test(entry)) continue;
    try {
      const stat = readFileSync(`/proc/${entry}/stat`, 'utf8');
      const name = stat.slice(stat.indexOf('(') + 1, stat.lastIndexOf(')'));
      const rest = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
      processes.set(Number(entry), { parent: Number(rest[1]), name, cpuS: (Number(rest[11]) + Number(rest[12])) / 100 });
    } catch {
      // The process ended between the listing and the read.
    }
  }
  const sample = { atMs: performance.now(), machineBusyS, browserS: 0, serverS: 0, driverS: 0 };
  for (const [pid, info] of processes) {
    // Walk up to this driver; note on the way whether the app server is an ancestor (or the process itself).
    let underServer = false;
    let current: number | undefined = pid;
    while (current !== undefined && current > 1 && current !== process.pid) {
      if (current === serverPid) underServer = true;
      current = processes.get(current)?.parent;
    }
    if (current !== process.pid) continue;
    if (underServer) sample.serverS += info.cpuS;
    else if (info.name.startsWith('chrom')) sample.browserS += info.cpuS;
    else sample.driverS += info.cpuS;
  }
  return sample;
}

/** CPU use between two samples, in percent of one core. */
function cpuBetween(before: CpuSample, after: CpuSample) {
  const seconds = (after.atMs - before.atMs) / 1000;
  const percent = (value: number) => round((value / seconds) * 100);
  const ours = after.browserS - before.browserS + (after.serverS - before.serverS) + (after.driverS - before.driverS);
  return {
    wholeMachine: percent(after.machineBusyS - before.machineBusyS),
    chromium: percent(after.browserS - before.browserS),
    appServer: percent(after.serverS - before.serverS),
    benchDriver: percent(after.driverS - before.driverS),
    otherProcesses: percent(Math.max(0, after.machineBusyS - before.machineBusyS - ours)),
  };
}

function frameFigures(frames: number[], longTasks: Array<{ startTime: number; duration: number }>) {
  const intervals = frames.slice(1).map((stamp, i) => stamp - frames[i]);
  const spanMs = frames.length > 1 ? frames[frames.length - 1] - frames[0] : NaN;
  return {
    intervals,
    figures: {
      frames: frames.length,
      meanFps: round(((frames.length - 1) * 1000) / spanMs),
      frameIntervalMs: { p50: round(percentile(intervals, 50)), p95: round(percentile(intervals, 95)), p99: round(percentile(intervals, 99)), max: round(Math.max(...intervals)) },
      droppedShare: round(intervals.filter((interval) => interval > DROPPED_OVER_MS).length / Math.max(1, intervals.length)),
      longTasks: { count: longTasks.length, totalMs: round(longTasks.reduce((sum, task) => sum + task.duration, 0)), maxMs: round(Math.max(0, ...longTasks.map((task) => task.duration))) },
    },
  };
}

/** The editor frame-rate figures: three people dragging at once, each in a headless Chromium page. */
export async function editorFpsBench(): Promise<Record<string, unknown>> {
  const harness = await startE2eHarness();
  try {
    const baseUrl = harness.app.baseUrl;
    const lead = DEMO_ACCOUNTS.find((account) => account.role === 'lead')!;
    const designer = DEMO_ACCOUNTS.find((account) => account.role === 'designer')!;
    const leadToken = await logIn(baseUrl, lead.email, DEMO_PASSWORD);
    const studioId = (await api(baseUrl, '/api/me', leadToken)).studios[0].id as string;
    // Only leads and designers edit sessions (shared/access/roles.ts): the third editor is invited.
    await inviteThirdDesigner(baseUrl, leadToken, studioId);
    const { sessions } = (await api(baseUrl, `/api/studios/${studioId}/sessions`, leadToken)) as { sessions: Array<{ id: string; name: string }> };
    const sessionId = sessions.find((session) => session.name === SESSION_NAME)!.id;
    await api(baseUrl, `/api/sessions/${sessionId}`, leadToken, 'PATCH', { patch: threePointPluck() });
    const start = (await api(baseUrl, `/api/sessions/${sessionId}`, leadToken)).session.patch as Patch;

    const people = [
      { name: lead.displayName, role: 'lead', email: lead.email, password: DEMO_PASSWORD },
      { name: designer.displayName, role: 'designer', email: designer.email, password: DEMO_PASSWORD },
      { name: INVITEE.displayName, role: 'designer (invited)', email: INVITEE.email, password: INVITEE.password },
    ];
    const serverPid = harness.app.child.pid as number;
    const calibration = await rafCalibration(harness.browser, people.length, serverPid);
    const pages: Page[] = [];
    for (const person of people) {
      const page = await harness.newPage({ height: VIEWPORT.height });
      await harness.signIn(page, person.email, person.password);
      await page.getByRole('link', { name: SESSION_NAME }).click();
      await page.waitForURL(/\/sessions\//);
      await page.locator('[data-display-range-m] canvas').first().waitFor({ timeout: 20_000 });
      await page.getByTestId('result-figures').waitFor({ timeout: 20_000 });
      pages.push(page);
    }
    // Everyone sees the other two before anyone drags.
    for (const page of pages) {
      for (let attempt = 0; attempt < 100 && (await page.getByTestId('peer').count()) < people.length - 1; attempt++) await page.waitForTimeout(100);
    }
    await pages[0].waitForTimeout(500);

    const visibility = await Promise.all(pages.map((page) => page.evaluate('({ visibilityState: document.visibilityState, hidden: document.hidden })') as Promise<{ visibilityState: string; hidden: boolean }>));
    const idleStart = cpuSample(serverPid);
    const idle = await Promise.all(pages.map((page) => idleFps(page)));
    const cpuBeforeDrag = cpuBetween(idleStart, cpuSample(serverPid));
    const points = await Promise.all(pages.map((page, index) => pointPx(page, start, index)));

    await Promise.all(pages.map((page) => installRecorder(page)));
    const dragCpuStart = cpuSample(serverPid);
    const dragStarted = performance.now();
    const drags = await Promise.all(pages.map((page, index) => dragFor(page, points[index], (index * 2 * Math.PI) / 3)));
    const dragSeconds = (performance.now() - dragStarted) / 1000;
    const recorded = await Promise.all(pages.map((page) => stopRecorder(page)));
    const cpuDuringDrag = cpuBetween(dragCpuStart, cpuSample(serverPid));

    // The drags reached the shared document: each dragged point is somewhere else now.
    await pages[0].waitForTimeout(1000);
    const end = (await api(baseUrl, `/api/sessions/${sessionId}`, leadToken)).session.patch as Patch;
    const moved = start.excitation.displacementM.slice(1, -1).map((point, index) => end.excitation.displacementM[index + 1]?.[0] !== point[0] || end.excitation.displacementM[index + 1]?.[1] !== point[1]);

    const allIntervals: number[] = [];
    const perPage = people.map((person, index) => {
      const { intervals, figures } = frameFigures(recorded[index].frames, recorded[index].longTasks);
      allIntervals.push(...intervals);
      return {
        person: person.name,
        role: person.role,
        draggedPoint: index,
        pointMoved: moved[index],
        visibilityState: visibility[index].visibilityState,
        idleFpsBefore: round(idle[index]),
        mouseMoves: {
          sent: drags[index].sent,
          perS: round(drags[index].sent / drags[index].seconds),
          skippedWhilePageBusy: drags[index].skipped,
          ackMs: { p50: round(percentile(drags[index].ackMs, 50)), p95: round(percentile(drags[index].ackMs, 95)), max: round(Math.max(...drags[index].ackMs)) },
        },
        ...figures,
        computeResultsShownDuringDrag: recorded[index].results,
      };
    });
    const worstMeanFps = Math.min(...perPage.map((page) => page.meanFps));
    const worstP95 = Math.max(...perPage.map((page) => page.frameIntervalMs.p95));
    return {
      note: `three headless Chromium pages (software rendering, --disable-gpu), the server and its compute worker share this machine's ${availableParallelism()} cores, so these figures are a lower bound of what one person's own machine sees`,
      cores: availableParallelism(),
      idleFpsMeans: 'rAF rate of each page before the drag, with nothing happening; about 60 means headless Chromium does not throttle the pages',
      rafThrottledWhenIdle: idle.some((fps) => fps < GOALS.fpsGoal * 0.9),
      mouseMovesMean: `sent on a ${STEP_MS} ms clock, at most ${MAX_MOVES_IN_FLIGHT} waiting at once (further steps skipped); ackMs: until the page acknowledged the move (input delay)`,
      people: people.length,
      session: SESSION_NAME,
      pointsDragged: 'a different interior point each (three-point plain pluck)',
      viewport: `${VIEWPORT.width}x${VIEWPORT.height}`,
      seconds: round(dragSeconds),
      droppedMeans: `frame interval > ${DROPPED_OVER_MS} ms`,
      pages: perPage,
      allPages: {
        frameIntervalMs: { p50: round(percentile(allIntervals, 50)), p95: round(percentile(allIntervals, 95)), p99: round(percentile(allIntervals, 99)), max: round(Math.max(...allIntervals)) },
        worstMeanFps,
        worstFrameIntervalP95Ms: worstP95,
      },
      cpuPercentOfOneCore: {
        means: `CPU use in percent of one core (this machine has ${availableParallelism()}): the whole machine, then split into Chromium, the app server (its compute workers are threads), this driver, and other processes; much use by other processes means the figures are not this app's alone`,
        duringDrag: cpuDuringDrag,
        beforeDragIdleRafProbe: cpuBeforeDrag,
      },
      rafCalibration: { ...calibration, means: 'what ticking rAF at all costs in this headless Chromium, on plain pages of the same size before the session opens: part of the load the figures above carry' },
      goals: { ...GOALS, metRule: 'every page: mean fps >= 95% of fpsGoal and frame interval p95 <= frameIntervalP95GoalMs' },
      met: worstMeanFps >= GOALS.fpsGoal * 0.95 && worstP95 <= GOALS.frameIntervalP95GoalMs,
    };
  } finally {
    await harness.close();
  }
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  process.stdout.write(`${JSON.stringify({ editor: await editorFpsBench() }, null, 2)}\n`);
}
