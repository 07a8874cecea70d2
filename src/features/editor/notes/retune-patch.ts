import { midiToFrequencyHz } from '../../../../shared/designer/pitch';
import { fundamentalFrequencyHz } from '../../../../shared/engine/mode-frequencies';
import type { Patch } from '../../../../shared/patch/patch-schema';

/**
 * The same string tuned to another note by its tension, as a player would: f0 ∝ √T (Mersenne), so
 * T' = T·(f'/f0)²; the stiffness B = π³Ed⁴/(64TL²) falls as the tension rises, B' = B·T/T'.
 */
export function retunePatch(patch: Patch, midiNote: number): Patch {
  const targetHz = midiToFrequencyHz(midiNote);
  const ratio = targetHz / fundamentalFrequencyHz(patch.string);
  const tensionN = patch.string.tensionN * ratio * ratio;
  return { ...patch, string: { ...patch.string, tensionN, inharmonicityB: (patch.string.inharmonicityB * patch.string.tensionN) / tensionN } };
}
