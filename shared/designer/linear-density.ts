import type { KilogramsPerCubicMetre, KilogramsPerMetre, Metres } from '../units';

/** Mass per unit length of a solid round string: μ = ρ·π·d²/4. */
export function linearDensityFromMaterial(densityKgPerM3: KilogramsPerCubicMetre, diameterM: Metres): KilogramsPerMetre {
  return (densityKgPerM3 * Math.PI * diameterM * diameterM) / 4;
}
