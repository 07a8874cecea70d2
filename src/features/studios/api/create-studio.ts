import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { StudioSummary } from '../../../../shared/api/responses';
import { createStudioBody } from '../../../../shared/api/schemas';
import { apiRequest } from '../../../lib/api-client';
import { getMeQueryOptions } from '../../../lib/queries/get-me';

export const createStudioInputSchema = createStudioBody;
export type CreateStudioInput = z.input<typeof createStudioBody>;

export async function createStudio(input: CreateStudioInput): Promise<StudioSummary> {
  return (await apiRequest<{ studio: StudioSummary }>('/studios', { method: 'POST', body: input })).studio;
}

export function useCreateStudio() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createStudio,
    // Fetch the signed-in user before the caller navigates, so the next page never sees the old answer.
    onSuccess: () => queryClient.fetchQuery({ ...getMeQueryOptions(), staleTime: 0 }),
  });
}
