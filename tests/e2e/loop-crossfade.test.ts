import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import ts from 'typescript';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { renderPatch } from '../../shared/engine/render-patch';
import { launchBrowser } from '../support/browser';
import { testPatch, trianglePluck, validPatch } from '../support/patches';
import { PROJECT_ROOT } from '../support/run-cli';

/**
 * The live audition's crossfade, rendered by Chromium's own Web Audio engine in an
 * OfflineAudioContext: the same LoopCrossfade class the app runs on its realtime context
 * (src/lib/audio/loop-crossfade.ts, type-stripped by TypeScript and loaded into a blank page),
 * switching between two real previews of the test string mid-loop.
 *
 * The discontinuity measure (−60 dB re peak). For each output frame k in the crossfade's window,
 * with p_k the place in the loop where the sound would be had it never changed (the first start's
 * position, wrapped), and F the crossfade's length in frames:
 *   jump_out(k)  = |y[k] − y[k−1]|
 *   allowed(k)   = max(|A[p_k] − A[p_k − 1]|, |B[p_k] − B[p_k − 1]|) + |B[p_k − 1] − A[p_k − 1]| / F
 * i.e. the larger step either preview already takes at that place, plus the most a linear fade
 * over F frames can add to one step (the gain moves by 1/F per frame between the two signals).
 * The crossfade passes when max_k (jump_out(k) − allowed(k)) ≤ 10^(−60/20) × peak, where peak is
 * the larger |sample| of the two previews. A hard switch (fade of 0) is rendered too, and must fail.
 */

const RATE_HZ = 48_000;
const LOOP_S = 0.5;
const CROSSFADE_S = 0.012;
const MINUS_60_DB = 10 ** (-60 / 20);

let browser: Browser;
let page: Page;
let previewA: Float32Array;
let previewB: Float32Array;
let previewC: Float32Array;

/** A peak-normalised preview of the test string plucked 3 mm high at `positionM`, LOOP_S long at 48 kHz (as the app's previews are). */
function preview(positionM: number): Float32Array {
  const patch = validPatch(testPatch({ excitation: { displacementM: trianglePluck(0.65, positionM, 0.003) }, render: { sampleRateHz: RATE_HZ, durationS: LOOP_S, maxModes: 4096 } }));
  const rendered = renderPatch(patch);
  let peak = 0;
  for (const sample of rendered) peak = Math.max(peak, Math.abs(sample));
  return Float32Array.from(rendered, (sample) => sample / peak);
}

/** The crossfade module as plain JavaScript (types stripped; it imports nothing), published as window.__loopCrossfade. */
function loopCrossfadeScript(): string {
  const source = readFileSync(join(PROJECT_ROOT, 'src/lib/audio/loop-crossfade.ts'), 'utf8');
  const { outputText } = ts.transpileModule(source, { compilerOptions: { module: ts.ModuleKind.CommonJS, target: ts.ScriptTarget.ES2022 } });
  return `(() => { const exports = {}; ${outputText}\n window.__loopCrossfade = exports; })();`;
}

interface Step {
  /** Context time the render pauses at to make the call, s (0: before rendering starts). */
  atS: number;
  call: 'play' | 'follow';
  sound: { sequence: number; preview: 'a' | 'b' | 'c'; readySamples?: number };
  loop?: boolean;
}

interface LoopEvent {
  kind: string;
  sequence: number;
  atS: number;
  fadeS: number;
  offsetS: number;
  readySamples: number;
}

/** Renders `steps` through LoopCrossfade in an OfflineAudioContext at 48 kHz; returns the output and the loop's events. */
async function renderInChromium(steps: Step[], totalS: number, fadeS = CROSSFADE_S): Promise<{ output: Float32Array; events: LoopEvent[] }> {
  const rendered = (await page.evaluate(
    `(async ({ previews, steps, totalS, fadeS, rate }) => {
      const context = new OfflineAudioContext(1, Math.round(totalS * rate), rate);
      const events = [];
      const loop = new window.__loopCrossfade.LoopCrossfade(context, {
        fadeS,
        onEvent: (event) => events.push(event),
        setTimer: () => events.push({ kind: 'timer-asked' }),
      });
      loop.output.connect(context.destination);
      const soundOf = (spec) => {
        const samples = Float32Array.from(previews[spec.preview]);
        const readySamples = spec.readySamples ?? samples.length;
        return { sequence: spec.sequence, sampleRateHz: rate, samples, readySamples, complete: readySamples === samples.length };
      };
      const run = (step) => (step.call === 'play' ? loop.play(soundOf(step.sound), step.loop ?? true) : loop.follow(soundOf(step.sound)));
      for (const step of steps) {
        if (step.atS === 0) run(step);
        else context.suspend(step.atS).then(() => { run(step); context.resume(); });
      }
      const buffer = await context.startRendering();
      return { output: Array.from(buffer.getChannelData(0)), events };
    })(${JSON.stringify({ previews: { a: Array.from(previewA), b: Array.from(previewB), c: Array.from(previewC) }, steps, totalS, fadeS, rate: RATE_HZ })})`,
  )) as { output: number[]; events: LoopEvent[] };
  return { output: Float32Array.from(rendered.output), events: rendered.events };
}

