/** The largest difference between two signals, as a fraction of the first one's peak. */
export function peakRelativeDifference(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let peak = 0;
  let worst = 0;
  for (let i = 0; i < a.length; i++) {
    peak = Math.max(peak, Math.abs(a[i]));
    worst = Math.max(worst, Math.abs(a[i] - b[i]));
  }
  return worst / peak;
}
