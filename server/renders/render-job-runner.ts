import type { Patch } from '../../shared/patch/patch-schema';
import { patchForOutput } from '../../shared/renders/render-plan';
import type { RenderOutput } from '../../shared/renders/render-settings';
import type { WavMetadata } from '../audio/encode-wav';
import type { RenderTaskPool } from './render-task-pool';
import type { FinishResult } from './render-tasks';

/** Share of a single render's progress given to rendering; the rest is levelling and encoding. */
const RENDER_SHARE = 0.9;

/** Reports a job's progress as a fraction 0–1. */
export type ProgressSink = (fraction: number) => void;

/**
 * One WAV file from a patch: plans the channels on a worker, renders their segments on every
 * worker of the pool at once (in time order, so the first seconds finish first), joins them and
 * hands them to a worker to cut, level, measure and encode. Progress follows the mode-samples done.
 * `fileKey` tells the files of one job apart (the workers keep each channel's oscillators by it).
 */
export async function renderWavFile(pool: RenderTaskPool, job: { id: string; fileKey: string }, patch: Patch, output: RenderOutput, metadata: WavMetadata, ditherSeed: number, onProgress: ProgressSink, fixedGain?: number): Promise<FinishResult> {
  const jobId = job.id;
  const forOutput = patchForOutput(patch, output);
  const plan = await pool.run(jobId, { type: 'plan', patch, output });
  const totalWork = plan.segments.reduce((sum, segment) => sum + segment.work, 0);
  let doneWork = 0;
  const channels = plan.pickupsM.map(() => new Float64Array(plan.totalSamples));
  await Promise.all(
    plan.segments.map(async (segment) => {
      const rendered = await pool.run(jobId, {
        type: 'segment',
        cacheKey: `${jobId}:${job.fileKey}`,
        patch: forOutput,
        pickupsM: plan.pickupsM,
        totalSamples: plan.totalSamples,
        start: segment.start,
        count: segment.count,
      });
      rendered.channels.forEach((samples, c) => channels[c].set(samples, segment.start));
      doneWork += segment.work;
      onProgress((RENDER_SHARE * doneWork) / totalWork);
    }),
  );
  const finished = await pool.run(
    jobId,
    { type: 'finish', channels, sampleRateHz: output.sampleRateHz, output, metadata, ditherSeed, fixedGain },
    channels.map((channel) => channel.buffer as ArrayBuffer),
  );
  onProgress(1);
  return finished;
}
