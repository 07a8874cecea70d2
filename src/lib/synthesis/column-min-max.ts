export interface ColumnMinMax {
  min: Float32Array;
  max: Float32Array;
}

/**
 * Downsamples a signal to one (min, max) pair per pixel column: column c covers samples
 * [⌊c·n/C⌋, ⌊(c + 1)·n/C⌋). When there are more columns than samples, an empty column takes the
 * sample it falls on, so the drawing stays continuous. Every peak survives, however many samples
 * a column holds, which is why a waveform is drawn from this and not from every k-th sample.
 */
export function columnMinMax(samples: ArrayLike<number>, columnCount: number): ColumnMinMax {
  const columns = Math.max(0, Math.floor(columnCount));
  const min = new Float32Array(columns);
  const max = new Float32Array(columns);
  const n = samples.length;
  if (n === 0) return { min, max };
  for (let c = 0; c < columns; c++) {
    const start = Math.floor((c * n) / columns);
    const end = Math.max(start + 1, Math.floor(((c + 1) * n) / columns));
    let low = samples[Math.min(start, n - 1)];
    let high = low;
    for (let i = start + 1; i < end && i < n; i++) {
      const value = samples[i];
      if (value < low) low = value;
      if (value > high) high = value;
    }
    min[c] = low;
    max[c] = high;
  }
  return { min, max };
}
