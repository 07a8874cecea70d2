import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SessionSummary } from '../../../shared/api/responses';
import { apiRequest } from '../api-client';

export async function getSessions(studioId: string, includeArchived: boolean): Promise<SessionSummary[]> {
  return (await apiRequest<{ sessions: SessionSummary[] }>(`/studios/${studioId}/sessions${includeArchived ? '?archived=true' : ''}`)).sessions;
}

export const getSessionsQueryOptions = (studioId: string, includeArchived = false) =>
  queryOptions({ queryKey: ['studios', studioId, 'sessions', { includeArchived }], queryFn: () => getSessions(studioId, includeArchived) });

export function useSessions(studioId: string, includeArchived = false) {
  return useQuery(getSessionsQueryOptions(studioId, includeArchived));
}
