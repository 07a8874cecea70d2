import type { DampingCoefficients } from '../engine/mode-decay';
import { decayRateFromT60, modeDecayRatePerS, t60FromDecayRate } from '../engine/mode-decay';
import type { StringProperties } from '../engine/mode-frequencies';
import { waveSpeedMPerS } from '../engine/mode-frequencies';
import { fieldIssue, type Validation } from '../patch/field-issue';
import type { Hertz, RadiansPerMetre, Seconds } from '../units';

/** Two decay-time targets: how long the string rings at a low and at a high frequency. */
export interface DecayTargets {
  lowFrequencyHz: Hertz;
  lowT60S: Seconds;
  highFrequencyHz: Hertz;
  highT60S: Seconds;
}

/**
 * Wavenumber at which a stiff string vibrates at frequency f: the positive root of
 * ω² = c²k² + κ²k⁴ with κ² = B·c²·L²/π² (so that k_n = nπ/L gives f_n = n·f0·√(1 + Bn²)).
 * Written as 2ω²/(c² + √(c⁴ + 4κ²ω²)) to stay exact when B is small.
 */
export function wavenumberAtFrequency(string: StringProperties, frequencyHz: Hertz): RadiansPerMetre {
  const c = waveSpeedMPerS(string);
  const omega = 2 * Math.PI * frequencyHz;
  const kappaSquared = (string.inharmonicityB * c * c * string.lengthM * string.lengthM) / (Math.PI * Math.PI);
  const c2 = c * c;
  const kSquared = (2 * omega * omega) / (c2 + Math.sqrt(c2 * c2 + 4 * kappaSquared * omega * omega));
  return Math.sqrt(kSquared);
}

/**
 * The b1 and b2 of the loss model σ(k) = b1 + b2·k² (Bensa et al., JASA 114(2), 2003) that give the
 * two decay times asked for: σ = 3·ln 10 / T60 at each frequency, two equations in b1 and b2.
 * Refuses targets the model cannot meet (the high frequency ringing longer than the low one, or a
 * pair that would need a negative b1), naming the field to change.
 */
export function dampingFromT60(targets: DecayTargets, string: StringProperties): Validation<DampingCoefficients> {
  const { lowFrequencyHz, lowT60S, highFrequencyHz, highT60S } = targets;
  const positives = { lowFrequencyHz, lowT60S, highFrequencyHz, highT60S };
  const issues = Object.entries(positives)
    .filter(([, value]) => !(Number.isFinite(value) && value > 0))
    .map(([key, value]) => fieldIssue([key], 'must be > 0', value));
  if (issues.length > 0) return { ok: false, issues };
  if (!(highFrequencyHz > lowFrequencyHz)) {
    return { ok: false, issues: [fieldIssue(['highFrequencyHz'], `must be > lowFrequencyHz (${lowFrequencyHz})`, highFrequencyHz)] };
  }
  if (highT60S > lowT60S) {
    return {
      ok: false,
      issues: [fieldIssue(['highT60S'], `must be <= lowT60S (${lowT60S}); in this loss model higher modes never ring longer`, highT60S)],
    };
  }
  const kLow = wavenumberAtFrequency(string, lowFrequencyHz);
  const kHigh = wavenumberAtFrequency(string, highFrequencyHz);
  const sigmaLow = decayRateFromT60(lowT60S);
  const sigmaHigh = decayRateFromT60(highT60S);
  const b2M2PerS = (sigmaHigh - sigmaLow) / (kHigh * kHigh - kLow * kLow);
  const b1PerS = sigmaLow - b2M2PerS * kLow * kLow;
  if (b1PerS < 0) {
    const longestLowT60S = lowT60S * (sigmaLow / (sigmaLow - b1PerS));
    return {
      ok: false,
      issues: [
        fieldIssue(
          ['lowT60S'],
          `is too long for highT60S (${highT60S}); it needs a negative b1. Keep it at or below ${longestLowT60S.toPrecision(4)} s or lengthen highT60S`,
          lowT60S,
        ),
      ],
    };
  }
  return { ok: true, value: { b1PerS, b2M2PerS } };
}

/** Decay time of the string at a frequency for given losses (the inverse view of `dampingFromT60`). */
export function t60AtFrequency(damping: DampingCoefficients, string: StringProperties, frequencyHz: Hertz): Seconds | null {
  return t60FromDecayRate(modeDecayRatePerS(damping, wavenumberAtFrequency(string, frequencyHz)));
}
