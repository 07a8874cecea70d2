import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { AuthResponse } from '../../../../shared/api/responses';
import { registerBody } from '../../../../shared/api/schemas';
import { apiRequest } from '../../../lib/api-client';
import { getMeQueryOptions } from '../../../lib/queries/get-me';

export const registerInputSchema = registerBody;
export type RegisterInput = z.input<typeof registerBody>;

export function register(input: RegisterInput): Promise<AuthResponse> {
  return apiRequest<AuthResponse>('/auth/register', { method: 'POST', body: input });
}

export function useRegister() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: register,
    // Fetch the signed-in user before the caller navigates, so the next page never sees the old answer.
    onSuccess: () => queryClient.fetchQuery({ ...getMeQueryOptions(), staleTime: 0 }),
  });
}
