import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { SessionDetail } from '../../../../shared/api/responses';
import { updateSessionBody } from '../../../../shared/api/schemas';
import { apiRequest } from '../../../lib/api-client';

export const updateSessionInputSchema = updateSessionBody;
export type UpdateSessionInput = z.input<typeof updateSessionBody>;

export async function updateSession(sessionId: string, input: UpdateSessionInput): Promise<SessionDetail> {
  return (await apiRequest<{ session: SessionDetail }>(`/sessions/${sessionId}`, { method: 'PATCH', body: input })).session;
}

/** Rename, archive or restore a session; every list of the studio's sessions refreshes. */
export function useUpdateSession(studioId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ sessionId, input }: { sessionId: string; input: UpdateSessionInput }) => updateSession(sessionId, input),
    onSuccess: (session) => {
      void queryClient.invalidateQueries({ queryKey: ['studios', studioId, 'sessions'] });
      queryClient.setQueryData(['sessions', session.id], session);
    },
  });
}
