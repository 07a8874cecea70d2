import { assert } from '../assert';
import type { WavFormat } from '../audio/wav-format';
import type { RetuneBy } from '../designer/retune-patch';
import type { DecibelsFullScale, Hertz, LoudnessUnitsFullScale, SampleRate, Seconds } from '../units';
import type { NoteSetFile } from './note-set-plan';
import type { RenderLevelling } from './render-levelling';
import type { RenderOutput } from './render-settings';

/** The `format` and `version` a note-set manifest carries; a reader refuses other values. */
export const NOTE_SET_MANIFEST_FORMAT = 'tautline-note-set';
export const NOTE_SET_MANIFEST_VERSION = 1;
/** Name of the manifest inside a note set's ZIP, beside the WAV files. */
export const NOTE_SET_MANIFEST_FILE_NAME = 'manifest.json';

/**
 * One WAV file of a set as the manifest lists it: its place in the plan (keys, velocities, strength
 * and how it was played, as `NoteSetFile` says, its name as `file`) and how it came out.
 */
export type NoteSetManifestFile = { file: string } & Omit<NoteSetFile, 'fileName'> & {
  /**
   * The first partial of the retuned string, stiffness included, f1 = f0·√(1 + B): the root's
   * frequency 440·2^((n − 69)/12) (MIDI Tuning Standard), where `retunePatch` puts it.
   */
  fundamentalHz: Hertz;
  durationS: Seconds;
  /** Levels as written; null when the file is silent and a level has no finite value. */
  peakDbfs: DecibelsFullScale | null;
  truePeakDbtp: DecibelsFullScale | null;
  integratedLufs: LoudnessUnitsFullScale | null;
  /**
   * How its level was set: `loudness` (on the target), `truePeakCeiling` (held below the target by
   * the true-peak ceiling), `truePeakShort` (shorter than one 400 ms loudness block: its true peak
   * on the ceiling), `peak`, `none`, or `strengthGain` (a softer strength, at its note's hardest
   * strength's gain).
   */
  levelling: RenderLevelling;
};

/**
 * The manifest of a note set: our own JSON design, versioned, one per ZIP. It says what made the
 * set and how every file was written, and lists each file with its keys, velocities and levels, so
 * a sampler's loader (or a person) can map the files without parsing their names.
 */
export interface NoteSetManifest {
  format: typeof NOTE_SET_MANIFEST_FORMAT;
  version: typeof NOTE_SET_MANIFEST_VERSION;
  name: string;
  /** When the render was made, ISO 8601 with its zone (`2025-03-14T09:26:53.000Z`). */
  createdAt: string;
  /** What wrote the set, e.g. `Tautline`. */
  software: string;
  /** The session or preset the patch came from, by name. */
  source: { kind: 'session' | 'preset'; name: string };
  retuneBy: RetuneBy;
  sampleRateHz: SampleRate;
  sampleFormat: WavFormat;
  /** Channels per file: 1 (mono) or 2 (stereo: left the patch's pickup, right the second pickup). */
  channels: 1 | 2;
  files: NoteSetManifestFile[];
}

/** What is known of one file once rendered and finished (levels as written, after normalisation). */
export interface RenderedNoteFigures {
  /** The retuned patch's first partial, `modeFrequencyHz(string, 1)`. */
  fundamentalHz: Hertz;
  durationS: Seconds;
  peakDbfs: DecibelsFullScale;
  truePeakDbtp: DecibelsFullScale;
  integratedLufs: LoudnessUnitsFullScale;
  levelling: RenderLevelling;
}

/** JSON has no infinities: a level of a silent file (−∞) is written as null. */
function finiteOrNull(value: number): number | null {
  return Number.isFinite(value) ? value : null;
}

const ISO_INSTANT = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}(\.\d+)?(Z|[+-]\d{2}:\d{2})$/;

/**
 * The manifest of a finished note set: each planned file (`noteSetPlan`) with the figures of its
 * finished render, in the order given (the plan's: note by note, strength by strength). Extra
 * fields of the figures (bytes, gain, …) are left out. The time is passed in (shared code reads
 * no clock); every file name must be unique.
 */
export function buildNoteSetManifest(set: {
  name: string;
  createdAt: string;
  software?: string;
  source: { kind: 'session' | 'preset'; name: string };
  retuneBy: RetuneBy;
  output: Pick<RenderOutput, 'sampleRateHz' | 'format' | 'channels'>;
  files: ReadonlyArray<{ planned: NoteSetFile; rendered: RenderedNoteFigures }>;
}): NoteSetManifest {
  assert(ISO_INSTANT.test(set.createdAt), `createdAt must be an ISO 8601 instant, got ${set.createdAt}`);
  const names = new Set(set.files.map(({ planned }) => planned.fileName));
  assert(names.size === set.files.length, 'every file of a note set has its own name');
  return {
    format: NOTE_SET_MANIFEST_FORMAT,
    version: NOTE_SET_MANIFEST_VERSION,
    name: set.name,
    createdAt: set.createdAt,
    software: set.software ?? 'Tautline',
    source: { kind: set.source.kind, name: set.source.name },
    retuneBy: set.retuneBy,
    sampleRateHz: set.output.sampleRateHz,
    sampleFormat: set.output.format,
    channels: set.output.channels.kind === 'stereo' ? 2 : 1,
    files: set.files.map(({ planned: { fileName, ...placement }, rendered }) => ({
      file: fileName,
      ...placement,
      fundamentalHz: rendered.fundamentalHz,
      durationS: rendered.durationS,
      peakDbfs: finiteOrNull(rendered.peakDbfs),
      truePeakDbtp: finiteOrNull(rendered.truePeakDbtp),
      integratedLufs: finiteOrNull(rendered.integratedLufs),
      levelling: rendered.levelling,
    })),
  };
}
