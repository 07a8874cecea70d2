import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { InvitationView } from '../../../../shared/api/responses';
import { apiRequest } from '../../../lib/api-client';
import { getInvitationsQueryOptions } from './get-invitations';

/** Mails the invitation again with a fresh link and a new expiry; the old link stops working. */
export async function resendInvitation(studioId: string, invitationId: string): Promise<InvitationView> {
  return (await apiRequest<{ invitation: InvitationView }>(`/studios/${studioId}/invitations/${invitationId}/resend`, { method: 'POST' })).invitation;
}

export function useResendInvitation(studioId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (invitationId: string) => resendInvitation(studioId, invitationId),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getInvitationsQueryOptions(studioId).queryKey }),
  });
}
