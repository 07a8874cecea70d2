import type { Hertz, MidiNote } from '../units';

/** Concert pitch A4 in Hz (ISO 16:1975). */
export const DEFAULT_A4_HZ: Hertz = 440;
const A4_MIDI = 69;
const SHARP_NAMES = ['C', 'C#', 'D', 'D#', 'E', 'F', 'F#', 'G', 'G#', 'A', 'A#', 'B'] as const;
const LETTER_SEMITONES: Record<string, number> = { C: 0, D: 2, E: 4, F: 5, G: 7, A: 9, B: 11 };

/** Equal-tempered frequency of a MIDI note: f = A4·2^((n − 69)/12) (MIDI Tuning Standard). */
export function midiToFrequencyHz(note: MidiNote, a4Hz: Hertz = DEFAULT_A4_HZ): Hertz {
  return a4Hz * 2 ** ((note - A4_MIDI) / 12);
}

/** Inverse of `midiToFrequencyHz`; fractional notes carry the cents (0.01 = 1 cent). */
export function frequencyHzToMidi(frequencyHz: Hertz, a4Hz: Hertz = DEFAULT_A4_HZ): MidiNote {
  return A4_MIDI + 12 * Math.log2(frequencyHz / a4Hz);
}

/** Interval from one frequency to another in cents (1200 per octave). */
export function centsBetween(fromHz: Hertz, toHz: Hertz): number {
  return 1200 * Math.log2(toHz / fromHz);
}

/**
 * Parses a note name such as `A4`, `C#3`, `Bb2` or `E-1` (scientific pitch notation, middle C = C4 = 60).
 * Returns null when the text is not a note name or falls outside MIDI 0…127.
 */
export function noteNameToMidi(name: string): MidiNote | null {
  const match = /^([A-Ga-g])([#b♯♭]?)(-?\d+)$/.exec(name.trim());
  if (!match) return null;
  const letter = match[1].toUpperCase();
  const accidental = match[2] === '#' || match[2] === '♯' ? 1 : match[2] === 'b' || match[2] === '♭' ? -1 : 0;
  const octave = Number(match[3]);
  const note = (octave + 1) * 12 + LETTER_SEMITONES[letter] + accidental;
  return note >= 0 && note <= 127 ? note : null;
}

/** Name of the nearest MIDI note, with sharps: 60 → `C4`, 61 → `C#4`. */
export function midiToNoteName(note: MidiNote): string {
  const rounded = Math.round(note);
  const pitchClass = ((rounded % 12) + 12) % 12;
  return `${SHARP_NAMES[pitchClass]}${Math.floor(rounded / 12) - 1}`;
}
