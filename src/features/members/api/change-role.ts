import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { MemberView } from '../../../../shared/api/responses';
import { changeRoleBody } from '../../../../shared/api/schemas';
import { apiRequest } from '../../../lib/api-client';
import { getMeQueryOptions } from '../../../lib/queries/get-me';
import { getMembersQueryOptions } from './get-members';

export const changeRoleInputSchema = changeRoleBody;
export type ChangeRoleInput = z.input<typeof changeRoleBody>;

/** Answers with the studio's members after the change. */
export async function changeRole(studioId: string, userId: string, input: ChangeRoleInput): Promise<MemberView[]> {
  return (await apiRequest<{ members: MemberView[] }>(`/studios/${studioId}/members/${userId}`, { method: 'PATCH', body: input })).members;
}

/** Changes a member's role; the member list refreshes, and so does `me` (your own role may be the one that changed). */
export function useChangeRole(studioId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ userId, input }: { userId: string; input: ChangeRoleInput }) => changeRole(studioId, userId, input),
    onSuccess: (members) => {
      const { queryKey } = getMembersQueryOptions(studioId);
      queryClient.setQueryData(queryKey, members);
      void queryClient.invalidateQueries({ queryKey });
      return queryClient.invalidateQueries({ queryKey: getMeQueryOptions().queryKey });
    },
  });
}
