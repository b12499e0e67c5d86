import { useMutation } from '@tanstack/react-query';
import { z } from 'zod';
import { apiRequest } from '@/lib/api';

const acceptedSchema = z.object({ email: z.string(), name: z.string(), role: z.string() });

/** `POST /api/invitations/accept {token, password}` (public): creates the account, uses up the link. */
export function acceptInvitation(v: { token: string; password: string }) {
  return apiRequest('/invitations/accept', { method: 'POST', body: v, schema: acceptedSchema });
}

export function useAcceptInvitation() {
  return useMutation({ mutationFn: acceptInvitation });
}
