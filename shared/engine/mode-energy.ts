import type { Joules, KilogramsPerMetre, Metres, MetresPerSecond, RadiansPerSecond } from '../units';

/**
 * Energy of one mode of a string pinned at both ends, E_n = (μL/4)(ω_n² a_n² + v_n²), where a_n and
 * v_n are the mode's initial displacement and velocity amplitudes (Fletcher & Rossing ch. 2; the
 * kinetic and potential energies of sin(k_n x) integrate to L/2 over the string).
 */
export function modeEnergyJ(
  linearDensityKgPerM: KilogramsPerMetre,
  lengthM: Metres,
  angularFrequency: RadiansPerSecond,
  displacementAmplitudeM: Metres,
  velocityAmplitudeMPerS: MetresPerSecond,
): Joules {
  const w = angularFrequency;
  return (
    ((linearDensityKgPerM * lengthM) / 4) *
    (w * w * displacementAmplitudeM * displacementAmplitudeM + velocityAmplitudeMPerS * velocityAmplitudeMPerS)
  );
}
