import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { AuthResponse } from '../../../../shared/api/responses';
import { loginBody } from '../../../../shared/api/schemas';
import { apiRequest } from '../../../lib/api-client';
import { getMeQueryOptions } from '../../../lib/queries/get-me';

export const signInInputSchema = loginBody;
export type SignInInput = z.input<typeof loginBody>;

export function signIn(input: SignInInput): Promise<AuthResponse> {
  return apiRequest<AuthResponse>('/auth/login', { method: 'POST', body: input });
}

export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    // Fetch the signed-in user before the caller navigates, so the next page never sees the old answer.
    onSuccess: () => queryClient.fetchQuery({ ...getMeQueryOptions(), staleTime: 0 }),
  });
}
