import { useMutation } from '@tanstack/react-query';
import type { z } from 'zod';
import { passwordResetConfirmBody } from '../../../../shared/api/schemas';
import { apiRequest } from '../../../lib/api-client';

export const confirmPasswordResetInputSchema = passwordResetConfirmBody;
export type ConfirmPasswordResetInput = z.input<typeof passwordResetConfirmBody>;

/** Sets a new password with the token from a reset link. A bad, used or expired token is blamed on `token`. */
export function confirmPasswordReset(input: ConfirmPasswordResetInput): Promise<{ ok: true }> {
  return apiRequest<{ ok: true }>('/auth/password-reset/confirm', { method: 'POST', body: input });
}

export function useConfirmPasswordReset() {
  return useMutation({ mutationFn: confirmPasswordReset });
}
