/** Where a point's nearest approach to a segment falls, and how far away it is. */
export interface SegmentApproach {
  /** |p − foot|, in the units of the coordinates (pixels on the canvas). */
  distance: number;
  /** t in [0, 1]: the foot is a + t·(b − a). */
  alongFraction: number;
}

/**
 * Distance from point p to the segment ab: the foot of the perpendicular,
 * t = ((p − a)·(b − a)) / |b − a|², clamped to [0, 1] so a point beyond an end measures to that end.
 * A segment of zero length measures to a (t = 0).
 */
export function segmentApproach(px: number, py: number, ax: number, ay: number, bx: number, by: number): SegmentApproach {
  const dx = bx - ax;
  const dy = by - ay;
  const lengthSquared = dx * dx + dy * dy;
  const t = lengthSquared > 0 ? Math.min(1, Math.max(0, ((px - ax) * dx + (py - ay) * dy) / lengthSquared)) : 0;
  return { distance: Math.hypot(px - (ax + t * dx), py - (ay + t * dy)), alongFraction: t };
}
