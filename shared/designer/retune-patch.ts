import { assert } from '../assert';
import type { Patch, Polyline } from '../patch/patch-schema';
import type { Metres, MidiNote } from '../units';
import { midiToFrequencyHz } from './pitch';
import { tensionForPitchN } from './tension-for-pitch';

/** What is changed to put the string on another note: its tension (as a player tunes) or its speaking length (as a fret or another string of the set would). */
export type RetuneBy = 'tension' | 'length';

/** The polyline with every x moved by x' = (x/L)·L', so each point keeps its fraction of the string and the ends land exactly on 0 and L'. */
function rescaledPolyline(points: Polyline, lengthM: Metres, newLengthM: Metres): Array<[number, number]> {
  return points.map(([x, value]) => [(x / lengthM) * newLengthM, value]);
}

/**
 * The same string tuned so that its first partial, stiffness included, sounds a MIDI note exactly:
 * f1 = f0·√(1 + B) = f with f = 440·2^((n − 69)/12) (MIDI Tuning Standard) and f0 = √(T/μ)/(2L)
 * (Mersenne), B = π³Ed⁴/(64·T·L²) (H. Fletcher, JASA 36(1), 1964).
 *
 * - By tension: the bending term β = B·T = π³Ed⁴/(64L²) stays, so f1² = (T + β)/(4L²μ) and
 *   T' = μ·(2L·f)² − β exactly (the relation of `tensionForStiffPitchN`), B' = β/T'. A string too
 *   stiff to come down to the note gets T' ≤ 0 (its B is then left as it was): `validatePatch`
 *   refuses that patch, naming `string.tensionN`.
 * - By length: at fixed tension B·L² = π³Ed⁴/(64T) stays, so with u = 1/L'² and a = B·L²,
 *   f² = (T/(4μ))·(u + a·u²); the positive root u = 2c/(1 + √(1 + 4ac)), c = 4μf²/T (written so
 *   that it stays exact as B → 0, where u = c), gives L' = 1/√u and B' = a·u = B·(L/L')². Every
 *   excitation point (displacement and velocity) and the pickup move to the same fraction of the
 *   new length, x' = x·L'/L, so the pluck and the pickup sit where they did relative to the ends.
 *   A root always exists.
 *
 * Everything else in the patch (density, losses, render settings, extra fields) is kept.
 */
export function retunePatch(patch: Patch, midiNote: MidiNote, by: RetuneBy): Patch {
  const targetHz = midiToFrequencyHz(midiNote);
  const { lengthM, tensionN, linearDensityKgPerM, inharmonicityB } = patch.string;
  if (by === 'tension') {
    const bendingN = inharmonicityB * tensionN;
    const newTensionN = tensionForPitchN(lengthM, linearDensityKgPerM, targetHz) - bendingN;
    const newB = newTensionN > 0 ? bendingN / newTensionN : inharmonicityB;
    return { ...patch, string: { ...patch.string, tensionN: newTensionN, inharmonicityB: newB } };
  }
  assert(by === 'length', `a string is retuned by tension or by length, got ${String(by)}`);
  const stiffnessM2 = inharmonicityB * lengthM * lengthM;
  const flexible = (4 * linearDensityKgPerM * targetHz * targetHz) / tensionN;
  const inverseSquareLength = (2 * flexible) / (1 + Math.sqrt(1 + 4 * stiffnessM2 * flexible));
  const newLengthM = 1 / Math.sqrt(inverseSquareLength);
  const { velocityMPerS } = patch.excitation;
  return {
    ...patch,
    string: { ...patch.string, lengthM: newLengthM, inharmonicityB: stiffnessM2 * inverseSquareLength },
    excitation: {
      ...patch.excitation,
      displacementM: rescaledPolyline(patch.excitation.displacementM, lengthM, newLengthM),
      ...(velocityMPerS ? { velocityMPerS: rescaledPolyline(velocityMPerS, lengthM, newLengthM) } : {}),
    },
    pickup: { ...patch.pickup, positionM: (patch.pickup.positionM / lengthM) * newLengthM },
  };
}
