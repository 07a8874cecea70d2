import { fundamentalFrequencyHz } from '../../../shared/engine/mode-frequencies';
import { previewBankFromWire, renderBankChunk } from '../../../shared/engine/table-synthesis';
import type { Patch } from '../../../shared/patch/patch-schema';
import { decodeModeTable } from '../../../shared/protocol/mode-table-wire';
import { renderNote, type RenderedNote } from './note-render';
import { analysePreview, waveformColumns, type PreviewAnalysis, type WaveformColumns } from './preview-analysis';
import type { SynthesisKernel, SynthesisKernelKind } from './synthesis-kernel';

/** The first stretch of a preview, synthesised and sent on its own so audition can start. */
export const FIRST_CHUNK_S = 0.25;
/** Each later stretch: long enough to keep the per-message cost small, short enough that a newer table waits little. */
export const LATER_CHUNK_S = 0.5;

/** One stretch of a preview as the engine hands it out: peak-normalised float32 samples. */
export interface PreviewChunk {
  /** The caller's id of the table it comes from. */
  job: number;
  /** The table's sequence (set by the server). */
  sequence: number;
  sampleRateHz: number;
  totalSamples: number;
  startSample: number;
  /** Samples [startSample, startSample + samples.length), normalised by the gain of the first chunk's peak. */
  samples: Float32Array;
  /** True on the last chunk of the preview. */
  complete: boolean;
  /**
   * Set on the last chunk when a later stretch was louder than the first: it then holds the whole
   * preview (startSample 0) normalised again to the overall peak, replacing what came before.
   */
  renormalised: boolean;
  /** The largest |sample| so far before normalisation, in the pickup's physical unit. */
  physicalPeak: number;
  kernel: SynthesisKernelKind;
}

/** A table the engine could not read: the reason names what is wrong. */
export class TableRefused extends Error {}

/** Lets other work (a newer table's message) run: a macrotask by default. */
export type YieldToEvents = () => Promise<void>;
const nextMacrotask: YieldToEvents = () => new Promise((resolve) => setTimeout(resolve, 0));

interface CompletePreview {
  job: number;
  samples: Float32Array;
  sampleRateHz: number;
  f0Hz: number;
}

/**
 * The synthesis worker's logic, free of any worker global so it runs under test in Node with the
 * same kernel: each mode table becomes a progressive preview (the first FIRST_CHUNK_S at once,
 * then chunks of LATER_CHUNK_S, yielding between them), a newer table stops an older one's work
 * at its next chunk, notes are rendered with the same kernel, and the finished preview is analysed
 * for the charts.
 *
 * Samples are normalised by the peak of the first chunk (a plucked or struck string is loudest at
 * the start, so the gain is known when audition starts). If a later chunk turns out louder, the
 * last message re-normalises the whole buffer to the overall peak, so the finished preview is
 * always peak-normalised exactly as a one-piece render would be.
 */
export class SynthesisEngine {
  /** Bumped by every table; work for an older token stops at its next chunk. */
  private token = 0;
  private latestJob: number | null = null;
  private completed: CompletePreview | null = null;

  constructor(
    private readonly kernel: Promise<SynthesisKernel> | SynthesisKernel,
    private readonly yieldToEvents: YieldToEvents = nextMacrotask,
  ) {}

  /** The kernel in use (once loaded). */
  async kernelInUse(): Promise<SynthesisKernel> {
    return this.kernel;
  }

  /**
   * The preview of an encoded mode table, chunk by chunk. Calling this cancels every earlier
   * table's stream at once: an older stream yields nothing more once a newer table has come.
   * Throws TableRefused (from the iteration) when the bytes are not a valid table.
   */
  onTable(bytes: Uint8Array, job: number): AsyncGenerator<PreviewChunk, void, undefined> {
    const token = ++this.token;
    this.latestJob = job;
    return this.stream(bytes, job, token);
  }

  private async *stream(bytes: Uint8Array, job: number, token: number): AsyncGenerator<PreviewChunk, void, undefined> {
    const kernel = await this.kernel;
    // A newer table already waiting (a burst of edits) cancels this one before any work is done.
    await this.yieldToEvents();
    if (token !== this.token) return;
    const decoded = decodeModeTable(bytes);
    if (!decoded.ok) throw new TableRefused(decoded.reason);
    const wire = decoded.table;
    const bank = previewBankFromWire(wire);
    const total = bank.sampleCount;
    const sampleRateHz = wire.preview.sampleRateHz;
    const physical = new Float64Array(total);
    const firstLength = Math.min(total, Math.round(FIRST_CHUNK_S * sampleRateHz));
    const laterLength = Math.max(1, Math.round(LATER_CHUNK_S * sampleRateHz));
    let start = 0;
    let firstPeak = 0;
    let peak = 0;
    let gain = 0;
    for (;;) {
      const length = start === 0 ? firstLength : Math.min(laterLength, total - start);
      const chunk = renderBankChunk(bank, start, length, kernel.render);
      physical.set(chunk, start);
      let chunkPeak = 0;
      for (let i = 0; i < chunk.length; i++) chunkPeak = Math.max(chunkPeak, Math.abs(chunk[i]));
      if (start === 0) {
        firstPeak = chunkPeak;
        gain = firstPeak > 0 ? 1 / firstPeak : 0;
      }
      peak = Math.max(peak, chunkPeak);
      const end = start + chunk.length;
      const complete = end >= total || chunk.length === 0;
      const renormalised = complete && peak > firstPeak;
      if (renormalised) gain = 1 / peak;
      const from = renormalised ? 0 : start;
      const samples = normalised(physical, from, end, gain);
      if (complete) {
        this.completed = { job, samples: renormalised ? samples.slice() : normalised(physical, 0, total, gain), sampleRateHz, f0Hz: fundamentalFrequencyHz(wire.string) };
      }
      yield { job, sequence: wire.sequence, sampleRateHz, totalSamples: total, startSample: from, samples, complete, renormalised, physicalPeak: peak, kernel: kernel.kind };
      if (complete) return;
      start = end;
      await this.yieldToEvents();
      if (token !== this.token) return;
    }
  }

  /** True while `job` is the newest table's (no newer table has come since). */
  isLatest(job: number): boolean {
    return this.latestJob === job;
  }

  /** The charts' data of the finished preview of `job` (null when that preview is not the last one finished). */
  analysis(job: number, columns: number | null): PreviewAnalysis | null {
    const done = this.completed;
    if (!done || done.job !== job) return null;
    return analysePreview(done.samples, done.sampleRateHz, done.f0Hz, columns);
  }

  /** The waveform's columns of the finished preview of `job` for a plot `columns` wide (null when it is not the last one finished). */
  waveform(job: number, columns: number): WaveformColumns | null {
    const done = this.completed;
    if (!done || done.job !== job || !(columns > 0)) return null;
    return waveformColumns(done.samples, done.sampleRateHz, done.f0Hz, Math.floor(columns));
  }

  /** A note: the patch retuned to `midiNote` by tension, rendered with this engine's kernel and peak-normalised as the keys play it. */
  async note(patch: Patch, midiNote: number): Promise<RenderedNote> {
    const kernel = await this.kernel;
    return renderNote(patch, midiNote, kernel.render);
  }
}

/** physical[from, end) × gain as float32. */
function normalised(physical: Float64Array, from: number, end: number, gain: number): Float32Array {
  const out = new Float32Array(end - from);
  for (let i = from; i < end; i++) out[i - from] = physical[i] * gain;
  return out;
}
