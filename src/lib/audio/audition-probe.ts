import * as Y from 'yjs';
import type { SessionConnection } from '../live-session/session-connection';
import type { LoopEvent } from './loop-crossfade';
import { isPlayable } from './preview-playable';

/**
 * A read-only window onto live audition for the end-to-end tests and the browser benchmark. It
 * exists only when the page was opened with `window.__TAUTLINE_TEST_PROBE__ = true` set before the
 * app loaded (an init script); otherwise `auditionProbe` is null and nothing is recorded. It never
 * changes what the app does: it counts the loop's crossfades and gaps, listens to the summed voices
 * for silence, and stamps (performance.now(), ms) each local edit, each mode table that arrives and
 * each preview that becomes playable, so latencies can be matched edit by edit afterwards.
 */
export interface AuditionProbe {
  /** The loop's events, in order (start, crossfade, extend, fallback, stop, ended, gap). */
  loopEvents: LoopEvent[];
  counts: { starts: number; crossfades: number; extensions: number; fallbacks: number; stops: number; ended: number; gaps: number };
  /** For each voice started: its preview's sequence and a fingerprint of its ready samples. */
  voices: Array<{ sequence: number; readySamples: number; fingerprint: number }>;
  /** Analyser windows (about 43 ms each, polled every 40 ms while a preview plays) whose peak was below 1e-5: silence. */
  silentWindows: number;
  heardWindows: number;
  /** The audio context's state ('running', 'suspended', 'closed'), or null before the first play. */
  contextState: () => string | null;
  /** Local edits: this page's Yjs client and its clock after the edit. */
  edits: Array<{ atMs: number; clientId: number; clock: number }>;
  /** Mode tables as they reached the page, with the state vector they were computed for. */
  tables: Array<{ atMs: number; sequence: number; stateVector: Record<number, number> }>;
  /** When each preview first had its first 250 ms ready (or all of itself, if shorter), and when it was complete. */
  playable: Array<{ atMs: number; sequence: number; readySamples: number }>;
  completed: Array<{ atMs: number; sequence: number }>;
}

declare global {
  interface Window {
    __TAUTLINE_TEST_PROBE__?: boolean;
    __tautlineAudition?: AuditionProbe;
  }
}

/** Entries kept per list, so a long benchmark cannot grow the page without bound. */
const MAX_ENTRIES = 20_000;
const SILENCE_BELOW = 1e-5;
const POLL_MS = 40;

function push<T>(list: T[], entry: T): void {
  if (list.length < MAX_ENTRIES) list.push(entry);
}

class ProbeRecorder {
  readonly state: AuditionProbe;
  private context: BaseAudioContext | null = null;
  private analyser: AnalyserNode | null = null;
  private poll: ReturnType<typeof setInterval> | null = null;
  private seenPlayable = new Set<number>();
  private seenComplete = new Set<number>();

  constructor() {
    this.state = {
      loopEvents: [],
      counts: { starts: 0, crossfades: 0, extensions: 0, fallbacks: 0, stops: 0, ended: 0, gaps: 0 },
      voices: [],
      silentWindows: 0,
      heardWindows: 0,
      contextState: () => (this.context ? this.context.state : null),
      edits: [],
      tables: [],
      playable: [],
      completed: [],
    };
  }

  /** Taps the loop's summed voices (an analyser on a side branch: it changes nothing heard). */
  attachOutput(context: BaseAudioContext, output: AudioNode): void {
    this.context = context;
    this.analyser = context.createAnalyser();
    this.analyser.fftSize = 2048;
    output.connect(this.analyser);
  }

