import { availableParallelism } from 'node:os';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import { MODE_KERNEL_WASM } from '../engine-wasm/wasm-bank-renderer';
import type { FinishResult, PlanResult, RenderTask, RenderTaskResult, TaskReply, TaskRequest } from './render-tasks';

const bootPath = fileURLToPath(new URL('../engine-pool/worker-boot.cjs', import.meta.url));
const entryPath = fileURLToPath(new URL('./render-task-worker.ts', import.meta.url));

/** Thrown into a job's pending tasks when the job is cancelled. */
export class TaskCancelledError extends Error {
  constructor() {
    super('cancelled');
  }
}

interface Pending {
  id: number;
  jobId: string;
  task: RenderTask;
  transfer: ArrayBuffer[];
  resolve: (result: RenderTaskResult) => void;
  reject: (error: Error) => void;
}

interface Slot {
  worker: Worker;
  running: Pending | null;
}

type ResultOf<T extends RenderTask['type']> = T extends 'plan' ? PlanResult : T extends 'segment' ? { channels: Float64Array[] } : T extends 'finish' ? FinishResult : { bytes: Uint8Array };

/**
 * Worker threads for render jobs, one per core, fed from one first-in first-out queue of tasks.
 * Tasks of several jobs interleave, so a long job never starves a short one for more than a
 * segment. Cancelling a job drops its queued tasks; a task already running finishes and its result
 * is thrown away. A worker that dies is replaced, and only its task fails.
 */
export class RenderTaskPool {
  private readonly slots: Slot[] = [];
  private readonly queue: Pending[] = [];
  private readonly cancelled = new Set<string>();
  private nextId = 1;
  private closed = false;

  constructor(readonly size = Math.max(1, availableParallelism())) {}

  run<T extends RenderTask>(jobId: string, task: T, transfer: ArrayBuffer[] = []): Promise<ResultOf<T['type']>> {
    if (this.closed) return Promise.reject(new Error('the render pool is closed'));
    if (this.cancelled.has(jobId)) return Promise.reject(new TaskCancelledError());
    return new Promise((resolve, reject) => {
      this.queue.push({ id: this.nextId++, jobId, task, transfer, resolve: resolve as (result: RenderTaskResult) => void, reject });
      this.pump();
    });
  }

  /** Drops the job's queued tasks (they reject with TaskCancelledError) and refuses new ones. */
  cancel(jobId: string): void {
    this.cancelled.add(jobId);
    for (let i = this.queue.length - 1; i >= 0; i--) {
      if (this.queue[i].jobId !== jobId) continue;
      const [dropped] = this.queue.splice(i, 1);
      dropped.reject(new TaskCancelledError());
    }
  }

  /** Forgets a finished job's cancellation mark. */
  release(jobId: string): void {
    this.cancelled.delete(jobId);
  }

  /** Tasks waiting and running, for the benchmark and tests. */
  get load(): { queued: number; running: number } {
    return { queued: this.queue.length, running: this.slots.filter((slot) => slot.running).length };
  }

  private spawn(): Slot {
    const slot: Slot = { worker: new Worker(bootPath, { workerData: { entry: entryPath, wasmPath: MODE_KERNEL_WASM } }), running: null };
    slot.worker.unref();
    slot.worker.on('message', (reply: TaskReply) => {
      const pending = slot.running;
      slot.running = null;
      if (pending && pending.id === reply.id) {
        if (this.cancelled.has(pending.jobId)) pending.reject(new TaskCancelledError());
        else if (reply.ok) pending.resolve(reply.result);
        else pending.reject(new Error(reply.message));
      }
      this.pump();
    });
    slot.worker.on('error', (error) => {
      const pending = slot.running;
      slot.running = null;
      pending?.reject(error);
      const index = this.slots.indexOf(slot);
      if (index >= 0) this.slots.splice(index, 1);
      void slot.worker.terminate();
      this.pump();
    });
    this.slots.push(slot);
    return slot;
  }

  private pump(): void {
    while (!this.closed && this.queue.length > 0) {
      const idle = this.slots.find((slot) => !slot.running) ?? (this.slots.length < this.size ? this.spawn() : null);
      if (!idle) return;
      const pending = this.queue.shift() as Pending;
      idle.running = pending;
      idle.worker.postMessage({ id: pending.id, task: pending.task } satisfies TaskRequest, pending.transfer);
    }
  }

  async close(): Promise<void> {
    this.closed = true;
    for (const pending of this.queue.splice(0)) pending.reject(new Error('the render pool is closed'));
    await Promise.all(this.slots.splice(0).map((slot) => slot.worker.terminate()));
  }
}
