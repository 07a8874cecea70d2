import { midiToNoteName } from '../../../shared/designer/pitch';
import type { WavFormat } from '../../../shared/audio/wav-format';
import type { NoteSetSpec, RenderOutput } from '../../../shared/renders/render-settings';
import type { RenderStorage } from './api/get-renders';

/** A number with a true minus sign (−), as the trade prints levels: (−16) → "−16", (−0.25, 1, 1) → "−0.3"; silence is "−∞". */
export function signedNumber(value: number, maxFractionDigits = 1, minFractionDigits = 0): string {
  if (value === -Infinity) return '−∞';
  const text = value.toLocaleString('en', { minimumFractionDigits: minFractionDigits, maximumFractionDigits: maxFractionDigits, useGrouping: false });
  // "-0" after rounding reads as a level below zero that is not there.
  return text.replace(/^-(?=0(\.0*)?$)/, '').replace('-', '−');
}

/** 48000 → "48 kHz", 44100 → "44.1 kHz". */
export function sampleRateText(sampleRateHz: number): string {
  return `${(sampleRateHz / 1000).toLocaleString('en', { maximumFractionDigits: 1 })} kHz`;
}

export const FORMAT_SHORT: Record<WavFormat, string> = { pcm16: '16-bit', pcm24: '24-bit', f32: '32-bit float' };

function levelText(normalization: RenderOutput['normalization']): string {
  if (normalization.kind === 'peak') return `peak ${signedNumber(normalization.ceilingDbfs)} dBFS`;
  if (normalization.kind === 'loudness') return `loudness ${signedNumber(normalization.targetLufs)} LUFS / ${signedNumber(normalization.truePeakCeilingDbtp)} dBTP`;
  return 'unscaled (physical units)';
}

/** A render's file settings in one line: "48 kHz · 24-bit · stereo · loudness −16 LUFS / −1 dBTP". */
export function outputSummary(output: RenderOutput): string {
  return [sampleRateText(output.sampleRateHz), FORMAT_SHORT[output.format], output.channels.kind, levelText(output.normalization)].join(' · ');
}

/** How the length was chosen: "fixed 3 s" or "until −90 dB, at most 30 s". */
export function lengthRuleSummary(length: RenderOutput['length']): string {
  if (length.kind === 'fixed') return `fixed ${length.durationS} s`;
  return `until ${signedNumber(length.thresholdDb)} dB, at most ${length.maxDurationS} s`;
}

/** A note set in one line: "C2–C6 every 3 · 3 strengths · by tension". */
export function noteSetSummary(spec: NoteSetSpec): string {
  const range = spec.fromMidi === spec.toMidi ? midiToNoteName(spec.fromMidi) : `${midiToNoteName(spec.fromMidi)}–${midiToNoteName(spec.toMidi)}`;
  return [`${range} every ${spec.stepSemitones}`, `${spec.strengths} strength${spec.strengths === 1 ? '' : 's'}`, `by ${spec.retuneBy}`].join(' · ');
}

const BYTE_UNITS = ['bytes', 'kB', 'MB', 'GB', 'TB'] as const;

/** Bytes in binary multiples, one decimal at most: 1288490189 → "1.2 GB", 2147483648 → "2 GB". */
export function byteSize(bytes: number): string {
  let value = bytes;
  let unit = 0;
  while (value >= 1024 && unit < BYTE_UNITS.length - 1) {
    value /= 1024;
    unit += 1;
  }
  return `${value.toLocaleString('en', { maximumFractionDigits: unit === 0 ? 0 : 1 })} ${BYTE_UNITS[unit]}`;
}

/** "1.2 GB of 2 GB used". */
export function storageSummary(storage: RenderStorage): string {
  return `${byteSize(storage.usedBytes)} of ${byteSize(storage.quotaBytes)} used`;
}
