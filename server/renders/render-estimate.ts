import type { NoteSetSpec, RenderOutput } from '../../shared/renders/render-settings';

/** Room a WAV file's header, INFO list and patch comment may take, bytes (generous). */
const HEADER_ALLOWANCE_BYTES = 64 * 1024;

/** The most bytes one WAV of these settings can take: the longest it may last, every frame. */
export function wavUpperBoundBytes(output: RenderOutput, patchJsonBytes: number): number {
  const seconds = output.length.kind === 'fixed' ? output.length.durationS : output.length.maxDurationS;
  const bytesPerSample = output.format === 'pcm16' ? 2 : output.format === 'pcm24' ? 3 : 4;
  const channels = output.channels.kind === 'stereo' ? 2 : 1;
  return Math.ceil(seconds * output.sampleRateHz) * channels * bytesPerSample + HEADER_ALLOWANCE_BYTES + patchJsonBytes;
}

/** Files in a note set: notes × strengths. */
export function noteSetFileCount(spec: NoteSetSpec): number {
  return (Math.floor((spec.toMidi - spec.fromMidi) / spec.stepSemitones) + 1) * spec.strengths;
}
