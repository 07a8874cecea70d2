import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SessionDetail } from '../../../shared/api/responses';
import { apiRequest } from '../api-client';

/** A new session of the studio with its own copy of the preset's patch; it remembers the preset. */
export async function startSessionFromPreset(studioId: string, presetId: string, name: string): Promise<SessionDetail> {
  return (await apiRequest<{ session: SessionDetail }>(`/studios/${studioId}/sessions`, { method: 'POST', body: { name, presetId } })).session;
}

export function useStartSessionFromPreset(studioId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ presetId, name }: { presetId: string; name: string }) => startSessionFromPreset(studioId, presetId, name),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['studios', studioId, 'sessions'] }),
  });
}
