import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { rendersQueryKey } from './get-renders';

/** Deletes a render and its file (leads only); answers 204. */
export async function deleteRender(renderId: string): Promise<void> {
  await apiRequest<void>(`/renders/${renderId}`, { method: 'DELETE' });
}

export function useDeleteRender(studioId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (renderId: string) => deleteRender(renderId),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: rendersQueryKey(studioId) }),
  });
}
