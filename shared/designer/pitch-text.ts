import type { Hertz, MidiNote } from '../units';
import { frequencyHzToMidi, midiToFrequencyHz, midiToNoteName, noteNameToMidi } from './pitch';

/** A pitch as typed, read: its frequency, the nearest note, and how the text was read. */
export type PitchReading =
  | { ok: true; frequencyHz: Hertz; midiNote: MidiNote; noteName: string; readAs: 'note' | 'midi' | 'hz' }
  | { ok: false; message: string };

const reading = (frequencyHz: Hertz, readAs: 'note' | 'midi' | 'hz', midiNote: MidiNote = frequencyHzToMidi(frequencyHz)): PitchReading => ({
  ok: true,
  frequencyHz,
  midiNote,
  noteName: midiToNoteName(midiNote),
  readAs,
});

/**
 * Reads a pitch as a designer types it: a note name in scientific pitch notation (`E2`, `C#4`,
 * `Bb1`; middle C = C4), a MIDI note number (`40`, `MIDI 40`), or a frequency (`82.41 Hz`,
 * `1.2 kHz`). A bare whole number from 0 to 127 is a MIDI note; any other bare number is hertz.
 * Notes use equal temperament from A4 = 440 Hz (MIDI Tuning Standard, ISO 16).
 */
export function parsePitch(text: string): PitchReading {
  const trimmed = text.trim();
  if (trimmed === '') return { ok: false, message: 'Enter a pitch: a note (E2), a MIDI number (40) or a frequency (82.41 Hz)' };
  const note = noteNameToMidi(trimmed);
  if (note !== null) return reading(midiToFrequencyHz(note), 'note', note);
  const midi = /^(?:midi\s*)?(\d{1,3})$/i.exec(trimmed);
  if (midi && Number(midi[1]) <= 127) {
    const n = Number(midi[1]);
    return reading(midiToFrequencyHz(n), 'midi', n);
  }
  const hz = /^(\d*\.?\d+)\s*(hz|khz)?$/i.exec(trimmed.replace(',', '.'));
  if (hz) {
    const value = Number(hz[1]) * (hz[2]?.toLowerCase() === 'khz' ? 1000 : 1);
    if (!(value > 0)) return { ok: false, message: 'Pitch must be more than 0 Hz' };
    return reading(value, 'hz');
  }
  if (/^[A-Ga-g][#b♯♭]?-?\d+$/.test(trimmed)) return { ok: false, message: `Note ${trimmed} is outside the MIDI range C-1 to G9` };
  return { ok: false, message: `Pitch "${trimmed}" is not a note, MIDI number or frequency: write it like E2, 40 or 82.41 Hz` };
}
