import { readFileSync } from 'node:fs';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { samplePeak } from '../../../shared/audio/peak';
import { livePreviewPatch, modeTableMessage } from '../../../shared/engine/mode-table-message';
import { renderPatch } from '../../../shared/engine/render-patch';
import { LIMITS } from '../../../shared/limits';
import type { Patch, PatchInput } from '../../../shared/patch/patch-schema';
import { encodeModeTable } from '../../../shared/protocol/mode-table-wire';
import { MODE_KERNEL_WASM } from '../../../server/engine-wasm/wasm-bank-renderer';
import { computeResultFromTable, type ComputeResult } from '../../../src/lib/live-session/session-connection';
import { magnitudeSpectrum } from '../../../src/lib/synthesis/magnitude-spectrum';
import type { PreviewSound } from '../../../src/lib/synthesis/preview-sound';
import { SynthesisClient, type SynthesisWorker } from '../../../src/lib/synthesis/synthesis-client';
import { FIRST_CHUNK_S, SynthesisEngine } from '../../../src/lib/synthesis/synthesis-engine';
import { loadSynthesisKernel } from '../../../src/lib/synthesis/synthesis-kernel';
import type { SynthesisPort, SynthesisReply, SynthesisRequest } from '../../../src/lib/synthesis/synthesis-messages';
import { serveSynthesis } from '../../../src/lib/synthesis/synthesis-worker-host';
import { peakRelativeDifference } from '../../support/signal-difference';
import { pluckedAndStruck, testPatch, validPatch } from '../../support/patches';

const STIFF: Partial<PatchInput> = { string: { lengthM: 0.65, tensionN: 70, linearDensityKgPerM: 6e-4, inharmonicityB: 2e-4 }, render: { sampleRateHz: 48000, durationS: 1.3, maxModes: 400 } };

function resultOf(patch: Patch, sequence: number): ComputeResult {
  const bytes = encodeModeTable(modeTableMessage(patch, LIMITS.livePreviewMaxDurationS, { sequence, documentVersion: sequence, stateVector: new Uint8Array(0) }));
  const decoded = computeResultFromTable('session-1', bytes);
  if (!decoded.ok) throw new Error(decoded.reason);
  return decoded.result;
}

function serverPreview(patch: Patch): Float64Array {
  const rendered = renderPatch(livePreviewPatch(patch, LIMITS.livePreviewMaxDurationS));
  const peak = samplePeak(rendered);
  return rendered.map((value) => value / peak);
}

const closers: Array<() => void> = [];
afterEach(() => {
  while (closers.length) closers.pop()?.();
});

/** The worker's body served on a real MessageChannel (structured cloning and transfers as between threads), with the WebAssembly kernel. */
function channelWorker(): () => SynthesisWorker {
  const channel = new MessageChannel();
  const kernel = loadSynthesisKernel(new Uint8Array(readFileSync(MODE_KERNEL_WASM)));
  const yieldToEvents = () => new Promise<void>((resolve) => setTimeout(resolve, 0));
  serveSynthesis(channel.port1 as unknown as SynthesisPort<SynthesisRequest, SynthesisReply>, new SynthesisEngine(kernel, yieldToEvents), yieldToEvents);
  const close = () => {
    channel.port1.close();
    channel.port2.close();
  };
  closers.push(close);
  return () => Object.assign(channel.port2 as unknown as SynthesisPort<SynthesisReply, SynthesisRequest>, { terminate: close });
}

/** Every snapshot the client announces, in order. */
function recorder(client: SynthesisClient): PreviewSound[] {
  const seen: PreviewSound[] = [];
  client.subscribe(() => {
    const sound = client.getSnapshot();
    if (sound) seen.push({ ...sound, samples: sound.samples.slice() });
  });
  return seen;
}

async function until(condition: () => boolean, what: string, timeoutMs = 10_000): Promise<void> {
  const deadline = performance.now() + timeoutMs;
  while (!condition()) {
    if (performance.now() > deadline) throw new Error(`timed out waiting for ${what}`);
    await new Promise((resolve) => setTimeout(resolve, 2));
  }
}

