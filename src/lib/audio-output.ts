import type * as ToneModule from 'tone';
import { LoopCrossfade, type LoopEvent, type LoopSound } from './audio/loop-crossfade';

/**
 * The one audio output of the app: every sound goes through a master volume and a limiter before
 * the speakers (loud audio can hurt hearing and equipment). Tone.js loads on the first play only.
 */
const VOLUME_KEY = 'tautline-master-volume-db';
const CAUTION_KEY = 'tautline-audio-caution-seen';

/** Master volume range and default, dB. */
export const MASTER_VOLUME_DB = { min: -48, max: 0, initial: -18 } as const;
/** The limiter's ceiling, dB. */
export const LIMITER_THRESHOLD_DB = -3;

export function storedMasterVolumeDb(): number {
  const stored = Number(localStorage.getItem(VOLUME_KEY));
  return Number.isFinite(stored) && localStorage.getItem(VOLUME_KEY) !== null ? Math.min(MASTER_VOLUME_DB.max, Math.max(MASTER_VOLUME_DB.min, stored)) : MASTER_VOLUME_DB.initial;
}

export function cautionSeen(): boolean {
  return localStorage.getItem(CAUTION_KEY) === 'yes';
}

export function markCautionSeen(): void {
  localStorage.setItem(CAUTION_KEY, 'yes');
}

/** Someone who watches the preview loop (the test probe): told of its output once, then of each event. */
export interface LoopObserver {
  attachOutput(context: BaseAudioContext, output: AudioNode): void;
  loopEvent(event: LoopEvent, samples?: Float32Array): void;
}

interface Output {
  tone: typeof ToneModule;
  volume: ToneModule.Volume;
  /** Server WAVs (presets, renders, the A/B side). */
  player: ToneModule.Player | null;
  /** Previews and notes: voices crossfaded under the master volume (src/lib/audio/loop-crossfade.ts). */
  loop: LoopCrossfade;
  /** True while the loop plays the session's preview (it then follows newer previews). */
  followingPreview: boolean;
}

let output: Promise<Output> | null = null;
let observer: LoopObserver | null = null;

const endedListeners = new Set<() => void>();

/** Calls `listener` whenever a sound played once (a preview or a note) has played to its end; returns the unsubscribe. */
export function onSamplesEnded(listener: () => void): () => void {
  endedListeners.add(listener);
  return () => endedListeners.delete(listener);
}

/** Sets the one observer of the preview loop (before the first play). */
export function observeLoop(watcher: LoopObserver): void {
  observer = watcher;
}

async function ensureOutput(): Promise<Output> {
  output ??= (async () => {
    const tone = await import('tone');
    await tone.start();
    const limiter = new tone.Limiter(LIMITER_THRESHOLD_DB).toDestination();
    const volume = new tone.Volume(storedMasterVolumeDb()).connect(limiter);
    // Tone's raw context implements BaseAudioContext (standardized-audio-context): the loop's nodes join Tone's chain directly.
    const context = tone.getContext().rawContext as unknown as BaseAudioContext;
    const loop = new LoopCrossfade(context, { onEvent: (event, samples) => {
        observer?.loopEvent(event, samples);
        if (event.kind === 'ended') for (const listener of endedListeners) listener();
      }, });
    tone.connect(loop.output as unknown as Parameters<typeof tone.connect>[0], volume);
    observer?.attachOutput(context, loop.output);
    return { tone, volume, player: null, loop, followingPreview: false };
  })();
  return output;
}

export async function setMasterVolumeDb(decibels: number): Promise<void> {
  localStorage.setItem(VOLUME_KEY, String(decibels));
  if (output) (await output).volume.volume.value = decibels;
}

function stopPlayer(out: Output): void {
  out.player?.stop();
  out.player?.dispose();
  out.player = null;
}

/** Plays a WAV from the server through the master volume and limiter; stops whatever was playing. */
export async function playUrl(url: string, loop = false): Promise<{ durationS: number }> {
  const out = await ensureOutput();
  stopPlayer(out);
  out.loop.stop();
  out.followingPreview = false;
  const buffer = await out.tone.ToneAudioBuffer.fromUrl(url);
  const player = new out.tone.Player(buffer).connect(out.volume);
  player.loop = loop;
  out.player = player;
  player.start();
  return { durationS: buffer.duration };
}

/** What a play of samples reports: the buffer's length and rate as played, and the audio context's state. */
export interface SamplesPlayed {
  durationS: number;
  contextState: string;
  bufferSampleRateHz: number;
  bufferLength: number;
}

async function playSound(sound: LoopSound, loop: boolean, following: boolean): Promise<SamplesPlayed> {
  const out = await ensureOutput();
  stopPlayer(out);
  out.loop.play(sound, loop);
  out.followingPreview = following;
  return { durationS: sound.samples.length / sound.sampleRateHz, contextState: out.tone.getContext().state, bufferSampleRateHz: sound.sampleRateHz, bufferLength: sound.samples.length };
}

/**
 * Plays samples computed at `sampleRateHz` (a note) through the master volume and limiter, once
 * or looped; stops whatever was playing. The buffer is built at that rate, so it plays at the right
 * pitch and length whatever the audio context's own rate is.
 */
export function playSamples(samples: Float32Array, sampleRateHz: number, loop = false): Promise<SamplesPlayed> {
  return playSound({ sequence: 0, sampleRateHz, samples, readySamples: samples.length, complete: true }, loop, false);
}

/**
 * Plays the session's preview (as soon as its first part is ready) and keeps following it: more
 * of a progressive preview, and, looped, each newer preview, crossfaded in at the same place.
 */
export function playPreview(sound: LoopSound, loop: boolean): Promise<SamplesPlayed> {
  return playSound(sound, loop, true);
}

/** A newer preview, or more of the playing one: followed if the preview is what plays. */
export async function followPreview(sound: LoopSound): Promise<void> {
  if (!output) return;
  const out = await output;
  if (!out.followingPreview) return;
  out.loop.follow(sound);
}

/** Looping on or off for the preview that plays. */
export async function setPreviewLoop(loop: boolean): Promise<void> {
  if (!output) return;
  const out = await output;
  if (out.followingPreview) out.loop.setLoop(loop);
}

export async function stopPlayback(): Promise<void> {
  if (!output) return;
  const out = await output;
  out.player?.stop();
  out.loop.stop();
  out.followingPreview = false;
}
