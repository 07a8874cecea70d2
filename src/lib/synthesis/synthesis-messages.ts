import type { Patch } from '../../../shared/patch/patch-schema';
import type { PreviewAnalysis, WaveformColumns } from './preview-analysis';
import type { PreviewChunk } from './synthesis-engine';
import type { SynthesisKernelKind } from './synthesis-kernel';

/** What the page asks of the synthesis worker. */
export type SynthesisRequest =
  /** A mode table as encoded on the wire (its buffer transferred); `columns`: the waveform's width, when known. */
  | { type: 'table'; job: number; bytes: Uint8Array; columns: number | null }
  /** The waveform of the finished preview of `job` for another plot width. */
  | { type: 'waveform'; job: number; columns: number }
  /** A note: the patch retuned to a MIDI note and rendered. */
  | { type: 'note'; id: number; patch: Patch; midiNote: number };

/** What the synthesis worker answers. Sample and chart arrays are transferred, not copied. */
export type SynthesisReply =
  | ({ type: 'chunk' } & PreviewChunk)
  | { type: 'analysis'; job: number; analysis: PreviewAnalysis }
  | { type: 'waveform'; job: number; waveform: WaveformColumns }
  | { type: 'note'; id: number; samples: Float32Array; sampleRateHz: number; kernel: SynthesisKernelKind }
  | { type: 'note-refused'; id: number; error: string }
  | { type: 'refused'; job: number; reason: string }
  | { type: 'kernel'; kind: SynthesisKernelKind; fallbackReason: string | null };

/** A message port as both a dedicated worker's global scope and a Worker object present it. */
export interface SynthesisPort<In, Out> {
  postMessage(message: Out, transfer: Transferable[]): void;
  onmessage: ((event: MessageEvent<In>) => void) | null;
}
