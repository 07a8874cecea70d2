import type { Patch, PatchInput } from '../../shared/patch/patch-schema';
import { validatePatch } from '../../shared/patch/validate-patch';

/** A triangular pluck of height h at x = p on a string of length L, released from rest. */
export function trianglePluck(lengthM: number, positionM: number, heightM: number): [number, number][] {
  return [
    [0, 0],
    [positionM, heightM],
    [lengthM, 0],
  ];
}

/**
 * A nylon-like test string: L = 0.65 m, T = 70 N, μ = 6·10⁻⁴ kg/m (the check case of the team's
 * reference sheet), plucked 3 mm high at 0.17 m. Invented test data, not a measured string.
 */
export function testPatch(overrides: Partial<PatchInput> = {}): PatchInput {
  return {
    name: 'Test pluck',
    string: { lengthM: 0.65, tensionN: 70, linearDensityKgPerM: 6e-4, inharmonicityB: 0 },
    excitation: { displacementM: trianglePluck(0.65, 0.17, 0.003) },
    damping: { b1PerS: 0.5, b2M2PerS: 1e-4 },
    pickup: { positionM: 0.1, output: 'displacement' },
    render: { sampleRateHz: 48000, durationS: 1, maxModes: 4096 },
    ...overrides,
  };
}

/** A patch that must be valid, checked by validatePatch; a problem throws with every message. */
export function validPatch(input: unknown): Patch {
  const result = validatePatch(input);
  if (!result.ok) throw new Error(result.issues.map((issue) => issue.message).join('; '));
  return result.value;
}

/**
 * A rounded pluck at 0.17 m (3 mm high, its top 40 mm wide) with a strike of 0.8 m/s at 0.42 m: an
 * excitation with both layers for the test string. Invented test data.
 */
export function pluckedAndStruck(): Pick<PatchInput['excitation'], 'displacementM' | 'velocityMPerS'> {
  return {
    displacementM: [
      [0, 0],
      [0.15, 0.0027],
      [0.17, 0.003],
      [0.19, 0.0027],
      [0.65, 0],
    ],
    velocityMPerS: [
      [0, 0],
      [0.4, 0],
      [0.42, 0.8],
      [0.44, 0],
      [0.65, 0],
    ],
  };
}
