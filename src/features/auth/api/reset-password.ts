import { useMutation } from '@tanstack/react-query';
import { apiRequest } from '@/lib/api';

/** better-auth's `POST /api/auth/reset-password {token, newPassword}`; the token works once, for an hour. */
export function resetPassword(v: { token: string; newPassword: string }) {
  return apiRequest('/auth/reset-password', { method: 'POST', body: v });
}

export function useResetPassword() {
  return useMutation({ mutationFn: resetPassword });
}
