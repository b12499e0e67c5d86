import { useMutation } from '@tanstack/react-query';
import { z } from 'zod';
import { apiRequest } from '@/lib/api';

export const forgotPasswordSchema = z.object({
  email: z.string().trim().pipe(z.email('E-mail must be a valid address')),
});
export type ForgotPasswordInput = z.infer<typeof forgotPasswordSchema>;

/**
 * better-auth's `POST /api/auth/request-password-reset`: mails a one-use link to
 * `/reset-password?token=…`. It answers the same whether or not the address has an account.
 */
export function requestPasswordReset(input: ForgotPasswordInput) {
  return apiRequest('/auth/request-password-reset', {
    method: 'POST',
    body: { email: input.email, redirectTo: `${window.location.origin}/reset-password` },
  });
}

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: requestPasswordReset });
}
