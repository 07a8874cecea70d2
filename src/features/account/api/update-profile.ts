import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { MeResponse, UserView } from '../../../../shared/api/responses';
import { updateProfileBody } from '../../../../shared/api/schemas';
import { apiRequest } from '../../../lib/api-client';
import { getMeQueryOptions } from '../../../lib/queries/get-me';

export const updateProfileInputSchema = updateProfileBody;
export type UpdateProfileInput = z.input<typeof updateProfileBody>;

export async function updateProfile(input: UpdateProfileInput): Promise<UserView> {
  return (await apiRequest<{ user: UserView }>('/me', { method: 'PATCH', body: input })).user;
}

/** Renames you; the new name shows at once everywhere `me` is read, then `me` is fetched again. */
export function useUpdateProfile() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateProfile,
    onSuccess: (user) => {
      const { queryKey } = getMeQueryOptions();
      queryClient.setQueryData(queryKey, (me: MeResponse | null | undefined) => (me ? { ...me, user } : me));
      return queryClient.invalidateQueries({ queryKey });
    },
  });
}
