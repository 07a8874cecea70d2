import type { DecibelsFullScale } from '../units';
import { gainFromDecibels } from './decibels';
import { samplePeak } from './peak';

/**
 * Scales samples in place so that their sample peak sits at `ceilingDbfs` (e.g. −1 dBFS).
 * Silence stays silence. Returns the gain applied.
 */
export function normalizePeak(samples: Float64Array, ceilingDbfs: DecibelsFullScale): number {
  const peak = samplePeak(samples);
  if (peak === 0) return 1;
  const gain = gainFromDecibels(ceilingDbfs) / peak;
  for (let i = 0; i < samples.length; i++) samples[i] *= gain;
  return gain;
}
