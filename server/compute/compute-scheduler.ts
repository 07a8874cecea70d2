import { LIMITS } from '../../shared/limits';

/** A compute: does the work, and resolves with the function that sends its result. */
export type ComputeJob = () => Promise<() => void>;

/**
 * Runs a session's compute so that the latest state always wins: a change while a compute runs
 * only marks the session dirty, and one more compute runs afterwards on the state as it is then.
 * A burst of edits therefore costs at most two computes and no backlog builds. After each result
 * the session rests one display frame before the next compute: results stay at least a frame
 * apart, and on a busy 2-core machine the rest leaves room for the event loop (measured: fewer,
 * fresher results beat back-to-back ones for both propagation and round-trip latency).
 */
export class ComputeScheduler {
  private running = false;
  private dirty = false;
  private lastSentAt = -Infinity;

  constructor(
    private readonly job: ComputeJob,
    private readonly minIntervalMs: number = LIMITS.computeMinIntervalMs,
    private readonly now: () => number = () => performance.now(),
  ) {}

  schedule(): void {
    this.dirty = true;
    if (!this.running) void this.run();
  }

  get busy(): boolean {
    return this.running;
  }

  private async run(): Promise<void> {
    this.running = true;
    try {
      while (this.dirty) {
        // Timers may fire a little early: wait again until a full frame has passed by our own clock.
        for (let rest = this.lastSentAt + this.minIntervalMs - this.now(); rest > 0; rest = this.lastSentAt + this.minIntervalMs - this.now()) {
          await new Promise((resolve) => setTimeout(resolve, Math.ceil(rest)));
        }
        this.dirty = false;
        const send = await this.job().catch(() => null);
        if (!send) continue;
        this.lastSentAt = this.now();
        send();
      }
    } finally {
      this.running = false;
    }
  }
}
