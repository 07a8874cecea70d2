import { assert } from '../assert';
import type { Decibels, LoudnessUnitsFullScale, SampleRate, Seconds } from '../units';
import { kWeight } from './k-weighting';

/** Channel weight G of left, right and centre (ITU-R BS.1770-4, Annex 1). */
export const FRONT_CHANNEL_WEIGHT = 1.0;
/** Channel weight G of the left and right surrounds, +1.5 dB (ITU-R BS.1770-4, Annex 1). The LFE channel is left out. */
export const SURROUND_CHANNEL_WEIGHT = 1.41;

/** Gating block length T_g (ITU-R BS.1770-4, Annex 1). */
const BLOCK_S: Seconds = 0.4;
/** Blocks overlap by 75 %, so a block starts every T_g/4 and is made of this many steps. */
const STEPS_PER_BLOCK = 4;
/**
 * Cancels the K-weighting's +0.691 dB at 997 Hz, so a 0 dBFS sine there in one front channel reads
 * its mean square, −3.01 LKFS (ITU-R BS.1770-4, Annex 1).
 */
const LOUDNESS_OFFSET_DB: Decibels = -0.691;
/** Absolute gate Γ_a (ITU-R BS.1770-4, Annex 1). */
const ABSOLUTE_GATE_LUFS: LoudnessUnitsFullScale = -70;
/** Relative gate Γ_r below the absolutely gated loudness (ITU-R BS.1770-4, Annex 1), in LU. */
const RELATIVE_GATE_LU: Decibels = -10;

export interface IntegratedLoudness {
  /** Gated loudness, LUFS; −Infinity when no block passes the gates (silence) or there is no whole block. */
  integratedLufs: LoudnessUnitsFullScale;
  /** Whole 400 ms blocks in the signal. */
  blockCount: number;
  /** Blocks that passed both gates and make up the result. */
  gatedBlockCount: number;
}

/** Loudness of a weighted mean square, l = −0.691 + 10·log10 p (ITU-R BS.1770-4, Annex 1); −Infinity for 0. */
function loudnessFromPower(power: number): LoudnessUnitsFullScale {
  return LOUDNESS_OFFSET_DB + 10 * Math.log10(power);
}

/**
 * Gated integrated loudness of ITU-R BS.1770-4, Annex 1, in LUFS:
 * each channel is K-weighted; the signal is cut into 400 ms blocks that start every 100 ms;
 * block j has the loudness l_j = −0.691 + 10·log10 Σ_i G_i·z_ij, z_ij the mean square of channel i in
 * the block; blocks with l_j ≤ −70 LUFS are dropped (absolute gate); then blocks at or below
 * Γ_r = −0.691 + 10·log10 Σ_i G_i·mean_j(z_ij) − 10 over the remaining blocks (relative gate); the
 * result is −0.691 + 10·log10 Σ_i G_i·mean_j(z_ij) over the blocks left.
 *
 * Step k of the block grid starts at sample round(k·fs/10), so at rates whose 100 ms is not a whole
 * number of samples blocks differ by one sample and each block's mean uses its own length.
 * Each 100 ms step's sum of squares is computed once and a block adds four of them.
 *
 * `channelWeights` are the G_i, one per channel, {@link FRONT_CHANNEL_WEIGHT} for each by default;
 * pass {@link SURROUND_CHANNEL_WEIGHT} for surround channels and leave the LFE out.
 */
export function integratedLoudness(
  channels: ReadonlyArray<Float32Array | Float64Array>,
  sampleRateHz: SampleRate,
  channelWeights?: ReadonlyArray<number>,
): IntegratedLoudness {
  assert(channels.length > 0, 'integrated loudness needs at least one channel');
  assert(Number.isFinite(sampleRateHz) && sampleRateHz > 0, `sample rate ${sampleRateHz} Hz must be positive`);
  const weights = channelWeights ?? channels.map(() => FRONT_CHANNEL_WEIGHT);
  assert(weights.length === channels.length, `${weights.length} channel weights for ${channels.length} channels`);
  assert(
    weights.every((weight) => Number.isFinite(weight) && weight >= 0),
    'channel weights must be finite and not negative',
  );
  const sampleCount = channels[0].length;
  assert(
    channels.every((channel) => channel.length === sampleCount),
    'all channels must have the same length',
  );

  const stepRate = STEPS_PER_BLOCK / BLOCK_S;
  const stepStart = (step: number): number => Math.round((step * sampleRateHz) / stepRate);
  let stepCount = Math.floor((sampleCount * stepRate) / sampleRateHz);
  while (stepStart(stepCount + 1) <= sampleCount) stepCount++;
  while (stepCount > 0 && stepStart(stepCount) > sampleCount) stepCount--;
  const blockCount = Math.max(0, stepCount - STEPS_PER_BLOCK + 1);
  if (blockCount === 0) return { integratedLufs: -Infinity, blockCount: 0, gatedBlockCount: 0 };

  const stepBounds = new Float64Array(stepCount + 1);
  for (let step = 0; step <= stepCount; step++) stepBounds[step] = stepStart(step);

  // blockPower[j] = Σ_i G_i·z_ij
  const blockPower = new Float64Array(blockCount);
  const stepEnergy = new Float64Array(stepCount);
  for (let c = 0; c < channels.length; c++) {
    if (weights[c] === 0) continue;
    const weighted = kWeight(channels[c], sampleRateHz);
    for (let step = 0; step < stepCount; step++) {
      let energy = 0;
      const end = stepBounds[step + 1];
      for (let i = stepBounds[step]; i < end; i++) energy += weighted[i] * weighted[i];
      stepEnergy[step] = energy;
    }
    for (let j = 0; j < blockCount; j++) {
      let energy = 0;
      for (let s = 0; s < STEPS_PER_BLOCK; s++) energy += stepEnergy[j + s];
      blockPower[j] += (weights[c] * energy) / (stepBounds[j + STEPS_PER_BLOCK] - stepBounds[j]);
    }
  }

  const blockLufs = Array.from(blockPower, loudnessFromPower);
  const meanPower = (gate: LoudnessUnitsFullScale): { power: number; count: number } => {
    let sum = 0;
    let count = 0;
    for (let j = 0; j < blockCount; j++) {
      if (blockLufs[j] > gate) {
        sum += blockPower[j];
        count++;
      }
    }
    return { power: count > 0 ? sum / count : 0, count };
  };

  const absolute = meanPower(ABSOLUTE_GATE_LUFS);
  if (absolute.count === 0) return { integratedLufs: -Infinity, blockCount, gatedBlockCount: 0 };
  const relativeGate = loudnessFromPower(absolute.power) + RELATIVE_GATE_LU;
  // A block counts only if it passes both gates.
  const gated = meanPower(Math.max(ABSOLUTE_GATE_LUFS, relativeGate));
  return { integratedLufs: loudnessFromPower(gated.power), blockCount, gatedBlockCount: gated.count };
}
