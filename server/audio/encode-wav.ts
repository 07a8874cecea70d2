import wavefile from 'wavefile';
import { quantizePcm } from '../../shared/audio/quantize-pcm';
import type { WavFormat } from '../../shared/audio/wav-format';
import type { RandomSource } from '../../shared/random/seeded-random';
import type { SampleRate } from '../../shared/units';

export interface WavMetadata {
  title: string;
  software: string;
  /** Creation date, YYYY-MM-DD (RIFF INFO ICRD). */
  date: string;
}

export interface EncodedWav {
  bytes: Uint8Array;
  clippedCount: number;
}

/**
 * Encodes mono samples as a RIFF WAVE file with an INFO list (title, software, date).
 * PCM formats take full-scale samples (±1) and are dithered with TPDF noise from `random`;
 * f32 stores the values as they are (physical units when not normalised).
 */
export function encodeWav(
  samples: Float64Array,
  sampleRateHz: SampleRate,
  format: WavFormat,
  metadata: WavMetadata,
  random: RandomSource,
): EncodedWav {
  const wav = new wavefile.WaveFile();
  let clippedCount = 0;
  if (format === 'f32') {
    wav.fromScratch(1, sampleRateHz, '32f', Float32Array.from(samples));
  } else {
    const bits = format === 'pcm16' ? 16 : 24;
    const quantized = quantizePcm(samples, bits, random);
    clippedCount = quantized.clippedCount;
    wav.fromScratch(1, sampleRateHz, String(bits), quantized.samples);
  }
  wav.setTag('INAM', metadata.title);
  wav.setTag('ISFT', metadata.software);
  wav.setTag('ICRD', metadata.date);
  return { bytes: wav.toBuffer(), clippedCount };
}
