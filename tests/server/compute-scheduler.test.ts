import { describe, expect, it } from 'vitest';
import { ComputeScheduler } from '../../server/compute/compute-scheduler';

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

describe('compute scheduler', () => {
  it('coalesces a burst: the latest state wins, at most one compute runs and one waits', async () => {
    let state = 0;
    const computedStates: number[] = [];
    const sentAt: number[] = [];
    let running = 0;
    let maxRunning = 0;
    const scheduler = new ComputeScheduler(async () => {
      running++;
      maxRunning = Math.max(maxRunning, running);
      const seen = state;
      await sleep(20);
      running--;
      return () => {
        computedStates.push(seen);
        sentAt.push(performance.now());
      };
    }, 16);
    for (let i = 1; i <= 100; i++) {
      state = i;
      scheduler.schedule();
      if (i % 10 === 0) await sleep(1);
    }
    await sleep(200);
    expect(maxRunning).toBe(1);
    expect(computedStates.at(-1)).toBe(100);
    expect(computedStates.length).toBeLessThanOrEqual(3);
    for (let i = 1; i < sentAt.length; i++) expect(sentAt[i] - sentAt[i - 1]).toBeGreaterThanOrEqual(15);
  });

  it('keeps results of quick computes a frame apart', async () => {
    const sentAt: number[] = [];
    const scheduler = new ComputeScheduler(async () => () => sentAt.push(performance.now()), 16);
    scheduler.schedule();
    await sleep(2);
    scheduler.schedule();
    await sleep(60);
    expect(sentAt).toHaveLength(2);
    expect(sentAt[1] - sentAt[0]).toBeGreaterThanOrEqual(15);
  });
});
