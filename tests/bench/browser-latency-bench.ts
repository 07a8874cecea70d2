/**
 * Edit → mode table and edit → first 250 ms of audio, measured in a real browser (part of `npm run
 * bench`): one headless Chromium page on the app started as `npm start` starts it nudges its point
 * with the arrow keys (1 mm a press, 30 presses a second, to and fro) for LATENCY_BENCH_SECONDS
 * (default 6) twice: alone, then while seven teammates simulated in Node (the web app's own
 * SessionConnection over real websockets) drag their points at 30 Hz in the same session.
 *
 * The page's audition probe stamps with performance.now() each edit as the page's document takes
 * it, each mode table as it reaches the page (decoded, with its state vector), and each preview as
 * the audition first sees its first 250 ms ready; an edit's table is the first whose state vector
 * includes it, its audio the first preview of that table or a later one. Run alone with
 * `npx tsx tests/bench/browser-latency-bench.ts`.
 */
import { availableParallelism } from 'node:os';
import { pathToFileURL } from 'node:url';
import type { Page } from 'playwright-core';
import { startE2eHarness } from '../support/e2e-harness';
import { cpuBetween, cpuSample } from './cpu-share';
import { EDITORS, RemoteTeammates, clientBuildKind, TEAMMATE_DRAG_HZ, editLatencies, openMeasuringPage, prepareBenchSession, readProbe, round, selectPoint, spread } from './remote-teammates';

const EDIT_S = Number(process.env.LATENCY_BENCH_SECONDS ?? 6);
/** Key presses a second: spaced, so each edit's latency is its own; and key repeat's rate, which a busy page cannot keep up with. */
const SPACED_PRESS_HZ = 4;
const REPEAT_PRESS_HZ = 30;
const GOALS = { editToTableP95Ms: 20, editToAudioP95MsOneEditor: 30, editToAudioP95MsEightEditors: 60 };

/** Presses → and ← in turn (the point moves 1 mm and back) on a `pressHz` clock for EDIT_S; returns the presses made. */
async function nudgeFor(page: Page, pressHz: number): Promise<number> {
  const stepMs = 1000 / pressHz;
  const started = performance.now();
  let presses = 0;
  for (let step = 1; performance.now() - started < EDIT_S * 1000; step++) {
    // A page overwhelmed by the load acknowledges late: go on after a second (the press stays queued).
    await Promise.race([page.keyboard.press(step % 2 === 1 ? 'ArrowRight' : 'ArrowLeft'), new Promise((resolve) => setTimeout(resolve, 1000))]);
    presses++;
    const wait = started + step * stepMs - performance.now();
    if (wait > 0) await new Promise((resolve) => setTimeout(resolve, wait));
  }
  return presses;
}

/** Waits until the page answers within 50 ms again (a backlog from the last run drained), at most 60 s; returns how long that took. */
async function settle(page: Page): Promise<number> {
  const started = performance.now();
  while (performance.now() - started < 60_000) {
    const asked = performance.now();
    await page.evaluate('1');
    if (performance.now() - asked < 50) break;
    await page.waitForTimeout(200);
  }
  return round((performance.now() - started) / 1000);
}

/**
 * One measured run: the page's presses, then its edits matched to tables and previews. The load
 * (if any) stops before the page is read: a page overwhelmed by it would answer only much later.
 */
async function measure(page: Page, serverPid: number, pressHz: number, load?: { start: () => void; stop: () => Promise<void> }) {
  const settledAfterS = await settle(page);
  if (load) {
    load.start();
    await page.waitForTimeout(500);
  }
  const sinceMs = (await page.evaluate('performance.now()')) as number;
  const wallStarted = performance.now();
  const cpuStart = cpuSample(serverPid);
  const presses = await nudgeFor(page, pressHz);
  const cpu = cpuBetween(cpuStart, cpuSample(serverPid));
  const pressingS = (performance.now() - wallStarted) / 1000;
  await load?.stop();
  await page.waitForTimeout(1500); // the last edits' tables and previews arrive
  const records = await readProbe(page);
  const { toTable, toAudio, unmatched } = editLatencies(records, sinceMs);
  const tables = records.tables.filter((table) => table.atMs >= sinceMs).length;
  return {
    keyPressesPerS: pressHz,
    keyPresses: presses,
    pressingS: round(pressingS),
    pageSettledBeforeS: settledAfterS,
    editsTaken: toTable.length + unmatched,
    tablesReceived: tables,
    editToTableMs: spread(toTable),
    editToFirstAudioMs: spread(toAudio),
    editsWithNoTable: unmatched,
    cpuPercentOfOneCore: cpu,
  };
}

export async function browserLatencyBench(): Promise<Record<string, unknown>> {
  const harness = await startE2eHarness();
  let teammates: RemoteTeammates | null = null;
  try {
    const session = await prepareBenchSession(harness);
    const serverPid = harness.app.child.pid as number;
    const page = await openMeasuringPage(harness);
    // The page's own point is the last of the eight; the teammates take the others.
    await selectPoint(page, session.patch, EDITORS - 1);
    await page.waitForTimeout(500);
    const oneEditor = await measure(page, serverPid, SPACED_PRESS_HZ);
    const oneEditorKeyRepeat = await measure(page, serverPid, REPEAT_PRESS_HZ);

    const load = await RemoteTeammates.open(session, EDITORS - 1);
    teammates = load;
    const eightEditors = await measure(page, serverPid, SPACED_PRESS_HZ, { start: () => load.startDragging(), stop: () => load.stopDragging() });
    const teammateEdits = teammates.edits;
    const teammateRefusals = teammates.refused;

    const met =
      oneEditor.editToTableMs.p95 < GOALS.editToTableP95Ms && oneEditor.editToFirstAudioMs.p95 < GOALS.editToAudioP95MsOneEditor && eightEditors.editToFirstAudioMs.p95 < GOALS.editToAudioP95MsEightEditors;
    return {
      note: `one headless Chromium page (software rendering), the app server, its compute worker and ${EDITORS - 1} Node teammates share this machine's ${availableParallelism()} cores`,
      cores: availableParallelism(),
      clientBuild: clientBuildKind(),
      cpuMeans: 'CPU use while the page pressed, in percent of one core: the whole machine, Chromium, the app server (with its compute worker), this driver (with the teammates), and other processes; much use by other processes means the figures are not this app\'s alone',
      means:
        'editToTableMs: from the page taking the edit into its document until the first mode table whose state vector includes it has reached the page (decoded); editToFirstAudioMs: until the audition first sees a preview of that table (or a later one) with its first 250 ms ready',
      edits: `arrow-key nudges of the page's own point (1 mm to and fro), ${EDIT_S} s per run: ${SPACED_PRESS_HZ} a second (each edit's own latency), and at key repeat's ${REPEAT_PRESS_HZ} a second alone`,
      oneEditor,
      oneEditorKeyRepeat,
      eightEditors: { ...eightEditors, teammates: EDITORS - 1, teammateDragHz: TEAMMATE_DRAG_HZ, teammateEditsMade: teammateEdits, teammateEditsRefusedLocally: teammateRefusals },
      goals: GOALS,
      met,
    };
  } finally {
    teammates?.close();
    await harness.close();
  }
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  process.stdout.write(`${JSON.stringify({ browserLatency: await browserLatencyBench() }, null, 2)}\n`);
  process.exit(0);
}
