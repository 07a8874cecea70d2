import { frequencyHzToMidi, midiToNoteName } from '../../../shared/designer/pitch';
import { modeDecayRatePerS, t60FromDecayRate } from '../../../shared/engine/mode-decay';
import { fundamentalFrequencyHz, modeWavenumber } from '../../../shared/engine/mode-frequencies';
import type { Patch } from '../../../shared/patch/patch-schema';

/** What the Details panel says about a preset while it cannot be auditioned: figures from its patch alone. */
export interface PresetFigures {
  /** f0 = √(T/μ) / (2L), the flexible string's fundamental. */
  fundamentalHz: number;
  /** The nearest equal-tempered note (A4 = 440 Hz) and how far f0 lies from it. */
  nearestNote: string;
  centsFromNote: number;
  /** σ1 = b1 + b2·(π/L)², the first mode's decay rate. */
  firstModeDecayPerS: number;
  /** 60 dB fall time of the first mode; null when the patch has no loss. */
  firstModeT60S: number | null;
  /** How the string is set moving: a pluck (displacement only) or a strike (an initial velocity too). */
  excitation: 'pluck' | 'strike';
  summary: string;
}

export function presetFigures(patch: Patch): PresetFigures {
  const { string, damping, excitation, pickup } = patch;
  const fundamentalHz = fundamentalFrequencyHz(string);
  const midi = frequencyHzToMidi(fundamentalHz);
  const firstModeDecayPerS = modeDecayRatePerS(damping, modeWavenumber(string.lengthM, 1));
  const firstModeT60S = t60FromDecayRate(firstModeDecayPerS);
  const struck = excitation.velocityMPerS?.some(([, velocity]) => velocity !== 0) ?? false;
  const summary =
    `A ${number(string.lengthM, 3)} m string at ${number(string.tensionN, 1)} N, ` +
    `${struck ? 'struck' : 'plucked'}, heard through a ${pickup.output} pickup ${number(pickup.positionM, 3)} m from the end.`;
  return {
    fundamentalHz,
    nearestNote: midiToNoteName(midi),
    centsFromNote: Math.round((midi - Math.round(midi)) * 100),
    firstModeDecayPerS,
    firstModeT60S,
    excitation: struck ? 'strike' : 'pluck',
    summary,
  };
}

function number(value: number, maximumFractionDigits: number): string {
  return value.toLocaleString('en', { maximumFractionDigits });
}
