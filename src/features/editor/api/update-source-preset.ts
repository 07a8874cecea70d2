import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { getSessionQueryOptions } from '../../../lib/queries/get-session';

export interface UpdatePresetResult {
  preset: { id: string; name: string; version: number; updatedAt: string };
  /** False when the session sounds as the preset already did: its version stays. */
  changed: boolean;
}

/** Writes the session's current string to the preset it came from (leads only). */
export async function updateSourcePreset(sessionId: string): Promise<UpdatePresetResult> {
  return apiRequest<UpdatePresetResult>(`/sessions/${sessionId}/update-preset`, { method: 'POST' });
}

export function useUpdateSourcePreset(studioId: string, sessionId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => updateSourcePreset(sessionId),
    onSuccess: (result) =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: ['studios', studioId, 'presets'] }),
        queryClient.invalidateQueries({ queryKey: ['presets', result.preset.id] }),
        queryClient.invalidateQueries({ queryKey: getSessionQueryOptions(sessionId).queryKey }),
      ]),
  });
}
