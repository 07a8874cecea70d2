import { LIMITS } from '../limits';
import type { Patch } from '../patch/patch-schema';

/**
 * The patch the live preview renders: the same string, heard for at most
 * LIMITS.previewMaxDurationS at no more than LIMITS.previewMaxSampleRateHz, so a preview can never
 * stall the server. Full-length renders use the patch as it is.
 */
export function previewPatch(patch: Patch, maxDurationS: number = LIMITS.previewMaxDurationS): Patch {
  const sampleRateHz = patch.render.sampleRateHz > LIMITS.previewMaxSampleRateHz ? LIMITS.previewMaxSampleRateHz : patch.render.sampleRateHz;
  return { ...patch, render: { ...patch.render, sampleRateHz, durationS: Math.min(patch.render.durationS, maxDurationS) } };
}
