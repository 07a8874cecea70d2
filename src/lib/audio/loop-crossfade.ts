/**
 * Live audition of a preview that keeps changing: plays a preview (once or looped) and, as newer
 * previews arrive while a designer drags, crossfades each into the playing sound at the same place
 * in the loop, so the tone follows the drag without restarting and without a click.
 *
 * Design (Web Audio only, no Tone.js, so the same code runs on a realtime AudioContext and on an
 * OfflineAudioContext in the tests):
 * - Each sound plays as a *voice*: an AudioBufferSourceNode (the whole preview as one buffer,
 *   looped or not) through a GainNode of its own into one summing bus. A source's buffer data is
 *   acquired when it starts (Web Audio API, "acquire the content"), so a buffer is never refilled
 *   while it plays: when more of a progressive preview is ready, or a newer preview arrives, a new
 *   voice is built from the samples ready so far (the rest of its buffer is silence) and
 *   crossfaded in. A preview is synthesised far faster than it plays, so the ready part stays
 *   ahead of the playhead.
 * - A crossfade starts at a context frame at least `leadS` ahead of now, the new voice starting at
 *   the old one's loop position at that frame; the two gains ramp linearly (1 → 0 and 0 → 1) over
 *   `fadeS`, so their sum is 1 throughout. Linear rather than equal-power: successive previews of
 *   one drag are almost the same signal (correlated), for which equal-power gains would add a
 *   3 dB bump, and extending a voice with more of the same preview must change nothing at all.
 * - Play starts the new voice at full gain on its first sample (the preview's own onset) while
 *   whatever played fades out; stop fades out over the same length.
 * - One crossfade at a time: a sound that arrives while one runs waits (only the newest is kept)
 *   and follows when it ends, so every crossfade starts from one voice at full gain.
 * - A newer preview is taken once complete, or sooner when its ready part already covers the
 *   playhead for `newerAheadS` past the fade; otherwise it waits for more of itself. More of the
 *   playing preview is taken once complete or when the playhead comes within `extendWithinS` of the
 *   end of what the voice holds. While people edit fast, the synthesis of a preview is often
 *   stopped by a newer table before it completes: a voice built from part of a preview could then
 *   run into silence, so a partial newer preview is taken only with a long stretch ready, and a
 *   voice about to run out falls back to the latest complete preview (kind 'fallback').
 *   Looping off, the voice plays once and only more of the same preview is taken.
 */

/** A preview as the loop plays it: the first `readySamples` of `samples` are final. */
export interface LoopSound {
  /** Increases with each newer preview; a lower one than the playing sound's is ignored. */
  sequence: number;
  sampleRateHz: number;
  samples: Float32Array;
  readySamples: number;
  complete: boolean;
}

/** What the loop did, for whoever watches (the test probe). */
export interface LoopEvent {
  kind: 'start' | 'crossfade' | 'extend' | 'fallback' | 'stop' | 'ended' | 'gap';
  sequence: number;
  /** Context time the change begins, s. */
  atS: number;
  /** Length of its gain ramps, s (0 for ended and gap). */
  fadeS: number;
  /** Where in the sound the new voice starts, s. */
  offsetS: number;
  readySamples: number;
}

export interface LoopCrossfadeOptions {
  /** Length of a crossfade, s. */
  fadeS?: number;
  /** How far ahead of the context's current time a change is scheduled, s. */
  leadS?: number;
  /** How much ready sound past the fade a partial newer preview needs before it is taken, s. */
  newerAheadS?: number;
  /** More of the playing preview is taken when the playhead comes this close to the end of what the voice holds, s. */
  extendWithinS?: number;
  /** Told of every change; a voice's start brings the samples it was built from. */
  onEvent?: (event: LoopEvent, samples?: Float32Array) => void;
  /** Schedules a later check (default setTimeout); the tests' offline rendering never needs one. */
  setTimer?: (run: () => void, delayMs: number) => unknown;
}

/** Crossfade length, s: about one short buffer. */
export const CROSSFADE_S = 0.012;
/** Scheduling lead, s: comfortably more than one render quantum (128 frames) at any rate. */
export const SCHEDULE_LEAD_S = 0.008;
/** Ready sound a partial newer preview must have past the fade before it is taken, s. */
export const NEWER_AHEAD_S = 1;
/** More of the playing preview is taken this close to the end of what its voice holds, s. */
export const EXTEND_WITHIN_S = 0.1;
/** A source stops this long after its gain reached 0, s. */
const STOP_TAIL_S = 0.005;

interface Voice {
  source: AudioBufferSourceNode;
  gain: GainNode;
  sequence: number;
  readySamples: number;
  complete: boolean;
  sampleRateHz: number;
  /** Context time it starts, and where in its buffer, s. */
  startS: number;
  offsetS: number;
  durationS: number;
  loop: boolean;
  /** Context time its source is told to stop (null: plays on). */
  stopS: number | null;
  ended: boolean;
}

