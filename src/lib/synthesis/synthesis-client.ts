import type { Patch } from '../../../shared/patch/patch-schema';
import { encodeModeTable } from '../../../shared/protocol/mode-table-wire';
import type { ComputeResult } from '../live-session/session-connection';
import type { RenderedNote } from './note-render';
import type { PreviewSound } from './preview-sound';
import type { SynthesisPort, SynthesisReply, SynthesisRequest } from './synthesis-messages';

/** A started synthesis worker, as the client uses it. */
export interface SynthesisWorker extends SynthesisPort<SynthesisReply, SynthesisRequest> {
  terminate(): void;
}

/** Runs `work` once per display frame where there are frames, at once elsewhere (Node tests). */
type FrameScheduler = (work: () => void) => void;
const nextFrame: FrameScheduler = (work) => (typeof requestAnimationFrame === 'function' ? requestAnimationFrame(() => work()) : work());

/**
 * The page's side of synthesis: hands each mode table to the worker (started on first use),
 * assembles the preview from its chunks into snapshots (`getSnapshot`, `subscribe`, for
 * useSyncExternalStore), and asks it for notes and waveform widths. Only the latest table counts:
 * chunks of any older table are dropped on arrival, so a stale table's output never replaces a
 * newer one's, whatever order results arrive in. The page copies whole chunks into place and does
 * no per-sample work.
 */
export class SynthesisClient {
  private worker: SynthesisWorker | null = null;
  /** The id of the latest table handed over (the worker echoes it). */
  private job = 0;
  private sound: PreviewSound | null = null;
  /** The table whose chunks `sound` is assembled from. */
  private soundJob = 0;
  private columns: number | null = null;
  private noteId = 0;
  private readonly notes = new Map<number, (note: RenderedNote) => void>();
  private readonly listeners = new Set<() => void>();
  private frameQueued = false;
  /** Refusals the worker reported (a table it could not read), newest last, for the log. */
  readonly refusals: string[] = [];
  kernelFallback: string | null = null;

  constructor(
    private readonly startWorker: () => SynthesisWorker,
    private readonly frame: FrameScheduler = nextFrame,
  ) {}

  readonly subscribe = (listener: () => void): (() => void) => {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  };

  readonly getSnapshot = (): PreviewSound | null => this.sound;

  /** Synthesises the preview of a table; any older table's work stops and its output is ignored. */
  submit(result: ComputeResult): void {
    const bytes = encodeModeTable(result.wire);
    const job = ++this.job;
    this.post({ type: 'table', job, bytes, columns: this.columns }, [bytes.buffer]);
  }

  /** The waveform for a plot `columns` wide: asked of the worker when the finished preview has another width. */
  requestWaveform(columns: number): void {
    const wanted = Math.max(1, Math.floor(columns));
    this.columns = wanted;
    const sound = this.sound;
    if (!sound?.analysis || sound.analysis.waveform?.columns === wanted) return;
    this.post({ type: 'waveform', job: this.job, columns: wanted }, []);
  }

  /** A note at `midiNote`, rendered by the worker from the patch. */
  renderNote(patch: Patch, midiNote: number): Promise<RenderedNote> {
    const id = ++this.noteId;
    return new Promise((resolve) => {
      this.notes.set(id, resolve);
      this.post({ type: 'note', id, patch, midiNote }, []);
    });
  }

  /** Stops the worker; pending notes resolve with an error. A later request starts a new worker. */
  terminate(): void {
    this.worker?.terminate();
    this.worker = null;
    this.sound = null;
    for (const resolve of this.notes.values()) resolve({ error: 'the page closed before the note was ready' });
    this.notes.clear();
  }

  private post(request: SynthesisRequest, transfer: Transferable[]): void {
    if (!this.worker) {
      this.worker = this.startWorker();
      this.worker.onmessage = (event) => this.receive(event.data);
    }
    this.worker.postMessage(request, transfer);
  }

  private receive(reply: SynthesisReply): void {
    switch (reply.type) {
      case 'chunk': {
        if (reply.job !== this.job) return;
        const current = this.sound;
        const continuing = current !== null && this.soundJob === reply.job && !reply.renormalised && reply.startSample > 0;
        let samples: Float32Array;
        if (reply.renormalised) samples = reply.samples;
        else if (continuing) samples = current.samples;
        else samples = new Float32Array(reply.totalSamples);
        if (!reply.renormalised) samples.set(reply.samples, reply.startSample);
        const first = this.soundJob !== reply.job;
        this.soundJob = reply.job;
        this.sound = {
          sequence: reply.sequence,
          sampleRateHz: reply.sampleRateHz,
          samples,
          readySamples: reply.startSample + reply.samples.length,
          complete: reply.complete,
          physicalPeak: reply.physicalPeak,
          kernel: reply.kernel,
          analysis: null,
        };
        // The first chunk (audition can start) and the last are announced at once; the ones between once per frame.
        if (first || reply.complete) this.notify();
        else this.notifyNextFrame();
        return;
      }
      case 'analysis':
        if (reply.job !== this.job || !this.sound?.complete) return;
        this.sound = { ...this.sound, analysis: reply.analysis };
        return this.notify();
      case 'waveform':
        if (reply.job !== this.job || !this.sound?.analysis) return;
        this.sound = { ...this.sound, analysis: { ...this.sound.analysis, waveform: reply.waveform } };
        return this.notify();
      case 'note':
      case 'note-refused': {
        const resolve = this.notes.get(reply.id);
        this.notes.delete(reply.id);
        resolve?.(reply.type === 'note' ? { samples: reply.samples, sampleRateHz: reply.sampleRateHz } : { error: reply.error });
        return;
      }
      case 'refused':
        this.refusals.push(reply.reason);
        console.warn(`Tautline: the synthesis worker refused a mode table: ${reply.reason}`);
        return;
      case 'kernel':
        this.kernelFallback = reply.fallbackReason;
        if (reply.fallbackReason) console.warn(`Tautline: synthesising with the TypeScript kernel: ${reply.fallbackReason}`);
        return;
    }
  }

  private notify(): void {
    for (const listener of this.listeners) listener();
  }

  private notifyNextFrame(): void {
    if (this.frameQueued) return;
    this.frameQueued = true;
    this.frame(() => {
      this.frameQueued = false;
      this.notify();
    });
  }
}
