import type { Hertz, KilogramsPerMetre, Metres, Newtons } from '../units';

/**
 * Tension that tunes a flexible string to a fundamental f0, from Mersenne's law
 * f0 = √(T/μ)/(2L):  T = μ·(2L·f0)²  (Fletcher & Rossing, ch. 2).
 */
export function tensionForPitchN(lengthM: Metres, linearDensityKgPerM: KilogramsPerMetre, frequencyHz: Hertz): Newtons {
  const twoLf = 2 * lengthM * frequencyHz;
  return linearDensityKgPerM * twoLf * twoLf;
}

/** Speaking length that tunes a string of given tension and density to f0: L = √(T/μ)/(2·f0). */
export function lengthForPitchM(tensionN: Newtons, linearDensityKgPerM: KilogramsPerMetre, frequencyHz: Hertz): Metres {
  return Math.sqrt(tensionN / linearDensityKgPerM) / (2 * frequencyHz);
}
