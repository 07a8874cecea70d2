import type { Decibels, Hertz, Seconds } from '../../../shared/units';

/** Blocks quieter than this are written as this level. */
export const ENVELOPE_FLOOR_DB: Decibels = -120;

export interface RmsEnvelope {
  /** Centre of each block. */
  timeS: Float32Array;
  /**
   * Level of each block as a sine's peak would read: 20·log10(√2·RMS), so a steady sine of peak 1
   * reads 0 dB and an envelope e^(−σt) falls by 20·σ/ln 10 dB per second.
   */
  levelDb: Float32Array;
}

/**
 * The decay envelope of a signal: its RMS over consecutive blocks of `blockS` seconds, as a level
 * in dB. A last, shorter block is kept only when it holds at least half a block: the RMS of a few
 * samples of a sine depends on its phase, and would bend the end of the line.
 */
export function rmsEnvelope(samples: ArrayLike<number>, sampleRateHz: Hertz, blockS: Seconds): RmsEnvelope {
  const blockLength = Math.max(1, Math.round(blockS * sampleRateHz));
  const remainder = samples.length % blockLength;
  const wholeBlocks = Math.floor(samples.length / blockLength);
  const blockCount = wholeBlocks + (remainder > 0 && (remainder * 2 >= blockLength || wholeBlocks === 0) ? 1 : 0);
  const timeS = new Float32Array(blockCount);
  const levelDb = new Float32Array(blockCount);
  for (let block = 0; block < blockCount; block++) {
    const start = block * blockLength;
    const end = block === blockCount - 1 ? samples.length : start + blockLength;
    let sumOfSquares = 0;
    for (let i = start; i < end; i++) sumOfSquares += samples[i] * samples[i];
    const meanSquare = sumOfSquares / (end - start);
    const db = meanSquare > 0 ? 10 * Math.log10(2 * meanSquare) : -Infinity;
    timeS[block] = (start + end) / 2 / sampleRateHz;
    levelDb[block] = db > ENVELOPE_FLOOR_DB ? db : ENVELOPE_FLOOR_DB;
  }
  return { timeS, levelDb };
}

/**
 * The block length the waveform uses: two periods of the fundamental (so one block holds whole
 * cycles and the envelope does not ripple), between 5 and 50 ms, and never shorter than one pixel
 * column of the drawing.
 */
export function envelopeBlockS(f0Hz: Hertz, durationS: Seconds, columnCount: number): Seconds {
  const twoPeriodsS = f0Hz > 0 ? 2 / f0Hz : 0.05;
  const clamped = Math.min(0.05, Math.max(0.005, twoPeriodsS));
  return Math.max(clamped, columnCount > 0 ? durationS / columnCount : 0);
}
