import { queryOptions, useQuery } from '@tanstack/react-query';
import type { InvitationPreview } from '../../../../shared/api/responses';
import { apiRequest } from '../../../lib/api-client';

/** What an invitation offers. Unknown or revoked tokens answer 404; used or expired ones 409. */
export async function getInvitation(token: string): Promise<InvitationPreview> {
  return (await apiRequest<{ invitation: InvitationPreview }>(`/invitations/${encodeURIComponent(token)}`)).invitation;
}

export const getInvitationQueryOptions = (token: string) =>
  queryOptions({ queryKey: ['invitations', token], queryFn: () => getInvitation(token), enabled: token !== '' });

export function useInvitation(token: string) {
  return useQuery(getInvitationQueryOptions(token));
}
