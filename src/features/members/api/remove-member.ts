import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { getMeQueryOptions } from '../../../lib/queries/get-me';
import { getMembersQueryOptions } from './get-members';

/** Removes a member from the studio; with your own id, you leave it. */
export function removeMember(studioId: string, userId: string): Promise<void> {
  return apiRequest<void>(`/studios/${studioId}/members/${userId}`, { method: 'DELETE' });
}

export function useRemoveMember(studioId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (userId: string) => removeMember(studioId, userId),
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: getMembersQueryOptions(studioId).queryKey }),
        queryClient.invalidateQueries({ queryKey: getMeQueryOptions().queryKey }),
      ]),
  });
}
