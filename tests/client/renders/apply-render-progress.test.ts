import { describe, expect, it } from 'vitest';
import type { RenderProgressMessage } from '../../../shared/protocol/render-protocol';
import type { RenderView } from '../../../shared/renders/render-settings';
import type { RenderList } from '../../../src/features/renders/api/get-renders';
import { applyRenderProgress } from '../../../src/features/renders/apply-render-progress';
import { DONE_RENDER, RUNNING_RENDER, STORAGE, STUDIO_ID } from './renders-page-kit';

const list = (...renders: RenderView[]): RenderList => ({ renders, storage: STORAGE });
const progress = (renderId: string, state: RenderProgressMessage['state'], progressPercent: number, error: string | null = null): RenderProgressMessage => ({
  type: 'progress',
  studioId: STUDIO_ID,
  renderId,
  state,
  progressPercent,
  error,
});

describe('applyRenderProgress: a progress message applied to a cached render list', () => {
  it('moves the job’s state and percent in place and leaves the other rows and the storage as they were', () => {
    const before = list(RUNNING_RENDER, DONE_RENDER);
    const after = applyRenderProgress(before, progress(RUNNING_RENDER.id, 'rendering', 77));
    expect(after.renders[0]).toEqual({ ...RUNNING_RENDER, progressPercent: 77 });
    expect(after.renders[1]).toBe(DONE_RENDER);
    expect(after.storage).toBe(before.storage);
    // The cached list itself is not changed: TanStack Query compares references.
    expect(before.renders[0].progressPercent).toBe(42);
  });

  it('takes a failure with its reason', () => {
    const after = applyRenderProgress(list(RUNNING_RENDER), progress(RUNNING_RENDER.id, 'failed', 42, 'out of memory'));
    expect(after.renders[0]).toMatchObject({ state: 'failed', error: 'out of memory' });
  });

  it('answers the same list for a job it does not hold, or a message that changes nothing', () => {
    const before = list(RUNNING_RENDER);
    expect(applyRenderProgress(before, progress('render-elsewhere', 'rendering', 10))).toBe(before);
    expect(applyRenderProgress(before, progress(RUNNING_RENDER.id, 'rendering', 42))).toBe(before);
  });

  it('never moves a finished job back (a late message after the refetch)', () => {
    const before = list(DONE_RENDER);
    expect(applyRenderProgress(before, progress(DONE_RENDER.id, 'rendering', 98))).toBe(before);
  });

  it('keeps the percent within 0–100', () => {
    expect(applyRenderProgress(list(RUNNING_RENDER), progress(RUNNING_RENDER.id, 'rendering', 140)).renders[0].progressPercent).toBe(100);
    expect(applyRenderProgress(list(RUNNING_RENDER), progress(RUNNING_RENDER.id, 'rendering', -3)).renders[0].progressPercent).toBe(0);
  });
});
