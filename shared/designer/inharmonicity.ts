import type { Inharmonicity, Metres, Newtons, Pascals } from '../units';

/**
 * Inharmonicity coefficient of a solid round string with pinned ends,
 * B = π³·E·d⁴ / (64·T·L²) (H. Fletcher, JASA 36(1), 1964). Wound strings are stiffer than their
 * mass suggests only through the core: use the core's diameter and modulus for them.
 */
export function inharmonicityFromMaterial(youngsModulusPa: Pascals, diameterM: Metres, tensionN: Newtons, lengthM: Metres): Inharmonicity {
  return (Math.PI ** 3 * youngsModulusPa * diameterM ** 4) / (64 * tensionN * lengthM * lengthM);
}
