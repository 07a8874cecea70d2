import * as wavefileModule from 'wavefile';
import { quantizePcm } from '../../shared/audio/quantize-pcm';
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

/** The WaveFile class, whether the package loads as an ES module (the server) or through require (worker threads under tsx). */
const { WaveFile } = ((wavefileModule as unknown as { default?: typeof wavefileModule }).default ?? wavefileModule) as typeof wavefileModule;

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
  const wav = new WaveFile();
  let clippedCount = 0;
  const data = (values: ArrayLike<number>[]) => (list.length === 1 ? values[0] : values);
  if (format === 'f32') {
    wav.fromScratch(list.length, sampleRateHz, '32f', data(list.map((channel) => Float32Array.from(channel))));
  } else {
    const bits = format === 'pcm16' ? 16 : 24;
    const quantized = list.map((channel) => quantizePcm(channel, bits, random));
    clippedCount = quantized.reduce((sum, channel) => sum + channel.clippedCount, 0);
    wav.fromScratch(list.length, sampleRateHz, String(bits), data(quantized.map((channel) => channel.samples)));
  }
  wav.setTag('INAM', metadata.title);
  wav.setTag('ISFT', metadata.software);
  wav.setTag('ICRD', metadata.date);
  if (metadata.comment) wav.setTag('ICMT', metadata.comment);
  return { bytes: wav.toBuffer(), clippedCount };
}
