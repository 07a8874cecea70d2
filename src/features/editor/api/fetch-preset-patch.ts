import type { PresetDetail } from '../../../../shared/api/responses';
import { apiRequest } from '../../../lib/api-client';

/** One preset with its patch, read when it is about to be loaded into the open session. */
export async function fetchPresetPatch(presetId: string): Promise<PresetDetail> {
  return (await apiRequest<{ preset: PresetDetail }>(`/presets/${presetId}`)).preset;
}
