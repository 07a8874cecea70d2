import type { PreviewAnalysis } from './preview-analysis';
import type { SynthesisKernelKind } from './synthesis-kernel';

/**
 * The preview the browser synthesised from a mode table: peak-normalised samples at the table's
 * preview rate. While synthesis runs, `samples` already has its full length and the first
 * `readySamples` of it are final; `complete` turns true once all of it is. A snapshot's samples
 * never change below its `readySamples`: when the finished preview had to be normalised again (a
 * later stretch louder than the first 250 ms), the complete snapshot carries a new array.
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
  /** Which kernel synthesised it: the WebAssembly SIMD one, or the TypeScript fallback. */
  kernel?: SynthesisKernelKind;
  /** The charts' data (spectrum, envelope, waveform columns), once the preview is complete and analysed. */
  analysis?: PreviewAnalysis | null;
}
