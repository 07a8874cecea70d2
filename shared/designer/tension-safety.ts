import type { Metres, Newtons, Pascals } from '../units';
import { MATERIALS, type MaterialId } from './materials';

/**
 * How close a string's tension comes to breaking it.
 * - `ok`: under 70 % of the material's minimum tensile strength
 * - `caution`: 70–85 %
 * - `danger`: 85–100 %
 * - `beyond`: at or above the minimum strength
 * - `unknown`: no strength figure (wound strings): the maker's rating rules
 * The thresholds are our own margins (common practice of keeping well clear of the minimum), not a
 * published standard; every message defers to the string maker's rating and local practice.
 */
export type TensionSafetyLevel = 'ok' | 'caution' | 'danger' | 'beyond' | 'unknown';

export interface TensionSafety {
  level: TensionSafetyLevel;
  stressPa: Pascals;
  strengthPa: Pascals | null;
  /** stress / strength, or null when the strength is unknown. */
  fractionOfStrength: number | null;
  message: string;
}

export const SAFETY_THRESHOLDS = { caution: 0.7, danger: 0.85, beyond: 1 } as const;

const DEFER = "Real strings can snap: the string maker's rating and local practice rule over this estimate.";

/** Tensile stress of a plain solid round string, T / (π·d²/4). */
export function tensileStressPa(tensionN: Newtons, diameterM: Metres): Pascals {
  return tensionN / ((Math.PI * diameterM * diameterM) / 4);
}

/** Compares a solid string's tensile stress with its material's minimum tensile strength. */
export function tensionSafety(tensionN: Newtons, diameterM: Metres, materialId: MaterialId): TensionSafety {
  const material = MATERIALS[materialId];
  const stressPa = tensileStressPa(tensionN, diameterM);
  const strengthPa = material.tensileStrengthPa(diameterM);
  if (strengthPa === null) {
    return { level: 'unknown', stressPa, strengthPa, fractionOfStrength: null, message: `No strength figure for ${material.label.toLowerCase()}s. ${DEFER}` };
  }
  const fraction = stressPa / strengthPa;
  const percent = Math.round(fraction * 100);
  const level: TensionSafetyLevel =
    fraction >= SAFETY_THRESHOLDS.beyond ? 'beyond' : fraction >= SAFETY_THRESHOLDS.danger ? 'danger' : fraction >= SAFETY_THRESHOLDS.caution ? 'caution' : 'ok';
  const lead: Record<Exclude<TensionSafetyLevel, 'unknown'>, string> = {
    ok: `Stress is ${percent} % of the typical minimum strength.`,
    caution: `Stress is ${percent} % of the typical minimum strength: near the limit.`,
    danger: `Stress is ${percent} % of the typical minimum strength: a real string is likely to break.`,
    beyond: `Stress is ${percent} % of the typical minimum strength: a real string would break.`,
  };
  return { level, stressPa, strengthPa, fractionOfStrength: fraction, message: `${lead[level]} ${DEFER}` };
}
