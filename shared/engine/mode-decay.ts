import type { PerSecond, RadiansPerMetre, Seconds, SquareMetresPerSecond } from '../units';

export interface DampingCoefficients {
  b1PerS: PerSecond;
  b2M2PerS: SquareMetresPerSecond;
}

/** Natural log of 1000: a 60 dB fall in amplitude is a factor of 1000. */
export const NEPERS_PER_60_DB = 3 * Math.LN10;

/**
 * Decay rate of a mode, σ_n = b1 + b2·k_n², for the loss terms −2b1·y_t + 2b2·y_txx
 * (Bensa, Bilbao, Kronland-Martinet & Smith, JASA 114(2), 2003). Each mode's envelope is e^(−σ_n t).
 */
export function modeDecayRatePerS(damping: DampingCoefficients, wavenumber: RadiansPerMetre): PerSecond {
  return damping.b1PerS + damping.b2M2PerS * wavenumber * wavenumber;
}

/** Time for an envelope e^(−σt) to fall by 60 dB: T60 = 3·ln 10 / σ. Null when σ = 0 (no loss). */
export function t60FromDecayRate(decayRatePerS: PerSecond): Seconds | null {
  return decayRatePerS > 0 ? NEPERS_PER_60_DB / decayRatePerS : null;
}

/** Inverse of `t60FromDecayRate`: σ = 3·ln 10 / T60. */
export function decayRateFromT60(t60S: Seconds): PerSecond {
  return NEPERS_PER_60_DB / t60S;
}
