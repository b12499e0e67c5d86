import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiRequest } from '@/lib/api';

export const invitationDetailsSchema = z.object({
  email: z.string(),
  name: z.string(),
  role: z.string(),
  team: z.object({ name: z.string() }),
  expiresAt: z.string(),
});
export type InvitationDetails = z.infer<typeof invitationDetailsSchema>;

/** `POST /api/invitations/lookup {token}` (public): who the invitation is for; 404/410 when unusable. */
export function lookupInvitation(token: string, signal?: AbortSignal) {
  return apiRequest('/invitations/lookup', {
    method: 'POST',
    body: { token },
    schema: invitationDetailsSchema,
    signal,
  });
}

export const invitationQueryOptions = (token: string) =>
  queryOptions({
    queryKey: ['invitation', token] as const,
    queryFn: ({ signal }) => lookupInvitation(token, signal),
    staleTime: Infinity,
    retry: false,
  });

export function useInvitationDetails(token: string) {
  return useQuery({ ...invitationQueryOptions(token), enabled: token !== '' });
}
