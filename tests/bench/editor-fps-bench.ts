/**
 * Editor frame rate (part of `npm run bench`): one headless Chromium page on a session, against
 * the app started as `npm start` starts it, while seven remote teammates simulated in Node (the web
 * app's own SessionConnection over real websockets) drag a point each at 30 Hz for
 * EDITOR_BENCH_SECONDS (default 5): first with the page only watching, then with the page's
 * designer dragging a point of their own with the preview looping (live audition). Reports the
 * page's frames (requestAnimationFrame), frame intervals, long tasks, the compute results shown and,
 * for the second run, the audition's crossfades and gaps, beside the goals, with the machine's CPU
 * split between Chromium, the app server and this driver (where the teammates run). One page
 * replaces the three pages this measured before, which mostly measured Chromium competing with
 * itself for two cores. Run alone with `npx tsx tests/bench/editor-fps-bench.ts`.
 */
import { availableParallelism } from 'node:os';
import { pathToFileURL } from 'node:url';
import type { Browser, Page } from 'playwright-core';
import { startE2eHarness } from '../support/e2e-harness';
import { cpuBetween, cpuSample } from './cpu-share';
import { EDITORS, RemoteTeammates, clientBuildKind, TEAMMATE_DRAG_HZ, openMeasuringPage, percentile, pointPx, prepareBenchSession, round } from './remote-teammates';

const DRAG_S = Number(process.env.EDITOR_BENCH_SECONDS ?? 5);
const STEP_MS = 16;
const MAX_MOVES_IN_FLIGHT = 4;
const IDLE_PROBE_MS = 1000;
const VIEWPORT = { width: 1280, height: 860 };
const GOALS = { fpsGoal: 55, frameIntervalP95GoalMs: 25 };
/** A frame interval longer than this counts as a dropped frame. */
const DROPPED_OVER_MS = 20;
/** How far each point swings while dragged: along the string and up and down, pixels and seconds. */
const SWING = { alongPx: 30, alongPeriodS: 1.3, upDownPx: 8, upDownPeriodS: 0.9 };