export class LoopCrossfade {
  /** The sum of every voice: connect it to the output chain. */
  readonly output: GainNode;
  readonly fadeS: number;
  readonly leadS: number;
  readonly newerAheadS: number;
  readonly extendWithinS: number;
  private voices: Voice[] = [];
  /** The voice at full gain once the last scheduled change is done. */
  private leader: Voice | null = null;
  /** Context time the last scheduled change is over. */
  private busyUntilS = 0;
  private pending: LoopSound | null = null;
  /** The newest complete sound seen: what a voice about to run out of samples falls back to. */
  private lastComplete: LoopSound | null = null;
  private timer: unknown = null;
  private looping = false;
  private readonly onEvent: (event: LoopEvent, samples?: Float32Array) => void;
  private readonly setTimer: (run: () => void, delayMs: number) => unknown;

  constructor(
    private readonly context: BaseAudioContext,
    options: LoopCrossfadeOptions = {},
  ) {
    this.fadeS = options.fadeS ?? CROSSFADE_S;
    this.leadS = options.leadS ?? SCHEDULE_LEAD_S;
    this.newerAheadS = options.newerAheadS ?? NEWER_AHEAD_S;
    this.extendWithinS = options.extendWithinS ?? EXTEND_WITHIN_S;
    this.onEvent = options.onEvent ?? (() => undefined);
    this.setTimer = options.setTimer ?? ((run, delayMs) => setTimeout(run, delayMs));
    this.output = context.createGain();
  }

  /** True while a sound plays (or is about to). */
  get playing(): boolean {
    return this.leader !== null;
  }

  /** The sequence of the sound that is (or is about to be) at full gain. */
  get sequence(): number | null {
    return this.leader?.sequence ?? null;
  }

  /** Plays `sound` from its start, once or looped; whatever played fades out. */
  play(sound: LoopSound, loop: boolean): LoopEvent {
    this.pending = null;
    this.looping = loop;
    this.lastComplete = sound.complete ? sound : null;
    const atS = this.changeTimeS();
    return this.switchTo(sound, atS, 0, 'start');
  }

  /**
   * A newer preview, or more of the one playing: crossfaded in at the playhead when it is ready
   * there (see the file's comment); returns what was scheduled, or null (ignored or waiting).
   */
  follow(sound: LoopSound): LoopEvent | null {
    const leader = this.leader;
    if (!leader) return null;
    if (sound.complete && sound.sequence >= (this.lastComplete?.sequence ?? -Infinity)) this.lastComplete = sound;
    if (sound.sequence < leader.sequence) return null;
    if (sound.sequence > leader.sequence && !this.looping) return null;
    if (sound.sequence === leader.sequence && (sound.readySamples <= leader.readySamples || leader.complete)) return null;
    if (this.pending && this.pending.sequence > sound.sequence) return null;
    const atS = this.changeTimeS();
    if (atS > this.context.currentTime + this.leadS + 1 / this.context.sampleRate) {
      // A crossfade is still running: keep the newest sound and try again when it is over.
      this.pending = sound;
      this.retryAt(atS);
      return null;
    }
    const positionS = this.positionAt(leader, atS);
    if (positionS === null) return null; // played once, to its end
    const sameSound = sound.sequence === leader.sequence;
    const readyS = sound.readySamples / sound.sampleRateHz;
    const positionInSoundS = positionS % (sound.samples.length / sound.sampleRateHz);
    const leaderAheadS = leader.complete ? Infinity : leader.readySamples / leader.sampleRateHz - positionS;
    const ready = sound.complete || (sameSound ? leaderAheadS < this.fadeS + this.extendWithinS : readyS >= positionInSoundS + this.fadeS + this.newerAheadS);
    if (ready) {
      this.pending = null;
      return this.switchTo(sound, atS, positionInSoundS, sameSound ? 'extend' : 'crossfade');
    }
    // Not ready where the loop plays: wait for more of it (a later call brings it). If the playing
    // voice is about to run out of samples meanwhile, fall back to the latest complete preview.
    this.pending = sound;
    const fallback = this.lastComplete;
    if (leaderAheadS < this.fadeS + this.extendWithinS && fallback && fallback !== sound) {
      return this.switchTo(fallback, atS, positionS % (fallback.samples.length / fallback.sampleRateHz), 'fallback');
    }
    return null;
  }

  /** Looping on or off for what plays (and what follows). */
  setLoop(loop: boolean): void {
    this.looping = loop;
    for (const voice of this.voices) {
      if (voice.stopS === null) voice.source.loop = loop;
      voice.loop = loop;
    }
  }