describe('the page’s synthesis client, over a real message channel to the worker’s body', () => {
  it('announces the first 250 ms at once, then a growing preview, then the complete one equal to the server’s render, then the charts’ data', async () => {
    const client = new SynthesisClient(channelWorker());
    const seen = recorder(client);
    const patch = validPatch(testPatch({ ...STIFF, excitation: pluckedAndStruck() }));
    client.submit(resultOf(patch, 1));
    await until(() => Boolean(client.getSnapshot()?.analysis), 'the analysis');
    const first = seen[0];
    expect(first.complete).toBe(false);
    expect(first.readySamples).toBe(Math.round(FIRST_CHUNK_S * first.sampleRateHz));
    expect(first.samples.length).toBe(serverPreview(patch).length);
    expect(first.kernel).toBe('wasm');
    const readies = seen.map((sound) => sound.readySamples);
    expect(readies).toEqual([...readies].sort((a, b) => a - b));
    const done = client.getSnapshot() as PreviewSound;
    expect(done.complete).toBe(true);
    expect(done.sequence).toBe(1);
    expect(done.readySamples).toBe(done.samples.length);
    expect(peakRelativeDifference(serverPreview(patch), done.samples)).toBeLessThan(1e-6);
    // What was final in the first snapshot is unchanged in the last.
    expect(done.samples.subarray(0, first.readySamples)).toEqual(first.samples.subarray(0, first.readySamples));
    expect(done.analysis?.spectrum.levelDb).toEqual(magnitudeSpectrum(done.samples, done.sampleRateHz).levelDb);
    expect(done.analysis?.waveform).toBeNull();

    client.requestWaveform(400);
    await until(() => client.getSnapshot()?.analysis?.waveform?.columns === 400, 'the waveform at 400 columns');
    // The next table's analysis comes with the width last asked for.
    client.submit(resultOf(patch, 2));
    await until(() => client.getSnapshot()?.sequence === 2 && Boolean(client.getSnapshot()?.analysis), 'the second analysis');
    expect(client.getSnapshot()?.analysis?.waveform?.columns).toBe(400);
    client.terminate();
  });

  it('keeps only the latest table’s output: a burst of tables ends on the last one, and no older snapshot follows a newer one', async () => {
    const client = new SynthesisClient(channelWorker());
    const seen = recorder(client);
    const patches = [0.1, 0.2, 0.3, 0.4].map((positionM) => validPatch(testPatch({ ...STIFF, pickup: { positionM, output: 'displacement' } })));
    patches.forEach((patch, k) => client.submit(resultOf(patch, k + 1)));
    await until(() => client.getSnapshot()?.sequence === 4 && client.getSnapshot()?.complete === true, 'the last table’s preview');
    const sequences = seen.map((sound) => sound.sequence);
    expect(sequences).toEqual([...sequences].sort((a, b) => a - b));
    expect(peakRelativeDifference(serverPreview(patches[3]), (client.getSnapshot() as PreviewSound).samples)).toBeLessThan(1e-6);
    client.terminate();
  });

  it('drops a stale table’s chunks delivered out of order after a newer table’s (replies delivered by hand)', () => {
    let onmessage: ((event: MessageEvent<SynthesisReply>) => void) | null = null;
    const posted: SynthesisRequest[] = [];
    const client = new SynthesisClient(() => ({
      postMessage: (message) => posted.push(message),
      set onmessage(handler: ((event: MessageEvent<SynthesisReply>) => void) | null) {
        onmessage = handler;
      },
      get onmessage() {
        return onmessage;
      },
      terminate: () => undefined,
    }));
    const patch = validPatch(testPatch(STIFF));
    client.submit(resultOf(patch, 1));
    client.submit(resultOf(patch, 2));
    expect(posted.map((request) => request.type === 'table' && request.job)).toEqual([1, 2]);
    const deliver = (reply: SynthesisReply) => onmessage?.({ data: reply } as MessageEvent<SynthesisReply>);
    const chunk = (job: number, sequence: number, value: number) =>
      ({ type: 'chunk', job, sequence, sampleRateHz: 48000, totalSamples: 4, startSample: 0, samples: new Float32Array([value, value, value, value]), complete: true, renormalised: false, physicalPeak: 1, kernel: 'wasm' }) as const;
    deliver(chunk(2, 2, 0.5));
    deliver(chunk(1, 1, 0.25));
    const sound = client.getSnapshot();
    expect(sound?.sequence).toBe(2);
    expect(Array.from(sound?.samples ?? [])).toEqual([0.5, 0.5, 0.5, 0.5]);
    // A stale table's analysis is dropped too.
    deliver({ type: 'analysis', job: 1, analysis: { spectrum: magnitudeSpectrum(new Float32Array(16), 48000), envelope: { timeS: new Float32Array(0), levelDb: new Float32Array(0) }, waveform: null } });
    expect(client.getSnapshot()?.analysis).toBeNull();
  });

  it('logs the reason when the worker refuses a malformed table, and keeps the last good preview', async () => {
    const warn = vi.spyOn(console, 'warn').mockImplementation(() => undefined);
    try {
      const client = new SynthesisClient(channelWorker());
      const patch = validPatch(testPatch(STIFF));
      const good = resultOf(patch, 1);
      client.submit(good);
      await until(() => client.getSnapshot()?.complete === true, 'the good preview');
      client.submit({ ...good, sequence: 2, wire: { ...good.wire, sequence: 2, string: { ...good.wire.string, lengthM: Number.NaN } } });
      await until(() => client.refusals.length > 0, 'the refusal');
      expect(client.refusals[0]).toMatch(/string length must be a finite number/);
      expect(warn).toHaveBeenCalledWith(expect.stringMatching(/refused a mode table: string length/));
      expect(client.getSnapshot()?.sequence).toBe(1);
      client.terminate();
    } finally {
      warn.mockRestore();
    }
  });

  it('renders notes in the worker, equal to the engine’s note, and answers a note it cannot play with the reason', async () => {
    const client = new SynthesisClient(channelWorker());
    const patch = validPatch(testPatch(STIFF));
    const note = await client.renderNote(patch, 64);
    const direct = await new SynthesisEngine(await loadSynthesisKernel(new Uint8Array(readFileSync(MODE_KERNEL_WASM)))).note(patch, 64);
    if ('error' in note || 'error' in direct) throw new Error('note refused');
    expect(note.sampleRateHz).toBe(direct.sampleRateHz);
    expect(note.samples).toEqual(direct.samples);
    const refused = await client.renderNote(patch, 200);
    expect('error' in refused && refused.error).toMatch(/string\./);
    client.terminate();
  });
});
