import type { PartChanges } from '../../../../shared/collab/excitation-part-edits';
import type { ExcitationPart } from '../../../../shared/patch/excitation-part';

/**
 * What an arrow key does to a selected pluck or strike, as the points move: left and right 1 mm
 * along the string, up and down 0.1 mm of height (0.01 m/s of a strike's velocity); with Shift a
 * tenth of that. Null for any other key.
 */
export function partKeyChanges(part: ExcitationPart, key: string, fine: boolean): PartChanges | null {
  const scale = fine ? 0.1 : 1;
  const along = ({ ArrowLeft: -1, ArrowRight: 1 } as Record<string, number>)[key];
  const upDown = ({ ArrowUp: 1, ArrowDown: -1 } as Record<string, number>)[key];
  if (along !== undefined) return { positionM: part.positionM + (along * scale) / 1000 };
  if (upDown === undefined) return null;
  return part.kind === 'pluck' ? { heightM: part.heightM + upDown * scale * 1e-4 } : { velocityMPerS: part.velocityMPerS + upDown * scale * 1e-2 };
}
