import { gainFromDecibels } from '../audio/decibels';
import type { Decibels } from '../units';

/**
 * Where a render is cut when it should last "until decayed": the sample after the last one whose
 * magnitude, on any channel, reaches `thresholdDb` relative to the peak of all channels (e.g.
 * −90 dB). Everything after it is below the threshold. A silent render is cut at 0.
 */
export function decayCutSample(channels: ReadonlyArray<Float64Array>, thresholdDb: Decibels): number {
  let peak = 0;
  for (const channel of channels) for (let i = 0; i < channel.length; i++) peak = Math.max(peak, Math.abs(channel[i]));
  if (peak === 0) return 0;
  const level = peak * gainFromDecibels(thresholdDb);
  let cut = 0;
  for (const channel of channels) {
    for (let i = channel.length - 1; i >= cut; i--) {
      if (Math.abs(channel[i]) >= level) {
        cut = i + 1;
        break;
      }
    }
  }
  return cut;
}

/**
 * A raised-cosine (Hann half-window) fade over the last `fadeSamples` before `endSample`, in place:
 * gain ½(1 + cos(π·k/N)) for k = 1…N, reaching 0 at the end, so the cut makes no click. The
 * shape is common practice; its first derivative is zero at both ends.
 */
export function fadeOut(channels: ReadonlyArray<Float64Array>, endSample: number, fadeSamples: number): void {
  const n = Math.min(fadeSamples, endSample);
  if (n <= 0) return;
  for (const channel of channels) {
    for (let k = 1; k <= n; k++) channel[endSample - n + k - 1] *= 0.5 * (1 + Math.cos((Math.PI * k) / n));
  }
}
