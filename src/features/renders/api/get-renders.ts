import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RenderView } from '../../../../shared/renders/render-settings';
import { apiRequest } from '../../../lib/api-client';

/** Bytes the studio's render files take, and how many it may keep. */
export interface RenderStorage {
  usedBytes: number;
  quotaBytes: number;
}

/** What `GET /api/studios/:studioId/renders` answers: newest first, with the studio's storage. */
export interface RenderList {
  renders: RenderView[];
  storage: RenderStorage;
}

export interface RenderListParams {
  /** Only the renders made from this session; absent for all of them. */
  sessionId?: string;
}

/** How often the list is fetched while a job runs and live progress is not reaching us, ms. */
export const RENDER_POLL_INTERVAL_MS = 3000;

/** Every list of a studio's renders starts with this key; mutations and progress use it as a prefix. */
export const rendersQueryKey = (studioId: string) => ['studios', studioId, 'renders'] as const;

export async function getRenders(studioId: string, params: RenderListParams = {}, signal?: AbortSignal): Promise<RenderList> {
  const search = params.sessionId ? `?${new URLSearchParams({ sessionId: params.sessionId })}` : '';
  return apiRequest<RenderList>(`/studios/${studioId}/renders${search}`, { signal });
}

export const getRendersQueryOptions = (studioId: string, params: RenderListParams = {}) => {
  const sessionId = params.sessionId || undefined;
  return queryOptions({
    queryKey: [...rendersQueryKey(studioId), { sessionId: sessionId ?? null }],
    queryFn: ({ signal }) => getRenders(studioId, { sessionId }, signal),
  });
};

const isActive = (render: RenderView) => render.state === 'queued' || render.state === 'rendering';

/**
 * The studio's renders. With `pollWhileActive` (live progress is off), the list is fetched again
 * every few seconds for as long as a job in it is queued or rendering.
 */
export function useRenders(studioId: string, params: RenderListParams = {}, { pollWhileActive = false } = {}) {
  return useQuery({
    ...getRendersQueryOptions(studioId, params),
    enabled: studioId !== '',
    refetchInterval: (query) => (pollWhileActive && query.state.data?.renders.some(isActive) ? RENDER_POLL_INTERVAL_MS : false),
  });
}