/** Sample of a looped preview at loop frame `frame` (wrapped). */
const at = (signal: Float32Array, frame: number) => signal[((frame % signal.length) + signal.length) % signal.length];

/**
 * The largest amount by which the output's sample-to-sample jump exceeds what the two previews and
 * a linear fade of `fadeFrames` allow (see the file's comment), over output frames [from, to).
 */
function worstExcessJump(output: Float32Array, a: Float32Array, b: Float32Array, firstFrame: number, from: number, to: number, fadeFrames: number): number {
  let worst = -Infinity;
  for (let k = Math.max(from, firstFrame + 1); k < to; k++) {
    const p = k - firstFrame;
    const jumpOut = Math.abs(output[k] - output[k - 1]);
    const allowed = Math.max(Math.abs(at(a, p) - at(a, p - 1)), Math.abs(at(b, p) - at(b, p - 1))) + Math.abs(at(b, p - 1) - at(a, p - 1)) / fadeFrames;
    worst = Math.max(worst, jumpOut - allowed);
  }
  return worst;
}

beforeAll(async () => {
  previewA = preview(0.17);
  previewB = preview(0.23);
  previewC = preview(0.3);
  browser = await launchBrowser();
  page = await browser.newPage();
  await page.setContent('<!doctype html><title>Crossfade</title>');
  await page.addScriptTag({ content: loopCrossfadeScript() });
}, 60_000);

afterAll(async () => {
  await browser?.close();
});

