import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { samplePeak } from '../../shared/audio/peak';
import { frequencyHzToMidi } from '../../shared/designer/pitch';
import { fundamentalFrequencyHz } from '../../shared/engine/mode-frequencies';
import { livePreviewPatch } from '../../shared/engine/mode-table-message';
import { renderPatch } from '../../shared/engine/render-patch';
import { LIMITS } from '../../shared/limits';
import type { Patch } from '../../shared/patch/patch-schema';
import { renderNote } from '../../src/lib/synthesis/note-render';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../server/seed/demo-seed';
import { startE2eHarness, type E2eHarness } from '../support/e2e-harness';
import { openSessionFromList, screenshotsForReview } from '../support/e2e-demo-pages';
import { peakRelativeDifference } from '../support/signal-difference';

/**
 * Synthesis in the real browser: the session page's worker turns the mode table into the preview
 * with the WebAssembly kernel, first 250 ms first, and its samples equal the server-side render of
 * the session's patch. The test reads the worker's own messages: an init script wraps the page's
 * Worker constructor and listens to the synthesis worker beside the app (the app has no test hook
 * for this). Long tasks on the main thread are left to the benchmark (see the report in docs).
 */

const SESSION = 'Lighthouse stair climb';

let harness: E2eHarness;

beforeAll(async () => {
  harness = await startE2eHarness();
}, 180_000);

afterAll(() => harness?.close());

/** Listens to every message of the synthesis worker and assembles each table's preview as the app does. */
const TAP_SCRIPT = `(() => {
  const tap = { kernel: null, previews: {}, order: [], notes: [] };
  window.__synthesisTap = tap;
  const Native = window.Worker;
  window.Worker = class extends Native {
    constructor(url, options) {
      super(url, options);
      if (!options || options.name !== 'tautline-synthesis') return;
      this.addEventListener('message', (event) => {
        const m = event.data;
        const atMs = performance.now();
        if (m.type === 'kernel') tap.kernel = { kind: m.kind, fallbackReason: m.fallbackReason };
        if (m.type === 'note') tap.notes.push({ sampleRateHz: m.sampleRateHz, kernel: m.kernel, samples: m.samples.slice() });
        if (m.type !== 'chunk') return;
        tap.order.push({ job: m.job, startSample: m.startSample, length: m.samples.length, complete: m.complete, atMs });
        let p = tap.previews[m.job];
        if (!p) p = tap.previews[m.job] = { sequence: m.sequence, sampleRateHz: m.sampleRateHz, samples: new Float32Array(m.totalSamples), firstReady: m.samples.length, firstAtMs: atMs, complete: false, kernel: m.kernel };
        if (m.renormalised) p.samples = m.samples.slice();
        else p.samples.set(m.samples, m.startSample);
        if (m.complete) { p.complete = true; p.completeAtMs = atMs; }
      });
    }
  };
})();`;

interface TapView {
  kernel: { kind: string; fallbackReason: string | null } | null;
  order: Array<{ job: number; startSample: number; length: number; complete: boolean; atMs: number }>;
  previews: Record<string, { sequence: number; sampleRateHz: number; firstReady: number; firstAtMs: number; completeAtMs?: number; complete: boolean; kernel: string; total: number }>;
  notes: number;
}

const tapView = (page: Page) =>
  page.evaluate(`(() => {
    const tap = window.__synthesisTap;
    const previews = {};
    for (const [job, p] of Object.entries(tap.previews)) previews[job] = { sequence: p.sequence, sampleRateHz: p.sampleRateHz, firstReady: p.firstReady, firstAtMs: p.firstAtMs, completeAtMs: p.completeAtMs, complete: p.complete, kernel: p.kernel, total: p.samples.length };
    return { kernel: tap.kernel, order: tap.order.slice(), previews, notes: tap.notes.length };
  })()`) as Promise<TapView>;

/** Float32 samples out of the page, as base64 of their bytes (compact through the protocol). */
async function samplesOut(page: Page, expression: string): Promise<Float32Array> {
  const base64 = (await page.evaluate(`(() => {
    const samples = ${expression};
    const bytes = new Uint8Array(samples.buffer, samples.byteOffset, samples.byteLength);
    let text = '';
    for (let i = 0; i < bytes.length; i += 0x8000) text += String.fromCharCode.apply(null, bytes.subarray(i, i + 0x8000));
    return btoa(text);
  })()`)) as string;
  const bytes = Buffer.from(base64, 'base64');
  return new Float32Array(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength));
}

