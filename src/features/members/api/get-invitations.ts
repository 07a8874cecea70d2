import { queryOptions, useQuery } from '@tanstack/react-query';
import type { InvitationView } from '../../../../shared/api/responses';
import { apiRequest } from '../../../lib/api-client';

/** The studio's pending invitations (not accepted, not revoked; expired ones included), newest first. */
export async function getInvitations(studioId: string): Promise<InvitationView[]> {
  return (await apiRequest<{ invitations: InvitationView[] }>(`/studios/${studioId}/invitations`)).invitations;
}

export const getInvitationsQueryOptions = (studioId: string) =>
  queryOptions({ queryKey: ['studios', studioId, 'invitations'], queryFn: () => getInvitations(studioId) });

export function useInvitations(studioId: string) {
  return useQuery(getInvitationsQueryOptions(studioId));
}
