import type { RandomSource } from '../random/seeded-random';

export type PcmBits = 16 | 24;

export interface Quantized {
  samples: Int32Array;
  /** Samples that fell outside full scale and were clipped. */
  clippedCount: number;
}

/**
 * Converts samples in full-scale units (±1) to signed integers of `bits`, with TPDF dither: the sum
 * of two independent uniform values of ±½ LSB each, added before rounding, which makes the
 * quantisation error independent of the signal (common practice in mastering). Values beyond full
 * scale are clipped and counted.
 */
export function quantizePcm(samples: ArrayLike<number>, bits: PcmBits, random: RandomSource): Quantized {
  const fullScale = 2 ** (bits - 1);
  const max = fullScale - 1;
  const min = -fullScale;
  const out = new Int32Array(samples.length);
  let clippedCount = 0;
  for (let i = 0; i < samples.length; i++) {
    const dither = random() - random();
    let value = Math.round(samples[i] * fullScale + dither);
    if (value > max) {
      value = max;
      clippedCount++;
    } else if (value < min) {
      value = min;
      clippedCount++;
    }
    out[i] = value;
  }
  return { samples: out, clippedCount };
}
