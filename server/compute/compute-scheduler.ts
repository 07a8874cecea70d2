import { LIMITS } from '../../shared/limits';

/**
 * Runs a session's compute so that the latest state always wins: a change while a compute runs
 * only marks the session dirty, and one more compute runs afterwards on the state as it is then.
 * A burst of edits therefore costs at most two computes, no backlog builds, and results are at
 * least one display frame apart.
 */
export class ComputeScheduler {
  private running = false;
  private dirty = false;
  private lastFinishedAt = 0;

  constructor(
    private readonly job: () => Promise<void>,
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
        const wait = this.lastFinishedAt + this.minIntervalMs - this.now();
        if (wait > 0) await new Promise((resolve) => setTimeout(resolve, wait));
        this.dirty = false;
        await this.job().catch(() => undefined);
        this.lastFinishedAt = this.now();
      }
    } finally {
      this.running = false;
    }
  }
}
