import { useMutation } from '@tanstack/react-query';
import type { z } from 'zod';
import { changePasswordBody } from '../../../../shared/api/schemas';
import { apiRequest } from '../../../lib/api-client';

export const changePasswordInputSchema = changePasswordBody;
export type ChangePasswordInput = z.input<typeof changePasswordBody>;

/** Changes your password. Every other device is signed out; this browser gets a fresh sign-in cookie. */
export function changePassword(input: ChangePasswordInput): Promise<{ ok: true; token: string }> {
  return apiRequest<{ ok: true; token: string }>('/me/password', { method: 'POST', body: input });
}

export function useChangePassword() {
  return useMutation({ mutationFn: changePassword });
}
