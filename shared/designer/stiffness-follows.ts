import type { Hertz, Inharmonicity, KilogramsPerMetre, Metres, Newtons } from '../units';
import { tensionForPitchN } from './tension-for-pitch';

/**
 * How B follows the tension and the length of a given string. With B = π³E d⁴/(64·T·L²)
 * (H. Fletcher, JASA 36(1), 1964), material and gauge fixed:
 * - new tension at the same length: B·T stays, so B' = B·T/T';
 * - new length at the same tension: B·L² stays, so B' = B·(L/L')².
 */
export function inharmonicityForTension(inharmonicityB: Inharmonicity, tensionN: Newtons, newTensionN: Newtons): Inharmonicity {
  return (inharmonicityB * tensionN) / newTensionN;
}

export function inharmonicityForLength(inharmonicityB: Inharmonicity, lengthM: Metres, newLengthM: Metres): Inharmonicity {
  return inharmonicityB * (lengthM / newLengthM) ** 2;
}

/**
 * The tension and B that put the first partial f1 = f0·√(1 + B) of a string of fixed material,
 * gauge and length on a frequency: the bending term β = B·T stays, f1² = (T + β)/(4L²μ), so
 * T' = μ(2L·f)² − β and B' = β/T' (the relation of `tensionForStiffPitchN`). Null when the string
 * is too stiff to come down to that pitch (T' ≤ 0).
 */
export function retunedByTension(
  string: { lengthM: Metres; tensionN: Newtons; linearDensityKgPerM: KilogramsPerMetre; inharmonicityB: Inharmonicity },
  frequencyHz: Hertz,
): { tensionN: Newtons; inharmonicityB: Inharmonicity } | null {
  const bendingN = string.inharmonicityB * string.tensionN;
  const tensionN = tensionForPitchN(string.lengthM, string.linearDensityKgPerM, frequencyHz) - bendingN;
  if (!(tensionN > 0)) return null;
  return { tensionN, inharmonicityB: bendingN / tensionN };
}