describe('synthesis in the browser', () => {
  it('renders the session’s table in the page’s worker with the WebAssembly kernel, first 250 ms first, equal to the server’s render within 1e-6 of peak; notes too', async () => {
    const page = await harness.newPage({ height: 900 });
    await page.addInitScript(TAP_SCRIPT);
    // The hearing caution is answered on this device already, so a key plays at once.
    await page.addInitScript(`localStorage.setItem('tautline-audio-caution-seen', 'yes');`);
    const account = DEMO_ACCOUNTS.find((candidate) => candidate.role === 'designer')!;
    await harness.signIn(page, account.email, DEMO_PASSWORD);
    await page.getByRole('link', { name: SESSION }).waitFor();
    const sessionId = await openSessionFromList(page, SESSION);

    await expect.poll(async () => Object.values((await tapView(page)).previews).some((preview) => preview.complete), { timeout: 20_000 }).toBe(true);
    const view = await tapView(page);
    expect(view.kernel).toEqual({ kind: 'wasm', fallbackReason: null });
    const [job, preview] = Object.entries(view.previews).find(([, candidate]) => candidate.complete)!;
    expect(preview.kernel).toBe('wasm');
    // The first message of the table is its first 250 ms (or all of it, if shorter), and it came first.
    const chunks = view.order.filter((chunk) => chunk.job === Number(job));
    expect(chunks[0].startSample).toBe(0);
    expect(preview.firstReady).toBe(Math.min(preview.total, Math.round(0.25 * preview.sampleRateHz)));
    expect(chunks.every((chunk, k) => k === 0 || chunk.atMs >= chunks[0].atMs)).toBe(true);
    expect(chunks.at(-1)?.complete).toBe(true);
    expect(chunks.length).toBeGreaterThan(1);

    // The server's render of the same patch, fetched through the API and rendered here with shared/engine.
    const patch = (await (await page.request.get(`/api/sessions/${sessionId}`)).json()).session.patch as Patch;
    const previewPatch = livePreviewPatch(patch, LIMITS.livePreviewMaxDurationS);
    expect(preview.sampleRateHz).toBe(previewPatch.render.sampleRateHz);
    const rendered = renderPatch(previewPatch);
    const peak = samplePeak(rendered);
    const samples = await samplesOut(page, `window.__synthesisTap.previews[${job}].samples`);
    expect(samples.length).toBe(rendered.length);
    expect(peakRelativeDifference(rendered.map((value) => value / peak), samples)).toBeLessThan(1e-6);

    // The charts draw what the worker computed: the spectrum, and the waveform at the plot's own width (asked of the worker).
    await page.getByRole('tab', { name: 'Spectrum' }).click();
    await page.locator('[data-spectrum-curve]').waitFor();
    await page.getByRole('tab', { name: 'Waveform' }).click();
    const waveformColumns = () =>
      page.evaluate(`(() => {
        const path = document.querySelector('[data-waveform]');
        const svg = path && path.closest('svg');
        if (!path || !svg) return null;
        return { points: (path.getAttribute('d') || '').split(/[ML]/).length - 1, plotColumns: Math.round(Number(svg.getAttribute('width')) - 52 - 50) };
      })()`) as Promise<{ points: number; plotColumns: number } | null>;
    await expect.poll(async () => { const seen = await waveformColumns(); return seen !== null && seen.points === 2 * seen.plotColumns; }, { timeout: 10_000 }).toBe(true);
    await screenshotsForReview(page, 'browser-synthesis-waveform');
    // The resized plot asks the worker again.
    await expect.poll(async () => { const seen = await waveformColumns(); return seen !== null && seen.points === 2 * seen.plotColumns; }, { timeout: 10_000 }).toBe(true);

    // A note from the keys: rendered by the same worker and kernel, equal to the engine's note in Node.
    await page.getByRole('tab', { name: 'Notes' }).click();
    const root = Math.round(frequencyHzToMidi(fundamentalFrequencyHz(patch.string)));
    await page.locator('button[title$="the string\'s own pitch"]').click();
    await expect.poll(async () => (await tapView(page)).notes, { timeout: 10_000 }).toBe(1);
    const expected = renderNote(patch, root);
    if ('error' in expected) throw new Error(expected.error);
    const note = await samplesOut(page, 'window.__synthesisTap.notes[0].samples');
    expect(await page.evaluate('window.__synthesisTap.notes[0].kernel')).toBe('wasm');
    expect(note.length).toBe(expected.samples.length);
    expect(peakRelativeDifference(expected.samples, note)).toBeLessThan(1e-6);
    await page.getByTestId('note-played').waitFor();
    expect(await page.getByTestId('note-played').textContent()).toMatch(/^Played /);
    await page.context().close();
  });
});
