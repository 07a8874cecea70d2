import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import type { Patch } from '../../shared/patch/patch-schema';
import type { TableStamp } from '../../shared/engine/mode-table-message';

const bootPath = fileURLToPath(new URL('../engine-pool/worker-boot.cjs', import.meta.url));
const entryPath = fileURLToPath(new URL('./compute-worker-entry.ts', import.meta.url));

/** One worker thread for live computes, restarted if it ever dies; requests answer in order. */
export class ComputeWorker {
  private worker: Worker | null = null;
  private nextId = 1;
  private readonly waiting = new Map<number, { resolve: (bytes: Uint8Array) => void; reject: (error: Error) => void }>();

  private start(): Worker {
    const worker = new Worker(bootPath, { workerData: { entry: entryPath } });
    worker.unref();
    worker.on('message', ({ id, bytes, error }: { id: number; bytes?: Uint8Array; error?: string }) => {
      const waiter = this.waiting.get(id);
      this.waiting.delete(id);
      if (!waiter) return;
      if (bytes) waiter.resolve(bytes);
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

  /** The encoded mode table of a validated patch (shared/protocol/mode-table-wire.ts). */
  compute(patch: Patch, previewDurationS: number, stamp: TableStamp): Promise<Uint8Array> {
    this.worker ??= this.start();
    const id = this.nextId++;
    return new Promise((resolve, reject) => {
      this.waiting.set(id, { resolve, reject });
      this.worker?.postMessage({ id, patch, previewDurationS, stamp });
    });
  }

  async close(): Promise<void> {
    await this.worker?.terminate();
    this.worker = null;
  }
}
