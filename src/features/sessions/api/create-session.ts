import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { SessionDetail } from '../../../../shared/api/responses';
import { createSessionBody } from '../../../../shared/api/schemas';
import { apiRequest } from '../../../lib/api-client';

export const createSessionInputSchema = createSessionBody;
export type CreateSessionInput = z.input<typeof createSessionBody>;

export async function createSession(studioId: string, input: CreateSessionInput): Promise<SessionDetail> {
  return (await apiRequest<{ session: SessionDetail }>(`/studios/${studioId}/sessions`, { method: 'POST', body: input })).session;
}

export function useCreateSession(studioId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateSessionInput) => createSession(studioId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['studios', studioId, 'sessions'] }),
  });
}
