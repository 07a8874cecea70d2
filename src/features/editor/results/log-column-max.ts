import type { Hertz } from '../../../../shared/units';

/**
 * Downsamples evenly spaced bins (bin k at k·binHz) to pixel columns of a logarithmic frequency
 * axis from `fromHz` to `toHz`: column c covers [from·r^c, from·r^(c+1)) with r = (to/from)^(1/C),
 * and takes the largest bin inside it, so no peak is lost where many bins share a pixel. Where a
 * column is narrower than a bin (low frequencies), it takes the value interpolated linearly at its
 * centre between the two nearest bins.
 */
export function logColumnMax(values: ArrayLike<number>, binHz: Hertz, fromHz: Hertz, toHz: Hertz, columnCount: number): Float32Array {
  const columns = Math.max(0, Math.floor(columnCount));
  const out = new Float32Array(columns);
  const lastBin = values.length - 1;
  if (lastBin < 0 || !(binHz > 0) || !(toHz > fromHz) || !(fromHz > 0)) return out.fill(NaN);
  const ratio = Math.log(toHz / fromHz) / columns;
  for (let c = 0; c < columns; c++) {
    const lowHz = fromHz * Math.exp(ratio * c);
    const highHz = fromHz * Math.exp(ratio * (c + 1));
    const firstBin = Math.ceil(lowHz / binHz);
    const endBin = Math.min(lastBin, Math.ceil(highHz / binHz) - 1);
    if (firstBin <= endBin) {
      let largest = values[firstBin];
      for (let k = firstBin + 1; k <= endBin; k++) if (values[k] > largest) largest = values[k];
      out[c] = largest;
    } else {
      const centreBin = Math.min(lastBin, Math.sqrt(lowHz * highHz) / binHz);
      const below = Math.min(lastBin, Math.floor(centreBin));
      const above = Math.min(lastBin, below + 1);
      const fraction = centreBin - below;
      out[c] = values[below] + (values[above] - values[below]) * fraction;
    }
  }
  return out;
}
