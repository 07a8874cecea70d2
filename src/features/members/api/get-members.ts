import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MemberView } from '../../../../shared/api/responses';
import { apiRequest } from '../../../lib/api-client';

export async function getMembers(studioId: string): Promise<MemberView[]> {
  return (await apiRequest<{ members: MemberView[] }>(`/studios/${studioId}/members`)).members;
}

export const getMembersQueryOptions = (studioId: string) => queryOptions({ queryKey: ['studios', studioId, 'members'], queryFn: () => getMembers(studioId) });

export function useMembers(studioId: string) {
  return useQuery(getMembersQueryOptions(studioId));
}
