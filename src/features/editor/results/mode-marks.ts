/**
 * Which modes the chart draws: one per pixel column, the loudest of the modes whose stems fall in
 * that column (x rounded to the pixel), in order of frequency. A table of 4,096 modes thus draws at
 * most one mark per pixel, and a sparse table draws every mode. Returns mode indices (n − 1).
 */
export function loudestModePerColumn(xPx: ArrayLike<number>, levelDb: ArrayLike<number>): number[] {
  const byColumn = new Map<number, number>();
  for (let m = 0; m < xPx.length; m++) {
    const column = Math.round(xPx[m]);
    const held = byColumn.get(column);
    if (held === undefined || levelDb[m] > levelDb[held]) byColumn.set(column, m);
  }
  return [...byColumn.entries()].sort(([a], [b]) => a - b).map(([, m]) => m);
}

/** The index of the value in `xPx` nearest to `px` (−1 when there is none). */
export function nearestModeIndex(xPx: ArrayLike<number>, px: number): number {
  let nearest = -1;
  let distance = Infinity;
  for (let m = 0; m < xPx.length; m++) {
    const d = Math.abs(xPx[m] - px);
    if (d < distance) {
      distance = d;
      nearest = m;
    }
  }
  return nearest;
}
