import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SessionDetail } from '../../../../shared/api/responses';
import { apiRequest } from '../../../lib/api-client';
import { getSessionQueryOptions } from '../../../lib/queries/get-session';

/**
 * After the preset's patch went into the live document (one undoable edit, made here): the session
 * remembers the preset, and the server tells everyone present who loaded what.
 */
export async function announcePresetLoaded(sessionId: string, presetId: string): Promise<SessionDetail> {
  return (await apiRequest<{ session: SessionDetail }>(`/sessions/${sessionId}/preset-loaded`, { method: 'POST', body: { presetId } })).session;
}

export function useAnnouncePresetLoaded(sessionId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (presetId: string) => announcePresetLoaded(sessionId, presetId),
    onSuccess: (session) => queryClient.setQueryData(getSessionQueryOptions(sessionId).queryKey, session),
  });
}
