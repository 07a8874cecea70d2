import { quantizePcm } from '../../shared/audio/quantize-pcm';
import { writeWav } from '../../shared/audio/wav-writer';
import type { WavFormat } from '../../shared/audio/wav-format';
import type { RandomSource } from '../../shared/random/seeded-random';
import type { SampleRate } from '../../shared/units';

export interface WavMetadata {
  title: string;
  software: string;
  /** Creation date, YYYY-MM-DD (RIFF INFO ICRD). */
  date: string;
  /** Free text (RIFF INFO ICMT): renders keep their settings and patch here, as JSON. */
  comment?: string;
}

export interface EncodedWav {
  bytes: Uint8Array;
  clippedCount: number;
}

/**
 * Encodes one or more channels as a RIFF WAVE file with an INFO list (title, software, date and
 * an optional comment). PCM formats take full-scale samples (±1) and are dithered with TPDF noise
 * from `random`, channel after channel; f32 stores the values as they are (physical units when
 * not normalised).
 */
export function encodeWav(
  channels: Float64Array | ReadonlyArray<Float64Array>,
  sampleRateHz: SampleRate,
  format: WavFormat,
  metadata: WavMetadata,
  random: RandomSource,
): EncodedWav {
  const list = channels instanceof Float64Array ? [channels] : [...channels];
  const info: Record<string, string> = { INAM: metadata.title, ISFT: metadata.software, ICRD: metadata.date, ...(metadata.comment ? { ICMT: metadata.comment } : {}) };
  if (format === 'f32') return { bytes: writeWav({ sampleRateHz, bitsPerSample: 32, channels: list.map((channel) => Float32Array.from(channel)), info }), clippedCount: 0 };
  const bits = format === 'pcm16' ? 16 : 24;
  const quantized = list.map((channel) => quantizePcm(channel, bits, random));
  const clippedCount = quantized.reduce((sum, channel) => sum + channel.clippedCount, 0);
  return { bytes: writeWav({ sampleRateHz, bitsPerSample: bits, channels: quantized.map((channel) => channel.samples), info }), clippedCount };
}
