import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PresetDetail } from '../../../../shared/api/responses';
import { apiRequest } from '../../../lib/api-client';

export async function getPreset(presetId: string): Promise<PresetDetail> {
  return (await apiRequest<{ preset: PresetDetail }>(`/presets/${presetId}`)).preset;
}

export const getPresetQueryOptions = (presetId: string) => queryOptions({ queryKey: ['presets', presetId], queryFn: () => getPreset(presetId) });

export function usePreset(presetId: string) {
  return useQuery(getPresetQueryOptions(presetId));
}
