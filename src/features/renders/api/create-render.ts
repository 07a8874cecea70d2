import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { createRenderBody, type RenderView } from '../../../../shared/renders/render-settings';
import { apiRequest } from '../../../lib/api-client';
import { rendersQueryKey } from './get-renders';

export const createRenderInputSchema = createRenderBody;
export type CreateRenderInput = z.input<typeof createRenderBody>;

/** Queues a render (202); the server answers with the job in state `queued`. */
export async function createRender(studioId: string, input: CreateRenderInput): Promise<RenderView> {
  return (await apiRequest<{ render: RenderView }>(`/studios/${studioId}/renders`, { method: 'POST', body: input })).render;
}

export function useCreateRender(studioId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateRenderInput) => createRender(studioId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: rendersQueryKey(studioId) }),
  });
}
