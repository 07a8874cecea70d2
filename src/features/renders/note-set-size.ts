import type { NoteSetSpec } from '../../../shared/renders/render-settings';

/** How many notes and files a note set makes: notes from `fromMidi` up to `toMidi` every `stepSemitones`, each at every strength. */
export function noteSetSize(spec: Pick<NoteSetSpec, 'fromMidi' | 'toMidi' | 'stepSemitones' | 'strengths'>): { notes: number; files: number } {
  const notes = Math.floor((spec.toMidi - spec.fromMidi) / spec.stepSemitones) + 1;
  return { notes, files: notes * spec.strengths };
}
