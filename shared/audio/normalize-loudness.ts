import { assert } from '../assert';
import type { DecibelsFullScale, LoudnessUnitsFullScale } from '../units';
import { decibelsFromGain, gainFromDecibels } from './decibels';

/** What a loudness gain is computed from: the measured integrated loudness and true peak. */
export interface LoudnessMeasurement {
  integratedLufs: LoudnessUnitsFullScale;
  truePeakLinear: number;
}

export interface LoudnessGain {
  /** Amplitude factor to apply to every sample of every channel. */
  gain: number;
  /** True when the true-peak ceiling, not the loudness target, set the gain. */
  limitedByTruePeak: boolean;
  /** Integrated loudness after the gain, LUFS. */
  resultingLufs: LoudnessUnitsFullScale;
  /** True peak after the gain, dBTP. */
  resultingTruePeakDbtp: DecibelsFullScale;
}

/**
 * The gain that brings a signal's integrated loudness to `targetLufs`, g = 10^((target − L)/20),
 * lowered to g = 10^(ceiling/20) / truePeak when it would put the true peak above
 * `truePeakCeilingDbtp`. A gain g moves loudness by 20·log10 g (the K-weighting filter is linear and
 * the relative gate moves with it) and the true peak by the factor g; this is exact unless a block
 * crosses the −70 LUFS absolute gate of ITU-R BS.1770-4, which barely moves the result. Silence
 * (−Infinity LUFS) gets gain 1.
 */
export function loudnessGain(
  measurement: LoudnessMeasurement,
  targetLufs: LoudnessUnitsFullScale,
  truePeakCeilingDbtp: DecibelsFullScale,
): LoudnessGain {
  const { integratedLufs, truePeakLinear } = measurement;
  assert(Number.isFinite(targetLufs), `loudness target ${targetLufs} LUFS must be finite`);
  assert(!Number.isNaN(truePeakCeilingDbtp), 'true-peak ceiling must be a number');
  assert(integratedLufs < Infinity && !Number.isNaN(integratedLufs), `measured loudness ${integratedLufs} LUFS`);
  assert(Number.isFinite(truePeakLinear) && truePeakLinear >= 0, `measured true peak ${truePeakLinear}`);

  let gain = integratedLufs === -Infinity ? 1 : gainFromDecibels(targetLufs - integratedLufs);
  let limitedByTruePeak = false;
  const ceilingLinear = gainFromDecibels(truePeakCeilingDbtp);
  if (integratedLufs !== -Infinity && truePeakLinear * gain > ceilingLinear) {
    gain = ceilingLinear / truePeakLinear;
    limitedByTruePeak = true;
  }
  return {
    gain,
    limitedByTruePeak,
    resultingLufs: integratedLufs + decibelsFromGain(gain),
    resultingTruePeakDbtp: decibelsFromGain(truePeakLinear * gain),
  };
}