/** What the in-page recorders kept: frame stamps and long tasks (ms, page clock), compute results shown. */
interface Recorded {
  frames: number[];
  longTasks: Array<{ startTime: number; duration: number }>;
  results: number;
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

/** The frames and long tasks the recorder kept inside [fromMs, toMs] of the page's clock. */
function within(recorded: Recorded, fromMs: number, toMs: number): Recorded {
  return {
    frames: recorded.frames.filter((stamp) => stamp >= fromMs && stamp <= toMs),
    longTasks: recorded.longTasks.filter((task) => task.startTime >= fromMs && task.startTime <= toMs),
    results: recorded.results,
  };
}

/** The audition probe's loop counts (plain data out of the page). */
const loopCounts = (page: Page) =>
  page.evaluate(`(() => { const p = window.__tautlineAudition; return { ...p.counts, silentWindows: p.silentWindows, heardWindows: p.heardWindows, contextState: p.contextState() }; })()`) as Promise<Record<string, number | string | null>>;

/**
 * One measured run of DRAG_S: the teammates drag (and the page's own drag, when given, runs at the
 * same time); the recorder's frames are cut to the run's window of the page's clock, read only once
 * the teammates have stopped (a page overwhelmed by them would answer late).
 */
async function measuredRun(page: Page, teammates: RemoteTeammates, serverPid: number, ownDrag?: () => Promise<{ sent: number; skipped: number; seconds: number; ackMs: number[] }>) {
  await installRecorder(page);
  const fromMs = (await page.evaluate('performance.now()')) as number;
  const editsBefore = teammates.edits;
  const cpuStart = cpuSample(serverPid);
  teammates.startDragging();
  const [drag] = await Promise.all([ownDrag ? ownDrag() : Promise.resolve(null), new Promise((resolve) => setTimeout(resolve, DRAG_S * 1000))]);
  await teammates.stopDragging();
  const cpu = cpuBetween(cpuStart, cpuSample(serverPid));
  const recorded = within(await stopRecorder(page), fromMs, fromMs + DRAG_S * 1000);
  const { figures } = frameFigures(recorded.frames, recorded.longTasks);
  return {
    ...figures,
    computeResultsShown: recorded.results,
    teammateEdits: teammates.edits - editsBefore,
    ownDrag: drag && {
      mouseMovesSent: drag.sent,
      perS: round(drag.sent / drag.seconds),
      skippedWhilePageBusy: drag.skipped,
      ackMs: { p50: round(percentile(drag.ackMs, 50)), p95: round(percentile(drag.ackMs, 95)), max: round(Math.max(...drag.ackMs)) },
    },
    cpuPercentOfOneCore: cpu,
  };
}

/** The editor frame-rate figures: one Chromium page while seven Node teammates drag, watching and then dragging with the loop playing. */
export async function editorFpsBench(): Promise<Record<string, unknown>> {
  const harness = await startE2eHarness();
  let teammates: RemoteTeammates | null = null;
  try {
    const session = await prepareBenchSession(harness);
    const serverPid = harness.app.child.pid as number;
    const calibration = await rafCalibration(harness.browser, 1, serverPid);
    const page = await openMeasuringPage(harness, VIEWPORT.height);
    const load = await RemoteTeammates.open(session, EDITORS - 1);
    teammates = load;
    for (let attempt = 0; attempt < 100 && (await page.getByTestId('peer').count()) < EDITORS - 1; attempt++) await page.waitForTimeout(100);
    const peersSeen = await page.getByTestId('peer').count();
    await page.waitForTimeout(500);
    const visibility = (await page.evaluate('document.visibilityState')) as string;
    const idleStart = cpuSample(serverPid);
    const idle = await idleFps(page);
    const cpuIdle = cpuBetween(idleStart, cpuSample(serverPid));

    const watching = await measuredRun(page, load, serverPid);

    // The designer loops the preview (the first play asks about the level) and drags their own point, the last of the eight.
    await page.getByLabel('Loop').check();
    await page.getByRole('button', { name: 'Play preview' }).click();
    await page.getByRole('button', { name: 'Play at this level' }).click({ timeout: 30_000 });
    await page.getByRole('button', { name: '■ Stop' }).waitFor({ timeout: 30_000 });
    const loopBefore = await loopCounts(page);
    const handle = await pointPx(page, session.patch, EDITORS - 1);
    const dragging = await measuredRun(page, load, serverPid, () => dragFor(page, handle, 0));
    const loopAfter = await loopCounts(page);
    const audition: Record<string, number | string | null> = { contextState: loopAfter.contextState };
    for (const key of ['crossfades', 'extensions', 'gaps', 'silentWindows', 'heardWindows']) audition[key] = (loopAfter[key] as number) - (loopBefore[key] as number);

    const worstMeanFps = Math.min(watching.meanFps, dragging.meanFps);
    const worstP95 = Math.max(watching.frameIntervalMs.p95, dragging.frameIntervalMs.p95);
    return {
      note: `one headless Chromium page (software rendering, --disable-gpu); the app server with its compute worker, Chromium and the ${EDITORS - 1} Node teammates (this driver) share this machine's ${availableParallelism()} cores`,
      cores: availableParallelism(),
      clientBuild: clientBuildKind(),
      session: 'the demo session with an eight-point shape, one point for each editor',
      teammates: { count: EDITORS - 1, dragHz: TEAMMATE_DRAG_HZ, each: 'an edit (movePoint) and a presence update per move, one gesture per run' },
      peersShownOnPage: peersSeen,
      visibilityState: visibility,
      idleFpsBefore: round(idle),
      cpuIdleRafProbe: cpuIdle,
      viewport: `${VIEWPORT.width}x${VIEWPORT.height}`,
      seconds: DRAG_S,
      droppedMeans: `frame interval > ${DROPPED_OVER_MS} ms`,
      mouseMovesMean: `the page's own drag: moves sent on a ${STEP_MS} ms clock, at most ${MAX_MOVES_IN_FLIGHT} waiting at once (further steps skipped); ackMs: until the page acknowledged the move (input delay)`,
      watching,
      draggingWithLoopAudition: { ...dragging, audition },
      worstMeanFps,
      worstFrameIntervalP95Ms: worstP95,
      rafCalibration: { ...calibration, means: 'what ticking rAF at all costs in this headless Chromium, on a plain page of the same size before the session opens' },
      goals: { ...GOALS, metRule: 'both runs: mean fps >= fpsGoal and frame interval p95 < frameIntervalP95GoalMs' },
      met: worstMeanFps >= GOALS.fpsGoal && worstP95 < GOALS.frameIntervalP95GoalMs,
    };
  } finally {
    teammates?.close();
    await harness.close();
  }
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  process.stdout.write(`${JSON.stringify({ editor: await editorFpsBench() }, null, 2)}\n`);
  process.exit(0);
}
