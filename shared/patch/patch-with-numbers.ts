import type { PatchNumberField } from './field-rules';
import type { Patch, Polyline } from './patch-schema';

const scaled = (points: Polyline, scale: number): Array<[number, number]> => points.map(([x, value]) => [x * scale, value]);

/**
 * The patch as it would be with some numeric fields changed, the way the shared document changes
 * them: a new length carries every excitation point and the pickup to the same fraction of the
 * string. For checking a change (with `validatePatch`) before or after it is written.
 */
export function patchWithNumbers(patch: Patch, values: Partial<Record<PatchNumberField, number>>): Patch {
  const next: Patch = { ...patch, string: { ...patch.string }, damping: { ...patch.damping }, pickup: { ...patch.pickup }, render: { ...patch.render } };
  for (const [field, value] of Object.entries(values) as Array<[PatchNumberField, number]>) {
    const [section, key] = field.split('.') as ['string' | 'damping' | 'pickup' | 'render', string];
    if (field === 'string.lengthM') {
      const scale = value / patch.string.lengthM;
      next.excitation = {
        ...patch.excitation,
        displacementM: scaled(patch.excitation.displacementM, scale),
        ...(patch.excitation.velocityMPerS ? { velocityMPerS: scaled(patch.excitation.velocityMPerS, scale) } : {}),
      };
      next.pickup.positionM = patch.pickup.positionM * scale;
    }
    (next[section] as Record<string, unknown>)[key] = value;
  }
  return next;
}
