import { partsMakeLayer } from '../../../../shared/patch/excitation-part';
import type { Patch } from '../../../../shared/patch/patch-schema';

/**
 * The handle the keyboard and the typed-number fields act on: a point of a layer, a pluck or strike
 * (`part`, its index in `excitation.parts`), or the pickup.
 */
export type CanvasSelection = { layer: 'displacement' | 'velocity' | 'part'; index: number } | { layer: 'pickup' };

/**
 * The next (or previous) handle in reading order: the plucks and strikes, then the shape's points
 * left to right, then the strike layer's, then the pickup, wrapping round. `counts` are the
 * handles per kind (0 points for a layer made by plucks or strikes: those move with their handle).
 */
export function stepSelection(current: CanvasSelection | null, counts: { displacement: number; velocity: number; parts?: number }, direction: 1 | -1): CanvasSelection {
  const order: CanvasSelection[] = [
    ...Array.from({ length: counts.parts ?? 0 }, (_, index) => ({ layer: 'part' as const, index })),
    ...Array.from({ length: counts.displacement }, (_, index) => ({ layer: 'displacement' as const, index })),
    ...Array.from({ length: counts.velocity }, (_, index) => ({ layer: 'velocity' as const, index })),
    { layer: 'pickup' as const },
  ];
  const at = current ? order.findIndex((item) => sameSelection(item, current)) : -1;
  if (at < 0) return direction === 1 ? order[0] : order[order.length - 1];
  return order[(at + direction + order.length) % order.length];
}

export function sameSelection(a: CanvasSelection | null, b: CanvasSelection | null): boolean {
  if (!a || !b || a.layer !== b.layer) return false;
  return a.layer === 'pickup' || a.index === (b as { index: number }).index;
}

/**
 * The keyboard's handles on a patch's excitation: every pluck and strike, and the points of a layer
 * not made by them (the strike layer's only when it is shown).
 */
export function selectionCounts(excitation: Patch['excitation'], showStrike: boolean): { displacement: number; velocity: number; parts: number } {
  const velocityPoints = showStrike ? Math.max(0, (excitation.velocityMPerS?.length ?? 2) - 2) : 0;
  return {
    parts: excitation.parts?.length ?? 0,
    displacement: partsMakeLayer(excitation.parts, 'displacement') ? 0 : excitation.displacementM.length - 2,
    velocity: partsMakeLayer(excitation.parts, 'velocity') ? 0 : velocityPoints,
  };
}
