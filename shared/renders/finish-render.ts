import { decibelsFromGain, gainFromDecibels } from '../audio/decibels';
import { integratedLoudness } from '../audio/integrated-loudness';
import { loudnessGain } from '../audio/normalize-loudness';
import { truePeak } from '../audio/true-peak';
import { LIMITS } from '../limits';
import { decayCutSample, fadeOut } from './decay-cut';
import type { RenderLevelling } from './render-levelling';
import type { RenderOutput } from './render-settings';

/** A render's channels as they will be written, and the figures stored with it. */
export interface FinishedRender {
  channels: Float64Array[];
  frames: number;
  durationS: number;
  /** Gain applied by the normalisation (1 for none). */
  gain: number;
  /** Where the cut fell, when the length was "until decayed"; null for a fixed length. */
  cutSample: number | null;
  peakDbfs: number;
  truePeakDbtp: number;
  integratedLufs: number;
  /** True when a loudness target was lowered to keep the true peak under its ceiling. */
  limitedByTruePeak: boolean;
  /** How the level was set (see RenderLevelling). */
  levelling: RenderLevelling;
}

function samplePeak(channels: ReadonlyArray<Float64Array>): number {
  let peak = 0;
  for (const channel of channels) for (let i = 0; i < channel.length; i++) peak = Math.max(peak, Math.abs(channel[i]));
  return peak;
}

/**
 * Turns rendered channels into what is written: cut where the tone has decayed, or at its fixed
 * length, with a short raised-cosine fade (the settings' fade, LIMITS.renderFixedFadeMs for a fixed
 * length that names none), then brought to its level: none, the sample peak to a ceiling, or the integrated loudness
 * (ITU-R BS.1770, gated) to a target with the true peak kept under a ceiling. The true peak scales
 * exactly with a gain and is measured once; the loudness is measured again after levelling, because
 * the absolute gate does not scale. A mono render is measured as one front channel. Levels of a
 * silent render are −Infinity. A loudness render shorter than one 400 ms gating block has no
 * integrated loudness (BS.1770-4 Annex 1), so its true peak is brought to the ceiling instead
 * (`truePeakShort`). A `fixedGain` replaces the levelling (the softer strengths of a
 * note set take the gain of the note's hardest, so that the strengths keep their levels).
 */
export function finishRender(rendered: Float64Array[], sampleRateHz: number, output: RenderOutput, fixedGain?: number): FinishedRender {
  let channels = rendered;
  let cutSample: number | null = null;
  if (output.length.kind === 'untilDecayed') {
    const minimum = Math.min(rendered[0].length, Math.round(LIMITS.renderMinDurationS * sampleRateHz));
    const fadeSamples = Math.round((output.length.fadeMs / 1000) * sampleRateHz);
    cutSample = Math.max(minimum, decayCutSample(rendered, output.length.thresholdDb));
    // The fade ends at the cut; a tail shorter than the fade keeps what it has.
    channels = rendered.map((channel) => channel.slice(0, cutSample as number));
    fadeOut(channels, cutSample, fadeSamples);
  } else {
    // A fixed length stops mid-tone: end it with a fade too, so the file makes no click.
    const fadeSamples = Math.round(((output.length.fadeMs ?? LIMITS.renderFixedFadeMs) / 1000) * sampleRateHz);
    fadeOut(channels, rendered[0].length, fadeSamples);
  }

  // Levels are measured where the file will sit: the absolute gate (−70 LUFS) depends on the
  // level, so a render in physical units (metres) is first brought to unit peak.
  const scale = (factor: number) => {
    if (factor !== 1) for (const channel of channels) for (let i = 0; i < channel.length; i++) channel[i] *= factor;
  };
  const { normalization } = fixedGain === undefined ? output : { normalization: { kind: 'fixed' as const } };
  const rawPeak = samplePeak(channels);
  let gain = 1;
  if (normalization.kind !== 'none' && normalization.kind !== 'fixed' && rawPeak > 0) {
    gain = 1 / rawPeak;
    scale(gain);
  }
  if (fixedGain !== undefined) {
    gain = fixedGain;
    scale(gain);
  }
  let truePeakLinear = truePeak(channels, sampleRateHz).truePeakLinear;
  let limitedByTruePeak = false;
  if (normalization.kind === 'peak' && rawPeak > 0) {
    const ceiling = gainFromDecibels(normalization.ceilingDbfs);
    scale(ceiling);
    gain *= ceiling;
    truePeakLinear *= ceiling;
  }
  const measured = integratedLoudness(channels, sampleRateHz);
  let integratedLufs = measured.integratedLufs;
  let levelling: RenderLevelling = fixedGain !== undefined ? 'strengthGain' : normalization.kind === 'peak' ? 'peak' : normalization.kind === 'loudness' ? 'loudness' : 'none';
  if (normalization.kind === 'loudness' && measured.blockCount === 0 && truePeakLinear > 0) {
    // No whole 400 ms block: no integrated loudness to level by; the true peak goes to the ceiling.
    const level = gainFromDecibels(normalization.truePeakCeilingDbtp) / truePeakLinear;
    scale(level);
    gain *= level;
    truePeakLinear *= level;
    levelling = 'truePeakShort';
  } else if (normalization.kind === 'loudness' && Number.isFinite(integratedLufs)) {
    // Twice: the second pass corrects the little the absolute gate moves with the level.
    for (let pass = 0; pass < 2 && Math.abs(integratedLufs - normalization.targetLufs) > 0.005 && !limitedByTruePeak; pass++) {
      const level = loudnessGain({ integratedLufs, truePeakLinear }, normalization.targetLufs, normalization.truePeakCeilingDbtp);
      scale(level.gain);
      gain *= level.gain;
      truePeakLinear *= level.gain;
      limitedByTruePeak = level.limitedByTruePeak;
      integratedLufs = integratedLoudness(channels, sampleRateHz).integratedLufs;
    }
    if (limitedByTruePeak) levelling = 'truePeakCeiling';
  }

  const frames = channels[0].length;
  return {
    channels,
    frames,
    durationS: frames / sampleRateHz,
    gain,
    cutSample,
    peakDbfs: decibelsFromGain(samplePeak(channels)),
    truePeakDbtp: decibelsFromGain(truePeakLinear),
    integratedLufs,
    limitedByTruePeak,
    levelling,
  };
}
