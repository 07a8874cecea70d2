import type { RenderOutput } from './render-settings';

/**
 * How a render's level was set, as its row and a note set's manifest say it:
 * - `none`: left in the pickup's physical units;
 * - `peak`: the sample peak brought to its ceiling;
 * - `loudness`: the integrated loudness brought to its target;
 * - `truePeakCeiling`: loudness asked for, but the true-peak ceiling held it below its target;
 * - `truePeakShort`: loudness asked for, but the file is shorter than one 400 ms gating block, so it
 *   has no integrated loudness (ITU-R BS.1770-4) and its true peak was brought to the ceiling instead;
 * - `strengthGain`: a softer strength of a note set, given its note's hardest strength's gain.
 */
export const RENDER_LEVELLINGS = ['none', 'peak', 'loudness', 'truePeakCeiling', 'truePeakShort', 'strengthGain'] as const;
export type RenderLevelling = (typeof RENDER_LEVELLINGS)[number];

const signed = (value: number) => `${value < 0 ? '−' : value > 0 ? '+' : ''}${Math.abs(value).toFixed(1).replace(/\.0$/, '')}`;

/**
 * One line for a render's row when its level is not what the settings asked for, else null:
 * "Held 2.3 LU below the −14 LUFS target by the −1 dBTP true-peak ceiling." Levels as written.
 */
export function levellingNote(levelling: RenderLevelling, output: Pick<RenderOutput, 'normalization'>, integratedLufs: number | null): string | null {
  const { normalization } = output;
  if (normalization.kind !== 'loudness') return null;
  const target = `${signed(normalization.targetLufs)} LUFS`;
  const ceiling = `${signed(normalization.truePeakCeilingDbtp)} dBTP`;
  if (levelling === 'truePeakShort') return `Shorter than one 400 ms loudness block, so it has no integrated loudness: levelled by its true peak to ${ceiling} instead of ${target}.`;
  if (levelling === 'truePeakCeiling') {
    const below = integratedLufs === null ? '' : ` ${(normalization.targetLufs - integratedLufs).toFixed(1)} LU`;
    return `Held${below} below the ${target} target by the ${ceiling} true-peak ceiling.`;
  }
  return null;
}

/**
 * The row's line for a note set: of its notes (each levelled by its hardest strength; the softer
 * ones take that gain), how many the ceiling held below the target, or were levelled by true peak.
 */
export function noteSetLevellingNote(levellings: ReadonlyArray<RenderLevelling>, output: Pick<RenderOutput, 'normalization'>): string | null {
  const { normalization } = output;
  if (normalization.kind !== 'loudness') return null;
  const notes = levellings.filter((levelling) => levelling !== 'strengthGain');
  const held = notes.filter((levelling) => levelling === 'truePeakCeiling').length;
  const short = notes.filter((levelling) => levelling === 'truePeakShort').length;
  const parts: string[] = [];
  if (held > 0) parts.push(`${held} of ${notes.length} notes held below the ${signed(normalization.targetLufs)} LUFS target by the ${signed(normalization.truePeakCeilingDbtp)} dBTP true-peak ceiling`);
  if (short > 0) parts.push(`${short} of ${notes.length} notes shorter than one 400 ms loudness block, levelled by their true peak to ${signed(normalization.truePeakCeilingDbtp)} dBTP`);
  return parts.length === 0 ? null : `${parts.join('; ')} (see the manifest).`;
}
