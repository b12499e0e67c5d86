import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '@/lib/api';

export function signOut(): Promise<unknown> {
  return apiRequest('/auth/sign-out', { method: 'POST', body: {} });
}

/** Sign out and forget every cached answer (they belonged to the previous user). */
export function useSignOut() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: signOut,
    onSettled: () => {
      qc.clear();
    },
  });
}
