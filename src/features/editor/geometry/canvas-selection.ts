/** The handle the keyboard and the typed-number fields act on: a point of a layer, or the pickup. */
export type CanvasSelection = { layer: 'displacement' | 'velocity'; index: number } | { layer: 'pickup' };

/**
 * The next (or previous) handle in reading order: the shape's points left to right, then the
 * strike layer's, then the pickup, wrapping round. `counts` are the interior points per layer.
 */
export function stepSelection(current: CanvasSelection | null, counts: { displacement: number; velocity: number }, direction: 1 | -1): CanvasSelection {
  const order: CanvasSelection[] = [
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
