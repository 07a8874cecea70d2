import type { Patch } from './patch-schema';

/**
 * The patch a new session starts from: a nylon-like string at about G3, plucked by a fingertip a
 * quarter of the way along, read near the bridge. Invented demo values, not a measured string.
 */
export function defaultPatch(name = 'New string'): Patch {
  return {
    name,
    string: { lengthM: 0.65, tensionN: 60.47, linearDensityKgPerM: 9.316e-4, inharmonicityB: 9.2e-5 },
    excitation: {
      displacementM: [
        [0, 0],
        [0.155, 0.0025],
        [0.167, 0.003],
        [0.179, 0.0025],
        [0.65, 0],
      ],
    },
    damping: { b1PerS: 1.1, b2M2PerS: 2e-4 },
    pickup: { positionM: 0.09, output: 'displacement' },
    render: { sampleRateHz: 48000, durationS: 3, maxModes: 4096 },
  };
}
