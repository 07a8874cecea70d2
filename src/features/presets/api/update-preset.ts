import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { PresetDetail } from '../../../../shared/api/responses';
import { updatePresetBody } from '../../../../shared/api/schemas';
import { apiRequest } from '../../../lib/api-client';
import { getPresetQueryOptions } from './get-preset';
import { presetsQueryKey } from './get-presets';

export const updatePresetInputSchema = updatePresetBody;
export type UpdatePresetInput = z.input<typeof updatePresetBody>;

export async function updatePreset(presetId: string, input: UpdatePresetInput): Promise<PresetDetail> {
  return (await apiRequest<{ preset: PresetDetail }>(`/presets/${presetId}`, { method: 'PATCH', body: input })).preset;
}

/** Renames a preset or changes its tags, description or patch; the studio's lists refresh. */
export function useUpdatePreset(studioId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ presetId, input }: { presetId: string; input: UpdatePresetInput }) => updatePreset(presetId, input),
    onSuccess: (preset) => {
      queryClient.setQueryData(getPresetQueryOptions(preset.id).queryKey, preset);
      return queryClient.invalidateQueries({ queryKey: presetsQueryKey(studioId) });
    },
  });
}
