import { useMutation, type QueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { deleteAccountBody } from '../../../../shared/api/schemas';
import { apiRequest } from '../../../lib/api-client';
import { getMeQueryOptions } from '../../../lib/queries/get-me';

export const deleteAccountInputSchema = deleteAccountBody;
export type DeleteAccountInput = z.input<typeof deleteAccountBody>;

/**
 * Deletes your account (and every studio you are alone in). The server answers 409, naming the
 * studio, while you are the last lead of a studio that has other members.
 */
export function deleteAccount(input: DeleteAccountInput): Promise<void> {
  return apiRequest<void>('/me', { method: 'DELETE', body: input });
}

export function useDeleteAccount() {
  return useMutation({ mutationFn: deleteAccount });
}

/**
 * Forgets everything cached for the deleted account. Call it once the app has left the signed-in
 * pages: done earlier, their layout would see nobody signed in and send you to sign in with a
 * return address to a page that no longer exists for you.
 */
export function forgetDeletedAccount(queryClient: QueryClient): void {
  queryClient.clear();
  queryClient.setQueryData(getMeQueryOptions().queryKey, null);
}
