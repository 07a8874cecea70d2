import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { z } from 'zod';
import type { PresetSummary } from '../../../../shared/api/responses';
import { listPresetsQuery, PRESET_SORTS } from '../../../../shared/api/schemas';
import { apiRequest } from '../../../lib/api-client';

export const presetListParamsSchema = listPresetsQuery;
export type PresetListParams = z.input<typeof listPresetsQuery>;
export type PresetSort = (typeof PRESET_SORTS)[number];

/** Every list of a studio's presets starts with this key; mutations invalidate it as a prefix. */
export const presetsQueryKey = (studioId: string) => ['studios', studioId, 'presets'] as const;

/** Empty search and tag mean "not given"; the server sorts by name when no sort is asked for. */
function normalise(params: PresetListParams) {
  const q = params.q?.trim() || undefined;
  const tag = params.tag?.trim().toLowerCase() || undefined;
  return { q, tag, sort: params.sort ?? 'name' } as const;
}

export async function getPresets(studioId: string, params: PresetListParams = {}, signal?: AbortSignal): Promise<PresetSummary[]> {
  const { q, tag, sort } = normalise(params);
  const search = new URLSearchParams();
  if (q) search.set('q', q);
  if (tag) search.set('tag', tag);
  search.set('sort', sort);
  return (await apiRequest<{ presets: PresetSummary[] }>(`/studios/${studioId}/presets?${search}`, { signal })).presets;
}

export const getPresetsQueryOptions = (studioId: string, params: PresetListParams = {}) => {
  const normalised = normalise(params);
  return queryOptions({
    queryKey: [...presetsQueryKey(studioId), normalised],
    queryFn: ({ signal }) => getPresets(studioId, normalised, signal),
  });
};

/** The studio's presets; while a new search loads, the previous rows stay on screen. Waits for a studio id. */
export function usePresets(studioId: string, params: PresetListParams = {}) {
  return useQuery({ ...getPresetsQueryOptions(studioId, params), placeholderData: keepPreviousData, enabled: studioId !== '' });
}
