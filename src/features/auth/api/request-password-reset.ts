import { useMutation } from '@tanstack/react-query';
import type { z } from 'zod';
import { passwordResetRequestBody } from '../../../../shared/api/schemas';
import { apiRequest } from '../../../lib/api-client';

export const requestPasswordResetInputSchema = passwordResetRequestBody;
export type RequestPasswordResetInput = z.input<typeof passwordResetRequestBody>;

/** Asks for a reset link. The answer is the same whether or not the address has an account. */
export function requestPasswordReset(input: RequestPasswordResetInput): Promise<{ ok: true; message: string }> {
  return apiRequest<{ ok: true; message: string }>('/auth/password-reset', { method: 'POST', body: input });
}

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: requestPasswordReset });
}
