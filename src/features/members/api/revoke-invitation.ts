import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { getInvitationsQueryOptions } from './get-invitations';

/** Revokes a pending invitation: its link stops working at once. */
export function revokeInvitation(studioId: string, invitationId: string): Promise<void> {
  return apiRequest<void>(`/studios/${studioId}/invitations/${invitationId}`, { method: 'DELETE' });
}

export function useRevokeInvitation(studioId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (invitationId: string) => revokeInvitation(studioId, invitationId),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getInvitationsQueryOptions(studioId).queryKey }),
  });
}