  loopEvent(event: LoopEvent, samples?: Float32Array): void {
    push(this.state.loopEvents, event);
    const counts = this.state.counts;
    if (event.kind === 'start') counts.starts++;
    else if (event.kind === 'crossfade') counts.crossfades++;
    else if (event.kind === 'extend') counts.extensions++;
    else if (event.kind === 'fallback') counts.fallbacks++;
    else if (event.kind === 'stop') counts.stops++;
    else if (event.kind === 'ended') counts.ended++;
    else counts.gaps++;
    if (samples && event.kind !== 'stop' && event.kind !== 'ended' && event.kind !== 'gap') {
      let fingerprint = 0;
      const ready = Math.min(samples.length, event.readySamples);
      for (let i = 0; i < ready; i += 7) fingerprint += Math.abs(samples[i]) * ((i % 13) + 1);
      push(this.state.voices, { sequence: event.sequence, readySamples: event.readySamples, fingerprint });
    }
    if (event.kind === 'start') this.listen(true);
    if (event.kind === 'stop' || event.kind === 'ended') this.listen(false);
  }

  private listen(on: boolean): void {
    if (!on) {
      if (this.poll !== null) clearInterval(this.poll);
      this.poll = null;
      return;
    }
    if (this.poll !== null || !this.analyser) return;
    const analyser = this.analyser;
    const window = new Float32Array(analyser.fftSize);
    // The first window may still hold the silence before the start: begin one window later.
    let skip = Math.ceil((analyser.fftSize / analyser.context.sampleRate) * 1000 / POLL_MS) + 1;
    this.poll = setInterval(() => {
      if (skip-- > 0) return;
      analyser.getFloatTimeDomainData(window);
      let peak = 0;
      for (let i = 0; i < window.length; i++) peak = Math.max(peak, Math.abs(window[i]));
      if (peak < SILENCE_BELOW) this.state.silentWindows++;
      else this.state.heardWindows++;
    }, POLL_MS);
  }

  /** Records this page's edits and the tables it receives, until the returned function is called. */
  watchSession(connection: SessionConnection): () => void {
    let lastResult = connection.getSnapshot().result;
    const onUpdate = (_update: Uint8Array, origin: unknown) => {
      if (origin !== connection.localOrigin && origin !== connection.undoManager) return;
      const doc = connection.doc;
      push(this.state.edits, { atMs: performance.now(), clientId: doc.clientID, clock: Y.getState(doc.store, doc.clientID) });
    };
    let doc = connection.doc;
    doc.on('update', onUpdate);
    const unsubscribe = connection.subscribe(() => {
      // The document is replaced after a refused edit or a change of rights: follow it.
      if (connection.doc !== doc) {
        doc.off('update', onUpdate);
        doc = connection.doc;
        doc.on('update', onUpdate);
      }
      const result = connection.getSnapshot().result;
      if (!result || result === lastResult) return;
      lastResult = result;
      const stateVector: Record<number, number> = {};
      for (const [client, clock] of Y.decodeStateVector(result.wire.stateVector)) stateVector[client] = clock;
      push(this.state.tables, { atMs: performance.now(), sequence: result.sequence, stateVector });
    });
    return () => {
      doc.off('update', onUpdate);
      unsubscribe();
    };
  }

  /** A preview as the audition sees it. */
  soundSeen(sound: { sequence: number; sampleRateHz: number; samples: Float32Array; readySamples: number; complete: boolean }): void {
    const atMs = performance.now();
    if (!this.seenPlayable.has(sound.sequence) && isPlayable(sound)) {
      this.seenPlayable.add(sound.sequence);
      push(this.state.playable, { atMs, sequence: sound.sequence, readySamples: sound.readySamples });
    }
    if (sound.complete && !this.seenComplete.has(sound.sequence)) {
      this.seenComplete.add(sound.sequence);
      push(this.state.completed, { atMs, sequence: sound.sequence });
    }
  }
}

function createProbe(): ProbeRecorder | null {
  if (typeof window === 'undefined' || window.__TAUTLINE_TEST_PROBE__ !== true) return null;
  const recorder = new ProbeRecorder();
  window.__tautlineAudition = recorder.state;
  return recorder;
}

/** The probe, or null when the page was not opened for a test. */
export const auditionProbe = createProbe();
