import type { Hertz, KilogramsPerMetre, Metres, Newtons, Pascals } from '../units';

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

/**
 * Tension that puts the first partial of a stiff solid string, f1 = f0·√(1 + B), on a target
 * frequency. With B = β/T, β = π³·E·d⁴/(64·L²) (Fletcher 1964), f1² = (T + β)/(4·L²·μ), so
 * T = μ·(2L·f1)² − β exactly. Returns a value ≤ 0 when the string is too stiff to reach the pitch.
 * For wound strings pass the core's modulus and diameter.
 */
export function tensionForStiffPitchN(
  lengthM: Metres,
  linearDensityKgPerM: KilogramsPerMetre,
  frequencyHz: Hertz,
  youngsModulusPa: Pascals,
  diameterM: Metres,
): Newtons {
  const beta = (Math.PI ** 3 * youngsModulusPa * diameterM ** 4) / (64 * lengthM * lengthM);
  return tensionForPitchN(lengthM, linearDensityKgPerM, frequencyHz) - beta;
}
