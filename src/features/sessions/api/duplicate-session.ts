import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SessionDetail } from '../../../../shared/api/responses';
import { apiRequest } from '../../../lib/api-client';

/** A new session with a copy of this one's string as its people hear it now, named "… (copy)". */
export async function duplicateSession(sessionId: string): Promise<SessionDetail> {
  return (await apiRequest<{ session: SessionDetail }>(`/sessions/${sessionId}/duplicate`, { method: 'POST' })).session;
}

export function useDuplicateSession(studioId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (sessionId: string) => duplicateSession(sessionId),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['studios', studioId, 'sessions'] }),
  });
}
