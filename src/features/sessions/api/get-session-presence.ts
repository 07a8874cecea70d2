import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PersonRef } from '../../../../shared/api/responses';
import { apiRequest } from '../../../lib/api-client';

export type SessionPresence = Record<string, PersonRef[]>;

/** Who is in each of a studio's sessions right now. */
export async function getSessionPresence(studioId: string): Promise<SessionPresence> {
  return (await apiRequest<{ presence: SessionPresence }>(`/studios/${studioId}/sessions/presence`)).presence;
}

export const getSessionPresenceQueryOptions = (studioId: string) =>
  queryOptions({ queryKey: ['studios', studioId, 'sessions', 'presence'], queryFn: () => getSessionPresence(studioId), refetchInterval: 5000 });

export function useSessionPresence(studioId: string) {
  return useQuery(getSessionPresenceQueryOptions(studioId));
}
