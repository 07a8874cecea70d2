import { setPriority } from 'node:os';
import { parentPort, workerData } from 'node:worker_threads';
import JSZip from 'jszip';
import { bankSegment } from '../../shared/engine/bank-segment';
import { computeModeTable } from '../../shared/engine/mode-table';
import type { OscillatorBank } from '../../shared/engine/oscillator-bank';
import { renderSampleCount } from '../../shared/engine/render-patch';
import { seededRandom } from '../../shared/random/seeded-random';
import { finishRender } from '../../shared/renders/finish-render';
import { channelPickupsM, decayedLengthSamples, patchForOutput, planSegments, renderBankFor } from '../../shared/renders/render-plan';
import { createWasmBankRenderer, type BankRenderer } from '../engine-wasm/wasm-bank-renderer';
import { renderBank } from '../../shared/engine/render-bank';
import { renderBankStereo } from '../../shared/engine/render-bank-stereo';
import { encodeWav } from '../audio/encode-wav';
import { normalizePeak } from '../../shared/audio/normalize-peak';
import { AUDITION_PEAK_DBFS } from '../../shared/audio/wav-format';
import { previewPatch } from '../../shared/engine/preview-patch';
import { renderPatch } from '../../shared/engine/render-patch';
import type { FinishResult, PlanResult, RenderTask, RenderTaskResult, TaskReply, TaskRequest } from './render-tasks';

// Renders yield the processor to the server's own thread: on Linux a nice value belongs to a thread,
// and `setPriority(0, …)` sets this worker's alone, so requests and live edits keep their turn.
try {
  setPriority(0, 10);
} catch {
  // Not permitted or not supported here: run at normal priority.
}

/** The WebAssembly SIMD kernel when it loads here; the TypeScript kernels otherwise (same samples, slower). */
const renderSegmentBank: BankRenderer = (() => {
  try {
    return createWasmBankRenderer((workerData as { wasmPath?: string } | null)?.wasmPath);
  } catch {
    return (bank, outs) => (outs.length === 2 ? renderBankStereo(bank, outs[0], outs[1]) : renderBank(bank, outs[0]));
  }
})();

/** The last renders' oscillators, so the segments of one render build them once. */
const banks = new Map<string, OscillatorBank>();
const KEPT_BANKS = 4;

function plan(task: Extract<RenderTask, { type: 'plan' }>): PlanResult {
  const patch = patchForOutput(task.patch, task.output);
  const table = computeModeTable(patch);
  const pickupsM = channelPickupsM(patch, task.output);
  const maxSamples = renderSampleCount(patch);
  const bank = renderBankFor(patch, table, pickupsM, maxSamples);
  const totalSamples = task.output.length.kind === 'untilDecayed' ? decayedLengthSamples(bank, patch.render.sampleRateHz, task.output.length.thresholdDb) : maxSamples;
  return { totalSamples, pickupsM, segments: planSegments(bank, totalSamples) };
}

function segment(task: Extract<RenderTask, { type: 'segment' }>): Float64Array[] {
  let bank = banks.get(task.cacheKey);
  if (!bank) {
    bank = renderBankFor(task.patch, computeModeTable(task.patch), task.pickupsM, task.totalSamples);
    banks.set(task.cacheKey, bank);
    while (banks.size > KEPT_BANKS) banks.delete(banks.keys().next().value as string);
  }
  const outs = task.pickupsM.map(() => new Float64Array(task.count));
  renderSegmentBank(bankSegment(bank, task.start, task.count), outs);
  return outs;
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

/** A preset's audition: short, at no more than the preview rate, peaking at the audition level (seeded dither, so it repeats). */
function preview(task: Extract<RenderTask, { type: 'preview' }>): Uint8Array {
  const samples = renderPatch(previewPatch(task.patch));
  normalizePeak(samples, AUDITION_PEAK_DBFS);
  return encodeWav(samples, previewPatch(task.patch).render.sampleRateHz, 'pcm16', task.metadata, seededRandom(1)).bytes;
}

async function run(task: RenderTask): Promise<RenderTaskResult> {
  if (task.type === 'preview') return { bytes: preview(task) };
  if (task.type === 'plan') return plan(task);
  if (task.type === 'segment') return { channels: segment(task) };
  if (task.type === 'finish') return finish(task);
  return { bytes: await zip(task) };
}

function transferables(result: RenderTaskResult): ArrayBuffer[] {
  if ('channels' in result) return result.channels.map((channel) => channel.buffer as ArrayBuffer);
  if ('bytes' in result && result.bytes.byteOffset === 0 && result.bytes.byteLength === result.bytes.buffer.byteLength) return [result.bytes.buffer as ArrayBuffer];
  return [];
}

parentPort?.on('message', (request: TaskRequest) => {
  run(request.task).then(
    (result) => parentPort?.postMessage({ id: request.id, ok: true, result } satisfies TaskReply, transferables(result)),
    (error: unknown) => parentPort?.postMessage({ id: request.id, ok: false, message: error instanceof Error ? error.message : String(error) } satisfies TaskReply),
  );
});
