import type { PickupOutput } from '../patch/patch-schema';
import type { Metres } from '../units';
import type { StringProperties } from './mode-frequencies';
import { modeWavenumber } from './mode-frequencies';

/**
 * How strongly mode n reaches the pickup, and whether the pickup reads the mode's displacement q_n
 * or its velocity q_n':
 * - displacement at x_p: Σ sin(k_n x_p)·q_n(t)
 * - velocity at x_p:     Σ sin(k_n x_p)·q_n'(t)
 * - force on the support at x = 0: Σ T·k_n·(1 + B n²)·q_n(t), the slope term T·y_x(0) with the
 *   stiff string's dispersion factor.
 */
export function pickupWeight(string: StringProperties, output: PickupOutput, positionM: Metres, n: number): number {
  const k = modeWavenumber(string.lengthM, n);
  if (output === 'force') return string.tensionN * k * (1 + string.inharmonicityB * n * n);
  return Math.sin(k * positionM);
}

/** True when the pickup reads each mode's velocity rather than its displacement. */
export function pickupReadsVelocity(output: PickupOutput): boolean {
  return output === 'velocity';
}
