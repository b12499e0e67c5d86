import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { apiRequest } from '@/lib/api';
import { meQueryKey } from './get-me';

export const signInSchema = z.object({
  email: z.email('email must be a valid address'),
  password: z.string().min(1, 'password must not be empty'),
});
export type SignInInput = z.infer<typeof signInSchema>;

/** Email + password sign-in; the session arrives as a cookie. */
export function signIn(input: SignInInput): Promise<unknown> {
  return apiRequest('/auth/sign-in/email', { method: 'POST', body: input });
}

export function useSignIn() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    onSuccess: async () => {
      await qc.invalidateQueries({ queryKey: meQueryKey });
    },
  });
}
