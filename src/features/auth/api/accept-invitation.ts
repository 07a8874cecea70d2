import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { Role } from '../../../../shared/access/roles';
import type { AuthResponse } from '../../../../shared/api/responses';
import { acceptInvitationBody } from '../../../../shared/api/schemas';
import { apiRequest } from '../../../lib/api-client';
import { getMeQueryOptions } from '../../../lib/queries/get-me';
import { getInvitationQueryOptions } from './get-invitation';

export const acceptInvitationInputSchema = acceptInvitationBody;
/** A new address must name its account and choose a password. */
export const acceptAsNewAccountInputSchema = acceptInvitationBody.required({ displayName: true, password: true });
export type AcceptInvitationInput = z.input<typeof acceptInvitationBody>;

/** What accepting answers: you are signed in (as the invited address) and a member of `studioId`. */
export interface AcceptInvitationResponse extends AuthResponse {
  studioId: string;
  role: Role;
}

export function acceptInvitation(input: AcceptInvitationInput): Promise<AcceptInvitationResponse> {
  return apiRequest<AcceptInvitationResponse>('/invitations/accept', { method: 'POST', body: input });
}

export function useAcceptInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: acceptInvitation,
    onSuccess: async (_answer, input) => {
      // The link is spent; fetch the signed-in user (now with the new studio) before the caller navigates.
      queryClient.removeQueries({ queryKey: getInvitationQueryOptions(input.token).queryKey });
      await queryClient.invalidateQueries({ queryKey: getMeQueryOptions().queryKey, refetchType: 'none' });
      await queryClient.fetchQuery({ ...getMeQueryOptions(), staleTime: 0 });
    },
  });
}
