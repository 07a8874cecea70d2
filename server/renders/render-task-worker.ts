import { parentPort } from 'node:worker_threads';
import JSZip from 'jszip';
import { bankSegment } from '../../shared/engine/bank-segment';
import { computeModeTable } from '../../shared/engine/mode-table';
import type { OscillatorBank } from '../../shared/engine/oscillator-bank';
import { renderBank } from '../../shared/engine/render-bank';
import { renderSampleCount } from '../../shared/engine/render-patch';
import { seededRandom } from '../../shared/random/seeded-random';
import { finishRender } from '../../shared/renders/finish-render';
import { channelBank, channelPickupsM, decayedLengthSamples, patchForOutput, planSegments } from '../../shared/renders/render-plan';
import { encodeWav } from '../audio/encode-wav';
import type { FinishResult, PlanResult, RenderTask, RenderTaskResult, TaskReply, TaskRequest } from './render-tasks';

/** The last channels' oscillators, so the segments of one channel build them once. */
const banks = new Map<string, OscillatorBank>();
const KEPT_BANKS = 4;

function plan(task: Extract<RenderTask, { type: 'plan' }>): PlanResult {
  const patch = patchForOutput(task.patch, task.output);
  const table = computeModeTable(patch);
  const pickupsM = channelPickupsM(patch, task.output);
  const maxSamples = renderSampleCount(patch);
  const full = pickupsM.map((pickupM) => channelBank(patch, table, pickupM, maxSamples));
  const totalSamples = task.output.length.kind === 'untilDecayed' ? decayedLengthSamples(full, patch.render.sampleRateHz, task.output.length.thresholdDb) : maxSamples;
  return { totalSamples, pickupsM, modeCount: table.count, channels: full.map((bank) => ({ segments: planSegments(bank, totalSamples) })) };
}

function segment(task: Extract<RenderTask, { type: 'segment' }>): Float64Array {
  let bank = banks.get(task.cacheKey);
  if (!bank) {
    const table = computeModeTable(task.patch);
    bank = channelBank(task.patch, table, task.pickupM, task.totalSamples);
    banks.set(task.cacheKey, bank);
    while (banks.size > KEPT_BANKS) banks.delete(banks.keys().next().value as string);
  }
  const out = new Float64Array(task.count);
  renderBank(bankSegment(bank, task.start, task.count), out);
  return out;
}

function finish(task: Extract<RenderTask, { type: 'finish' }>): FinishResult {
  const finished = finishRender(task.channels, task.sampleRateHz, task.output, task.fixedGain);
  const encoded = encodeWav(finished.channels, task.sampleRateHz, task.output.format, task.metadata, seededRandom(task.ditherSeed));
  const { channels: _written, ...figures } = finished;
  return { ...figures, bytes: encoded.bytes, clippedCount: encoded.clippedCount };
}

async function zip(task: Extract<RenderTask, { type: 'zip' }>): Promise<Uint8Array> {
  const archive = new JSZip();
  // WAV data hardly compresses; stored entries keep packing fast. The manifest is deflated.
  for (const file of task.files) archive.file(file.name, file.bytes, { compression: file.name.endsWith('.wav') ? 'STORE' : 'DEFLATE' });
  return archive.generateAsync({ type: 'uint8array' });
}

async function run(task: RenderTask): Promise<RenderTaskResult> {
  if (task.type === 'plan') return plan(task);
  if (task.type === 'segment') return { samples: segment(task) };
  if (task.type === 'finish') return finish(task);
  return { bytes: await zip(task) };
}

function transferables(result: RenderTaskResult): ArrayBuffer[] {
  if ('samples' in result) return [result.samples.buffer as ArrayBuffer];
  if ('bytes' in result && result.bytes.byteOffset === 0 && result.bytes.byteLength === result.bytes.buffer.byteLength) return [result.bytes.buffer as ArrayBuffer];
  return [];
}

parentPort?.on('message', (request: TaskRequest) => {
  run(request.task).then(
    (result) => parentPort?.postMessage({ id: request.id, ok: true, result } satisfies TaskReply, transferables(result)),
    (error: unknown) => parentPort?.postMessage({ id: request.id, ok: false, message: error instanceof Error ? error.message : String(error) } satisfies TaskReply),
  );
});
