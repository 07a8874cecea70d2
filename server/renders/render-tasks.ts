import type { Patch } from '../../shared/patch/patch-schema';
import type { RenderSegment } from '../../shared/renders/render-plan';
import type { RenderLevelling } from '../../shared/renders/render-levelling';
import type { RenderOutput } from '../../shared/renders/render-settings';
import type { WavMetadata } from '../audio/encode-wav';

/**
 * The work a render job is cut into, each piece run on a worker thread of the render pool. The main
 * thread only sends these, copies segments into place and writes files, so its event loop stays
 * free while a job renders.
 */
export type RenderTask =
  /** Length and segments of each channel of a patch. */
  | { type: 'plan'; patch: Patch; output: RenderOutput }
  /** Samples [start, start + count) of every channel (the worker keeps the render's oscillators between segments). */
  | { type: 'segment'; cacheKey: string; patch: Patch; pickupsM: number[]; totalSamples: number; start: number; count: number }
  /** Cut, fade, level, measure and encode the channels as a WAV file. */
  | { type: 'finish'; channels: Float64Array[]; sampleRateHz: number; output: RenderOutput; metadata: WavMetadata; ditherSeed: number; fixedGain?: number }
  /** Pack files into a ZIP. */
  | { type: 'zip'; files: Array<{ name: string; bytes: Uint8Array }> }
  /** A preset's short audition file: the preview patch rendered, at the audition level, 16-bit. */
  | { type: 'preview'; patch: Patch; metadata: WavMetadata };

export interface PlanResult {
  totalSamples: number;
  /** One pickup per channel. */
  pickupsM: number[];
  segments: RenderSegment[];
}

export interface FinishResult {
  bytes: Uint8Array;
  frames: number;
  durationS: number;
  peakDbfs: number;
  truePeakDbtp: number;
  integratedLufs: number;
  gain: number;
  cutSample: number | null;
  limitedByTruePeak: boolean;
  levelling: RenderLevelling;
  clippedCount: number;
}

export type RenderTaskResult = PlanResult | { channels: Float64Array[] } | FinishResult | { bytes: Uint8Array };

/** Messages between the pool and a worker. */
export interface TaskRequest {
  id: number;
  task: RenderTask;
}
export type TaskReply = { id: number; ok: true; result: RenderTaskResult } | { id: number; ok: false; message: string };
