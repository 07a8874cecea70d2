import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PresetDetail } from '../../../../shared/api/responses';
import { apiRequest } from '../../../lib/api-client';
import { getPresetQueryOptions } from './get-preset';
import { presetsQueryKey } from './get-presets';

/**
 * A patch JSON file with an optional name and tags. There is no shared schema for this multipart
 * body: the server reads the file, then checks name and tags with `createPresetBody`.
 */
export interface UploadPresetInput {
  file: File;
  /** Empty: the preset takes the patch's own name. */
  name?: string;
  /** Comma-separated. Empty: the preset keeps the tags written in the file. */
  tags?: string;
}

export async function uploadPreset(studioId: string, input: UploadPresetInput): Promise<PresetDetail> {
  const formData = new FormData();
  formData.append('file', input.file, input.file.name);
  // A field sent empty would override what the file says, so empty fields are left out.
  if (input.name?.trim()) formData.append('name', input.name.trim());
  if (input.tags?.trim()) formData.append('tags', input.tags.trim());
  return (await apiRequest<{ preset: PresetDetail }>(`/studios/${studioId}/presets/upload`, { method: 'POST', formData })).preset;
}

export function useUploadPreset(studioId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: UploadPresetInput) => uploadPreset(studioId, input),
    onSuccess: (preset) => {
      queryClient.setQueryData(getPresetQueryOptions(preset.id).queryKey, preset);
      return queryClient.invalidateQueries({ queryKey: presetsQueryKey(studioId) });
    },
  });
}
