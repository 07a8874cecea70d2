import type * as ToneModule from 'tone';

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

interface Output {
  tone: typeof ToneModule;
  volume: ToneModule.Volume;
  player: ToneModule.Player | null;
}

let output: Promise<Output> | null = null;

async function ensureOutput(): Promise<Output> {
  output ??= (async () => {
    const tone = await import('tone');
    await tone.start();
    const limiter = new tone.Limiter(LIMITER_THRESHOLD_DB).toDestination();
    const volume = new tone.Volume(storedMasterVolumeDb()).connect(limiter);
    return { tone, volume, player: null };
  })();
  return output;
}

export async function setMasterVolumeDb(decibels: number): Promise<void> {
  localStorage.setItem(VOLUME_KEY, String(decibels));
  if (output) (await output).volume.volume.value = decibels;
}

/** Plays a WAV from the server through the master volume and limiter; stops whatever was playing. */
export async function playUrl(url: string, loop = false): Promise<{ durationS: number }> {
  const out = await ensureOutput();
  out.player?.stop();
  out.player?.dispose();
  const buffer = await out.tone.ToneAudioBuffer.fromUrl(url);
  const player = new out.tone.Player(buffer).connect(out.volume);
  player.loop = loop;
  out.player = player;
  player.start();
  return { durationS: buffer.duration };
}

/**
 * Plays samples computed at `sampleRateHz` (the server's preview) through the master volume and
 * limiter. The buffer is built at that rate, so it plays at the right pitch and length whatever
 * the audio context's own rate is.
 */
export async function playSamples(samples: Float32Array, sampleRateHz: number, loop = false): Promise<{ durationS: number; contextState: string; bufferSampleRateHz: number; bufferLength: number }> {
  const out = await ensureOutput();
  out.player?.stop();
  out.player?.dispose();
  const raw = out.tone.getContext().rawContext.createBuffer(1, samples.length, sampleRateHz);
  raw.copyToChannel(samples as Float32Array<ArrayBuffer>, 0);
  const buffer = new out.tone.ToneAudioBuffer(raw as AudioBuffer);
  const player = new out.tone.Player(buffer).connect(out.volume);
  player.loop = loop;
  out.player = player;
  player.start();
  return { durationS: buffer.duration, contextState: out.tone.getContext().state, bufferSampleRateHz: raw.sampleRate, bufferLength: raw.length };
}

export async function stopPlayback(): Promise<void> {
  if (!output) return;
  const out = await output;
  out.player?.stop();
}
