/** How much of a progressive preview must be ready before it plays, s. */
export const PLAYABLE_AFTER_S = 0.25;

/** True when enough of a preview is ready to start playing it: its first 250 ms, or all of it. */
export function isPlayable(sound: { sampleRateHz: number; samples: Float32Array; readySamples: number; complete: boolean }): boolean {
  return sound.complete || sound.readySamples >= Math.min(sound.samples.length, Math.round(PLAYABLE_AFTER_S * sound.sampleRateHz));
}
