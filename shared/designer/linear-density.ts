import type { KilogramsPerCubicMetre, KilogramsPerMetre, Metres } from '../units';

/** Mass per unit length of a solid round string: μ = ρ·π·d²/4. */
export function linearDensityFromMaterial(densityKgPerM3: KilogramsPerCubicMetre, diameterM: Metres): KilogramsPerMetre {
  return (densityKgPerM3 * Math.PI * diameterM * diameterM) / 4;
}

/**
 * Mass per unit length of a round core with one close-wound round wrap: the core, plus the wrap
 * wire's own μ times the length of wire per unit length of string, π·(d_core + d_wrap)/d_wrap
 * (one turn per wrap diameter around the wrap's centre line; geometry, derived here). Real strings
 * differ by a few per cent with the winding's tightness; the maker's figure wins where known.
 */
export function woundLinearDensityKgPerM(
  core: { densityKgPerM3: KilogramsPerCubicMetre; diameterM: Metres },
  wrap: { densityKgPerM3: KilogramsPerCubicMetre; diameterM: Metres },
): KilogramsPerMetre {
  const wrapWire = linearDensityFromMaterial(wrap.densityKgPerM3, wrap.diameterM);
  return linearDensityFromMaterial(core.densityKgPerM3, core.diameterM) + (wrapWire * Math.PI * (core.diameterM + wrap.diameterM)) / wrap.diameterM;
}
