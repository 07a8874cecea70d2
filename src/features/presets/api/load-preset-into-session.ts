import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { SessionDetail } from '../../../../shared/api/responses';
import { loadPresetBody } from '../../../../shared/api/schemas';
import { apiRequest } from '../../../lib/api-client';
import { getSessionQueryOptions } from '../../../lib/queries/get-session';

export const loadPresetIntoSessionInputSchema = loadPresetBody;
export type LoadPresetIntoSessionInput = z.input<typeof loadPresetBody>;

/** Replaces the session's patch with a copy of the preset's; people in the session see it at once. */
export async function loadPresetIntoSession(sessionId: string, input: LoadPresetIntoSessionInput): Promise<SessionDetail> {
  return (await apiRequest<{ session: SessionDetail }>(`/sessions/${sessionId}/load-preset`, { method: 'POST', body: input })).session;
}

export function useLoadPresetIntoSession(studioId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ sessionId, input }: { sessionId: string; input: LoadPresetIntoSessionInput }) => loadPresetIntoSession(sessionId, input),
    onSuccess: (session) => {
      queryClient.setQueryData(getSessionQueryOptions(session.id).queryKey, session);
      return queryClient.invalidateQueries({ queryKey: ['studios', studioId, 'sessions'] });
    },
  });
}
