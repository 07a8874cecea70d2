import { availableParallelism } from 'node:os';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import type { OscillatorBank } from '../../shared/engine/oscillator-bank';
import { renderBank } from '../../shared/engine/render-bank';
import { bankWork, splitBank } from '../../shared/engine/split-bank';

const bootPath = fileURLToPath(new URL('./worker-boot.cjs', import.meta.url));
const entryPath = fileURLToPath(new URL('./render-worker.ts', import.meta.url));

/** Below this many mode-samples a render is quicker on the calling thread than split across workers. */
export const PARALLEL_WORK_THRESHOLD = 20_000_000;

function bankBuffers(bank: OscillatorBank): ArrayBuffer[] {
  const arrays = [...Object.values(bank.fast), ...Object.values(bank.slow)].filter(
    (value): value is Float64Array => value instanceof Float64Array,
  );
  return arrays.map((array) => array.buffer as ArrayBuffer);
}

/**
 * Renders oscillator banks on worker threads, one per core: a large bank is split into equal parts,
 * each part rendered on its own thread, and the parts summed. Small banks render inline.
 */
export class RenderPool {
  private readonly workers: Worker[] = [];

  constructor(private readonly size = Math.max(1, availableParallelism())) {}

  private worker(index: number): Worker {
    while (this.workers.length <= index) {
      const worker = new Worker(bootPath, { workerData: { entry: entryPath } });
      worker.unref();
      this.workers.push(worker);
    }
    return this.workers[index];
  }

  private renderOn(index: number, bank: OscillatorBank): Promise<Float64Array> {
    const worker = this.worker(index);
    return new Promise((resolve, reject) => {
      const onMessage = (out: Float64Array) => {
        worker.off('error', onError);
        resolve(out);
      };
      const onError = (error: Error) => {
        worker.off('message', onMessage);
        reject(error);
      };
      worker.once('message', onMessage);
      worker.once('error', onError);
      worker.postMessage(bank, bankBuffers(bank));
    });
  }

  /** Renders a bank (consuming it) into a new buffer of bank.sampleCount samples. */
  async render(bank: OscillatorBank): Promise<Float64Array> {
    if (this.size === 1 || bankWork(bank) < PARALLEL_WORK_THRESHOLD) {
      const out = new Float64Array(bank.sampleCount);
      renderBank(bank, out);
      return out;
    }
    const parts = await Promise.all(splitBank(bank, this.size).map((part, index) => this.renderOn(index, part)));
    const [sum, ...rest] = parts;
    for (const part of rest) for (let s = 0; s < sum.length; s++) sum[s] += part[s];
    return sum;
  }

  async close(): Promise<void> {
    await Promise.all(this.workers.splice(0).map((worker) => worker.terminate()));
  }
}
