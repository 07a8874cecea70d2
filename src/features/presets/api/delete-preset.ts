import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { getPresetQueryOptions } from './get-preset';
import { presetsQueryKey } from './get-presets';

export async function deletePreset(presetId: string): Promise<void> {
  await apiRequest<void>(`/presets/${presetId}`, { method: 'DELETE' });
}

/** Deletes a preset. Sessions that loaded it keep their own copy of its patch. */
export function useDeletePreset(studioId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (presetId: string) => deletePreset(presetId),
    onSuccess: (_result, presetId) => {
      queryClient.removeQueries({ queryKey: getPresetQueryOptions(presetId).queryKey });
      return queryClient.invalidateQueries({ queryKey: presetsQueryKey(studioId) });
    },
  });
}
