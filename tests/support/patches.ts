import type { PatchInput } from '../../shared/patch/patch-schema';

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
