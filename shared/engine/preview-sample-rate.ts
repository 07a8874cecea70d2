import { LIMITS } from '../limits';
import type { Hertz, Seconds } from '../units';

/** The standard rates a long preview steps down through, highest first (Hz). */
export const PREVIEW_STEP_RATES_HZ: readonly Hertz[] = [48000, 44100, 32000, 24000, 22050, 16000];

/**
 * The rate a live preview of `durationS` is sent at: the patch's rate (no more than
 * LIMITS.previewMaxSampleRateHz), stepped down through the standard rates until
 * durationS × rate ≤ LIMITS.previewMaxSamples; the lowest step when even that is too many.
 * A 6 s preview stays at 48 kHz, an 8 s one is sent at 32 kHz, a 12 s one at 24 kHz.
 */
export function previewSampleRateHz(patchRateHz: Hertz, durationS: Seconds): Hertz {
  const ceilingHz = Math.min(patchRateHz, LIMITS.previewMaxSampleRateHz);
  if (Math.round(durationS * ceilingHz) <= LIMITS.previewMaxSamples) return ceilingHz;
  const steps = PREVIEW_STEP_RATES_HZ.filter((rateHz) => rateHz < ceilingHz);
  return steps.find((rateHz) => Math.round(durationS * rateHz) <= LIMITS.previewMaxSamples) ?? steps[steps.length - 1] ?? ceilingHz;
}
