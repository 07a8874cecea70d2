import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PresetDetail } from '../../../../shared/api/responses';
import { createPresetBody } from '../../../../shared/api/schemas';
import { apiRequest } from '../../../lib/api-client';
import { getSessionQueryOptions } from '../../../lib/queries/get-session';

/** The save dialog's fields, checked in the browser with the server's own schema. */
export const saveAsPresetInputSchema = createPresetBody;
export interface SaveAsPresetInput {
  name: string;
  tags: string[];
  description?: string;
}

/** Saves the session's string, as its people hear it now, as a new preset of the studio (leads only). */
export async function saveSessionAsPreset(studioId: string, sessionId: string, input: SaveAsPresetInput): Promise<PresetDetail> {
  return (await apiRequest<{ preset: PresetDetail }>(`/studios/${studioId}/presets`, { method: 'POST', body: { ...input, sessionId } })).preset;
}

/** The library and the session (which now comes from the new preset) refresh after a save. */
export function useSaveSessionAsPreset(studioId: string, sessionId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: SaveAsPresetInput) => saveSessionAsPreset(studioId, sessionId, input),
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: ['studios', studioId, 'presets'] }),
        queryClient.invalidateQueries({ queryKey: getSessionQueryOptions(sessionId).queryKey }),
      ]),
  });
}
