import type { RenderProgressMessage } from '../../../shared/protocol/render-protocol';
import type { RenderState } from '../../../shared/renders/render-settings';
import type { RenderList } from './api/get-renders';

const FINISHED: ReadonlySet<RenderState> = new Set(['done', 'failed', 'cancelled']);

/** True once a job can change no more: done, failed or cancelled. */
export function isRenderFinished(state: RenderState): boolean {
  return FINISHED.has(state);
}

/** True while a job waits or runs, and so can be cancelled. */
export function isRenderActive(state: RenderState): boolean {
  return state === 'queued' || state === 'rendering';
}

/**
 * A cached render list with one progress message applied: the job's state, percent and error
 * change in place, so its bar moves without a refetch. Returns the same list when the job is not
 * in it or nothing changes (so nothing re-renders), and never moves a finished job back: a late
 * progress message cannot undo the `done` a refetch brought.
 */
export function applyRenderProgress(list: RenderList, message: RenderProgressMessage): RenderList {
  const index = list.renders.findIndex((render) => render.id === message.renderId);
  if (index === -1) return list;
  const current = list.renders[index];
  if (isRenderFinished(current.state) && current.state !== message.state) return list;
  const progressPercent = Math.min(100, Math.max(0, message.progressPercent));
  if (current.state === message.state && current.progressPercent === progressPercent && current.error === message.error) return list;
  const renders = [...list.renders];
  renders[index] = { ...current, state: message.state, progressPercent, error: message.error };
  return { ...list, renders };
}