  /** Fades out whatever plays. */
  stop(): void {
    this.pending = null;
    const leader = this.leader;
    if (!leader) return;
    const atS = this.changeTimeS();
    this.fadeOut(leader, atS);
    this.leader = null;
    this.busyUntilS = atS + this.fadeS;
    this.onEvent({ kind: 'stop', sequence: leader.sequence, atS, fadeS: this.fadeS, offsetS: 0, readySamples: leader.readySamples });
  }

  /** Where `voice` plays at context time `atS`, s into its sound; null once a voice played once has ended. */
  private positionAt(voice: Voice, atS: number): number | null {
    const raw = voice.offsetS + Math.max(0, atS - voice.startS);
    if (voice.loop) return raw % voice.durationS;
    return raw < voice.durationS ? raw : null;
  }

  /** The first context frame a change may start at: `leadS` ahead, and after the last change. */
  private changeTimeS(): number {
    const rate = this.context.sampleRate;
    const earliest = Math.max(this.context.currentTime + this.leadS, this.busyUntilS);
    return Math.ceil(earliest * rate - 1e-6) / rate;
  }

  private retryAt(atS: number): void {
    if (this.timer !== null) return;
    const delayMs = Math.max(0, (atS - this.context.currentTime) * 1000);
    this.timer = this.setTimer(() => {
      this.timer = null;
      const waiting = this.pending;
      this.pending = null;
      if (waiting) this.follow(waiting);
    }, delayMs);
  }

  private switchTo(sound: LoopSound, atS: number, offsetS: number, kind: LoopEvent['kind']): LoopEvent {
    const voice = this.startVoice(sound, atS, offsetS);
    const previous = this.leader;
    if (previous) this.fadeOut(previous, atS);
    // A start plays the preview from its first sample as it is (its own onset); a change mid-sound fades in.
    if (this.fadeS > 0 && kind !== 'start') {
      voice.gain.gain.setValueAtTime(0, atS);
      voice.gain.gain.linearRampToValueAtTime(1, atS + this.fadeS);
    } else voice.gain.gain.setValueAtTime(1, atS);
    this.leader = voice;
    this.busyUntilS = atS + this.fadeS;
    const event: LoopEvent = { kind, sequence: sound.sequence, atS, fadeS: this.fadeS, offsetS, readySamples: sound.readySamples };
    this.onEvent(event, sound.samples);
    return event;
  }

  private startVoice(sound: LoopSound, atS: number, offsetS: number): Voice {
    const length = sound.samples.length;
    const buffer = this.context.createBuffer(1, length, sound.sampleRateHz);
    const ready = sound.complete ? length : Math.min(length, sound.readySamples);
    buffer.copyToChannel(sound.samples.subarray(0, ready) as Float32Array<ArrayBuffer>, 0);
    const source = this.context.createBufferSource();
    source.buffer = buffer;
    source.loop = this.looping;
    const gain = this.context.createGain();
    gain.gain.value = 0;
    source.connect(gain);
    gain.connect(this.output);
    const voice: Voice = {
      source,
      gain,
      sequence: sound.sequence,
      readySamples: ready,
      complete: sound.complete,
      sampleRateHz: sound.sampleRateHz,
      startS: atS,
      offsetS,
      durationS: length / sound.sampleRateHz,
      loop: this.looping,
      stopS: null,
      ended: false,
    };
    source.onended = () => this.onVoiceEnded(voice);
    source.start(atS, offsetS);
    this.voices.push(voice);
    return voice;
  }

  private fadeOut(voice: Voice, atS: number): void {
    if (this.fadeS > 0) {
      voice.gain.gain.setValueAtTime(1, atS);
      voice.gain.gain.linearRampToValueAtTime(0, atS + this.fadeS);
    } else voice.gain.gain.setValueAtTime(0, atS);
    voice.stopS = atS + this.fadeS + STOP_TAIL_S;
    voice.source.stop(voice.stopS);
  }

  /**
   * A source ended: free it. If it was meant to play on (a crossfade's outgoing voice whose
   * successor had not begun, or a looped voice that stopped), nothing was playing: a gap.
   */
  private onVoiceEnded(voice: Voice): void {
    voice.ended = true;
    voice.source.disconnect();
    voice.gain.disconnect();
    this.voices = this.voices.filter((other) => other !== voice);
    const now = this.context.currentTime;
    const base = { sequence: voice.sequence, atS: now, fadeS: 0, offsetS: 0, readySamples: voice.readySamples };
    if (voice === this.leader) {
      this.leader = null;
      // A voice played once ends at its end; a looped leader never should.
      this.onEvent({ ...base, kind: voice.loop ? 'gap' : 'ended' });
      return;
    }
    const successorPlaying = this.voices.some((other) => other.startS <= now + 1e-9 && !other.ended);
    if (!successorPlaying && this.leader !== null) this.onEvent({ ...base, kind: 'gap' });
  }
}