describe('live audition crossfade, rendered by Chromium in an OfflineAudioContext', () => {
  it('switching to a different preview mid-loop keeps the loop position and adds no jump above −60 dB re peak; a hard switch does', async () => {
    const steps: Step[] = [
      { atS: 0, call: 'play', sound: { sequence: 1, preview: 'a' } },
      // 0.7 s: past the first wrap of the 0.5 s loop, somewhere inside the second pass.
      { atS: 0.7, call: 'follow', sound: { sequence: 2, preview: 'b' } },
    ];
    const { output, events } = await renderInChromium(steps, 1.4);
    expect(events.map((event) => event.kind)).toEqual(['start', 'crossfade']);
    const [start, crossfade] = events;
    const firstFrame = Math.round(start.atS * RATE_HZ);
    const switchFrame = Math.round(crossfade.atS * RATE_HZ);
    const fadeFrames = Math.round(CROSSFADE_S * RATE_HZ);
    // The change starts within one short buffer of the call (lead + one render quantum), on a whole frame.
    expect(crossfade.atS - 0.7).toBeLessThan(0.02);
    expect(Math.abs(crossfade.atS * RATE_HZ - switchFrame)).toBeLessThan(1e-6);
    // Continues where the loop was: the new voice's offset is the old one's position at that frame.
    expect(Math.round(crossfade.offsetS * RATE_HZ)).toBe((switchFrame - firstFrame) % previewA.length);

    const peak = Math.max(...previewA.map(Math.abs), ...previewB.map(Math.abs));
    const excess = worstExcessJump(output, previewA, previewB, firstFrame, switchFrame - 480, switchFrame + fadeFrames + 480, fadeFrames);
    expect(excess).toBeLessThanOrEqual(MINUS_60_DB * peak);

    // Before the switch the output is preview A sample for sample, after the fade preview B at the same loop place
    // (float32 arithmetic: within 1e-6 of peak), wraps of the loop included.
    let beforeError = 0;
    for (let k = firstFrame; k < switchFrame; k++) beforeError = Math.max(beforeError, Math.abs(output[k] - at(previewA, k - firstFrame)));
    let afterError = 0;
    for (let k = switchFrame + fadeFrames; k < output.length; k++) afterError = Math.max(afterError, Math.abs(output[k] - at(previewB, k - firstFrame)));
    expect(beforeError).toBeLessThan(1e-6 * peak);
    expect(afterError).toBeLessThan(1e-6 * peak);
    // During the fade: (1 − g)·A + g·B with g rising linearly from 0 to 1 over the fade (the Web Audio linear ramp's formula).
    let fadeError = 0;
    for (let k = switchFrame; k < switchFrame + fadeFrames; k++) {
      const g = (k - switchFrame) / fadeFrames;
      fadeError = Math.max(fadeError, Math.abs(output[k] - ((1 - g) * at(previewA, k - firstFrame) + g * at(previewB, k - firstFrame))));
    }
    expect(fadeError).toBeLessThan(1e-5 * peak);

    // The same switch with no fade is a click the measure sees (the test can fail).
    const hard = await renderInChromium(steps, 1.4, 0);
    const hardSwitch = Math.round(hard.events[1].atS * RATE_HZ);
    expect(worstExcessJump(hard.output, previewA, previewB, firstFrame, hardSwitch - 480, hardSwitch + fadeFrames + 480, fadeFrames)).toBeGreaterThan(MINUS_60_DB * peak);
  }, 60_000);

  it('a progressive preview starts on its first 250 ms and is extended seamlessly; a newer one with only part of itself ready waits for the rest', async () => {
    const quarter = Math.round(0.25 * RATE_HZ);
    const steps: Step[] = [
      { atS: 0, call: 'play', sound: { sequence: 2, preview: 'b', readySamples: quarter } },
      // More of it, not yet needed at the playhead (0.05 s in, 0.25 s ready): not taken yet.
      { atS: 0.05, call: 'follow', sound: { sequence: 2, preview: 'b', readySamples: quarter + 2400 } },
      // The whole of it: taken, as an extension.
      { atS: 0.2, call: 'follow', sound: { sequence: 2, preview: 'b' } },
      // A newer preview with only its first 250 ms ready while the loop plays at about 0.39 s: it waits…
      { atS: 0.9, call: 'follow', sound: { sequence: 3, preview: 'c', readySamples: quarter } },
      // …and is crossfaded in once complete.
      { atS: 0.95, call: 'follow', sound: { sequence: 3, preview: 'c' } },
    ];
    const { output, events } = await renderInChromium(steps, 1.3);
    expect(events.map((event) => [event.kind, event.sequence])).toEqual([
      ['start', 2],
      ['extend', 2],
      ['crossfade', 3],
    ]);
    const [start, extend, crossfade] = events;
    expect(start.readySamples).toBe(quarter);
    expect(extend.atS).toBeGreaterThan(0.2);
    expect(crossfade.atS).toBeGreaterThan(0.95);
    const firstFrame = Math.round(start.atS * RATE_HZ);
    const switchFrame = Math.round(crossfade.atS * RATE_HZ);
    const fadeFrames = Math.round(CROSSFADE_S * RATE_HZ);
    const peak = Math.max(...previewB.map(Math.abs), ...previewC.map(Math.abs));
    // Extending with more of the same preview changes nothing heard: B sample for sample up to the switch.
    let error = 0;
    for (let k = firstFrame; k < switchFrame; k++) error = Math.max(error, Math.abs(output[k] - at(previewB, k - firstFrame)));
    expect(error).toBeLessThan(1e-6 * peak);
    expect(worstExcessJump(output, previewB, previewC, firstFrame, switchFrame - 480, switchFrame + fadeFrames + 480, fadeFrames)).toBeLessThanOrEqual(MINUS_60_DB * peak);
    for (let k = switchFrame + fadeFrames; k < output.length; k++) error = Math.max(error, Math.abs(output[k] - at(previewC, k - firstFrame)));
    expect(error).toBeLessThan(1e-6 * peak);
  }, 60_000);

  it('a voice built from part of a preview, about to run out (its synthesis stopped by a newer table), falls back to the latest complete preview at the same place', async () => {
    const quarter = Math.round(0.25 * RATE_HZ);
    const steps: Step[] = [
      { atS: 0, call: 'play', sound: { sequence: 2, preview: 'b', readySamples: quarter } },
      // An older but complete preview: not played (older), kept as the one to fall back to.
      { atS: 0.05, call: 'follow', sound: { sequence: 1, preview: 'a' } },
      // 0.16 s: a newer preview with 0.1 s ready, not enough; the playing voice holds only 0.25 s.
      { atS: 0.16, call: 'follow', sound: { sequence: 3, preview: 'c', readySamples: 4800 } },
    ];
    const { output, events } = await renderInChromium(steps, 0.8);
    expect(events.map((event) => [event.kind, event.sequence])).toEqual([
      ['start', 2],
      ['fallback', 1],
    ]);
    const firstFrame = Math.round(events[0].atS * RATE_HZ);
    const switchFrame = Math.round(events[1].atS * RATE_HZ);
    const fadeFrames = Math.round(CROSSFADE_S * RATE_HZ);
    // The fade is over before the partial voice's samples end.
    expect(switchFrame + fadeFrames - firstFrame).toBeLessThan(quarter);
    const peak = Math.max(...previewA.map(Math.abs), ...previewB.map(Math.abs));
    expect(worstExcessJump(output, previewB, previewA, firstFrame, switchFrame - 480, switchFrame + fadeFrames + 480, fadeFrames)).toBeLessThanOrEqual(MINUS_60_DB * peak);
    // After it, preview A at the loop's place: sound, not the silence past the partial voice's end.
    let error = 0;
    for (let k = switchFrame + fadeFrames; k < output.length; k++) error = Math.max(error, Math.abs(output[k] - at(previewA, k - firstFrame)));
    expect(error).toBeLessThan(1e-6 * peak);
  }, 60_000);
});
