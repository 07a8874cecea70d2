import type { Decibels } from '../units';

/** Amplitude ratio of a level in dB: 10^(dB/20). */
export function gainFromDecibels(decibels: Decibels): number {
  return 10 ** (decibels / 20);
}

/** Level in dB of an amplitude ratio: 20·log10(ratio); −Infinity for 0. */
export function decibelsFromGain(gain: number): Decibels {
  return 20 * Math.log10(gain);
}
