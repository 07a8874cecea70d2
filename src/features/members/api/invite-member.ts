import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { InvitationView } from '../../../../shared/api/responses';
import { inviteBody } from '../../../../shared/api/schemas';
import { apiRequest } from '../../../lib/api-client';
import { getInvitationsQueryOptions } from './get-invitations';

export const inviteMemberInputSchema = inviteBody;
export type InviteMemberInput = z.input<typeof inviteBody>;

/** Invites an address; inviting one that already has a pending invitation sends it again with the new role. */
export async function inviteMember(studioId: string, input: InviteMemberInput): Promise<InvitationView> {
  return (await apiRequest<{ invitation: InvitationView }>(`/studios/${studioId}/invitations`, { method: 'POST', body: input })).invitation;
}

export function useInviteMember(studioId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: InviteMemberInput) => inviteMember(studioId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getInvitationsQueryOptions(studioId).queryKey }),
  });
}
