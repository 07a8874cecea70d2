import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SessionDetail } from '../../../shared/api/responses';
import { apiRequest } from '../api-client';

export async function getSession(sessionId: string): Promise<SessionDetail> {
  return (await apiRequest<{ session: SessionDetail }>(`/sessions/${sessionId}`)).session;
}

export const getSessionQueryOptions = (sessionId: string) => queryOptions({ queryKey: ['sessions', sessionId], queryFn: () => getSession(sessionId) });

export function useSession(sessionId: string) {
  return useQuery(getSessionQueryOptions(sessionId));
}
