import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import type { Patch } from '../../shared/patch/patch-schema';
import type { ComputeOutput } from './compute-patch';

const bootPath = fileURLToPath(new URL('../engine-pool/worker-boot.cjs', import.meta.url));
const entryPath = fileURLToPath(new URL('./compute-worker-entry.ts', import.meta.url));

/** One worker thread for live computes, restarted if it ever dies; requests answer in order. */
export class ComputeWorker {
  private worker: Worker | null = null;
  private nextId = 1;
  private readonly waiting = new Map<number, { resolve: (output: ComputeOutput) => void; reject: (error: Error) => void }>();

  private start(): Worker {
    const worker = new Worker(bootPath, { workerData: { entry: entryPath } });
    worker.unref();
    worker.on('message', ({ id, output, error }: { id: number; output?: ComputeOutput; error?: string }) => {
      const waiter = this.waiting.get(id);
      this.waiting.delete(id);
      if (!waiter) return;
      if (output) waiter.resolve(output);
      else waiter.reject(new Error(error ?? 'compute failed'));
    });
    const fail = (error: Error) => {
      this.worker = null;
      for (const waiter of this.waiting.values()) waiter.reject(error);
      this.waiting.clear();
    };
    worker.on('error', fail);
    worker.on('exit', (code) => code !== 0 && fail(new Error(`compute worker stopped (${code})`)));
    return worker;
  }

  compute(patch: Patch, previewDurationS: number): Promise<ComputeOutput> {
    this.worker ??= this.start();
    const id = this.nextId++;
    return new Promise((resolve, reject) => {
      this.waiting.set(id, { resolve, reject });
      this.worker?.postMessage({ id, patch, previewDurationS });
    });
  }

  async close(): Promise<void> {
    await this.worker?.terminate();
    this.worker = null;
  }
}
