import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RenderView } from '../../../../shared/renders/render-settings';
import { apiRequest } from '../../../lib/api-client';
import { rendersQueryKey, type RenderList } from './get-renders';

/** Stops a queued or running render; the server answers with the job as it now stands. */
export async function cancelRender(renderId: string): Promise<RenderView> {
  return (await apiRequest<{ render: RenderView }>(`/renders/${renderId}/cancel`, { method: 'POST' })).render;
}

export function useCancelRender(studioId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (renderId: string) => cancelRender(renderId),
    onSuccess: (render) => {
      // The row changes at once; the refetch brings the storage figure freed by the cancel.
      queryClient.setQueriesData<RenderList>({ queryKey: rendersQueryKey(studioId) }, (list) =>
        list ? { ...list, renders: list.renders.map((row) => (row.id === render.id ? render : row)) } : list,
      );
      return queryClient.invalidateQueries({ queryKey: rendersQueryKey(studioId) });
    },
  });
}
