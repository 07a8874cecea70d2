/**
 * The preview the browser synthesised from a mode table: peak-normalised samples at the table's
 * preview rate. While synthesis runs, `samples` already has its full length and the first
 * `readySamples` of it are final; `complete` turns true once all of it is.
 */
export interface PreviewSound {
  /** The sequence of the table it was synthesised from. */
  sequence: number;
  sampleRateHz: number;
  samples: Float32Array;
  readySamples: number;
  complete: boolean;
  /** The largest |sample| before normalisation, in the pickup's physical unit (m, m/s or N). */
  physicalPeak: number;
}
