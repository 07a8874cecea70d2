import type { RenderState } from '../renders/render-settings';

/** socket.io event names of the renders channel (same socket as the compute channel). */
export const RENDER_EVENTS = {
  /** Client → server: follow one studio's render jobs. Answered with `joined` or `refused`. */
  subscribe: 'renders:subscribe',
  unsubscribe: 'renders:unsubscribe',
  joined: 'renders:joined',
  refused: 'renders:refused',
  /** Server → client: a job's state or progress changed. */
  progress: 'renders:progress',
} as const;

export interface RenderSubscribeRequest {
  studioId: string;
}

export interface RenderProgressMessage {
  type: 'progress';
  studioId: string;
  renderId: string;
  state: RenderState;
  /** 0–100. */
  progressPercent: number;
  /** Why it failed, when it did. */
  error: string | null;
}

export interface RenderJoinedMessage {
  type: 'joined';
  studioId: string;
}

export interface RenderRefusedMessage {
  type: 'refused';
  studioId: string;
  /** `bad_request`: the request's payload had the wrong shape; the message names the field. */
  code: 'unauthenticated' | 'not_found' | 'bad_request';
  message: string;
}
