import { assert } from '../assert';
import { midiToNoteName } from '../designer/pitch';
import type { Patch, Polyline } from '../patch/patch-schema';
import type { MidiNote } from '../units';
import { narrowShape } from './narrow-shape';
import type { NoteSetSpec } from './render-settings';

/** One file of a note set: which note it sounds, the keys and velocities it answers, and how hard it is played. */
export interface NoteSetFile {
  /** Safe ASCII, unique within the set: `<name>_<note>_<MIDI, 3 digits>_s<strength>of<count>.wav`. */
  fileName: string;
  /** The note the file sounds (its first partial is tuned to it). */
  rootMidi: MidiNote;
  /** The root note's name with sharps, scientific pitch notation (C4 = 60): `C#3`. */
  rootName: string;
  /** Lowest and highest key the file is played on, inclusive. */
  keyLowMidi: MidiNote;
  keyHighMidi: MidiNote;
  /** 1 (softest) … strengthCount (hardest). */
  strength: number;
  strengthCount: number;
  /** MIDI note-on velocities the file answers, inclusive, within 1–127. */
  velocityLow: number;
  velocityHigh: number;
  /** Factor on the excitation's values (displacement and velocity). */
  displacementScale: number;
  /** Factor on the contact width, for `narrowShape`. */
  widthFactor: number;
}

/**
 * How the strengths of a set are played (our own design, not a measured playing law): the softest
 * is the patch's excitation at 0.3 of its size (−10.5 dB) and as wide as designed, the hardest at
 * full size with its contact narrowed to 0.6. Between them the size rises evenly in dB,
 * scale_s = 0.3^((k − s)/(k − 1)), and the width falls evenly, w_s = 1 − 0.4·(s − 1)/(k − 1), for
 * strength s of k. A set of one strength plays the patch as designed (scale 1, width 1).
 */
export const NOTE_SET_STRENGTHS = { softestScale: 0.3, hardestScale: 1, softestWidthFactor: 1, hardestWidthFactor: 0.6 } as const;

/** MIDI note-on velocities: 1–127 (0 is a note-off). */
const VELOCITY_LOW = 1;
const VELOCITY_HIGH = 127;
/** Longest name part of a file name, in characters. */
const MAX_SLUG_LENGTH = 64;

/** A name as a file-name part: accents dropped, lower case, every run of other characters one hyphen; `note-set` when nothing is left. */
function fileNameSlug(name: string): string {
  const ascii = name
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase();
  const slug = ascii
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+/, '')
    .slice(0, MAX_SLUG_LENGTH)
    .replace(/-+$/, '');
  return slug === '' ? 'note-set' : slug;
}

/** The velocity band of strength s of k: 1–127 cut into k contiguous bands as equal as whole numbers allow, [1 + ⌊(s − 1)·127/k⌋, ⌊s·127/k⌋]. */
function velocityBand(strength: number, count: number): { velocityLow: number; velocityHigh: number } {
  const span = VELOCITY_HIGH - VELOCITY_LOW + 1;
  return {
    velocityLow: VELOCITY_LOW + Math.floor(((strength - 1) * span) / count),
    velocityHigh: VELOCITY_LOW - 1 + Math.floor((strength * span) / count),
  };
}

/** Scale and width of strength s of k (see `NOTE_SET_STRENGTHS`). */
function strengthScaling(strength: number, count: number): { displacementScale: number; widthFactor: number } {
  if (count === 1) return { displacementScale: 1, widthFactor: 1 };
  const hardness = (strength - 1) / (count - 1);
  const { softestScale, hardestScale, softestWidthFactor, hardestWidthFactor } = NOTE_SET_STRENGTHS;
  return {
    displacementScale: hardestScale * (softestScale / hardestScale) ** (1 - hardness),
    widthFactor: (1 - hardness) * softestWidthFactor + hardness * hardestWidthFactor,
  };
}

/**
 * The files of a note set, note by note from the lowest, each at strengths 1…k. The roots are
 * fromMidi, fromMidi + step, … up to toMidi. Each root r covers the keys
 * [r − ⌊(step − 1)/2⌋, r + ⌈(step − 1)/2⌉] clamped to 0–127, so neighbouring roots (step apart)
 * meet without a gap or an overlap, and the first and last notes reach as far below and above
 * their roots as any other (an odd step centres each root; an even one gives the extra key above).
 * Velocity bands split 1–127 into k contiguous bands; the strength scaling is `NOTE_SET_STRENGTHS`.
 * File names are `<slug of baseName>_<root name, # written s>_<root MIDI, 3 digits>_s<s>of<k>.wav`,
 * e.g. `harbour-harp_Cs3_049_s2of3.wav`: safe ASCII, unique, the same for the same inputs.
 */
export function noteSetPlan(spec: NoteSetSpec, baseName: string): NoteSetFile[] {
  const { fromMidi, toMidi, stepSemitones, strengths } = spec;
  assert(Number.isInteger(fromMidi) && Number.isInteger(toMidi) && fromMidi >= 0 && toMidi <= 127 && toMidi >= fromMidi, 'a note set runs up from fromMidi to toMidi within 0–127');
  assert(Number.isInteger(stepSemitones) && stepSemitones >= 1, 'a note set steps by a whole number of semitones');
  assert(Number.isInteger(strengths) && strengths >= 1 && strengths <= VELOCITY_HIGH, 'a note set has a whole number of strengths, at most one per velocity');
  const slug = fileNameSlug(baseName);
  const below = Math.floor((stepSemitones - 1) / 2);
  const above = Math.ceil((stepSemitones - 1) / 2);
  const files: NoteSetFile[] = [];
  for (let rootMidi = fromMidi; rootMidi <= toMidi; rootMidi += stepSemitones) {
    const rootName = midiToNoteName(rootMidi);
    const notePart = `${rootName.replace('#', 's')}_${String(rootMidi).padStart(3, '0')}`;
    for (let strength = 1; strength <= strengths; strength++) {
      files.push({
        fileName: `${slug}_${notePart}_s${strength}of${strengths}.wav`,
        rootMidi,
        rootName,
        keyLowMidi: Math.max(0, rootMidi - below),
        keyHighMidi: Math.min(127, rootMidi + above),
        strength,
        strengthCount: strengths,
        ...velocityBand(strength, strengths),
        ...strengthScaling(strength, strengths),
      });
    }
  }
  return files;
}

/** A polyline's values times a factor (the supports stay at 0). */
function scaledPolyline(points: Polyline, factor: number): Array<[number, number]> {
  return points.map(([x, value]) => [x, value * factor]);
}

/**
 * The patch played at a file's strength: its initial displacement and, if it has one, its initial
 * velocity, each narrowed about its own peak by widthFactor (`narrowShape`) and its values scaled
 * by displacementScale. The string's motion is linear in its initial conditions, so the sound
 * scales by the same factor (its level by 20·log10 of it) before any normalisation.
 */
export function applyStrength(patch: Patch, file: Pick<NoteSetFile, 'displacementScale' | 'widthFactor'>): Patch {
  assert(file.displacementScale > 0, `displacementScale must be > 0, got ${file.displacementScale}`);
  const { lengthM } = patch.string;
  const played = (points: Polyline) => scaledPolyline(narrowShape(points, lengthM, file.widthFactor), file.displacementScale);
  const { velocityMPerS } = patch.excitation;
  return {
    ...patch,
    excitation: {
      ...patch.excitation,
      displacementM: played(patch.excitation.displacementM),
      ...(velocityMPerS ? { velocityMPerS: played(velocityMPerS) } : {}),
    },
  };
}
