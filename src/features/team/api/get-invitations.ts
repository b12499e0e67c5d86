import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiRequest } from '@/lib/api';
import { invitationSchema, teamKeys } from './team-schemas';

const listSchema = z.object({ items: z.array(invitationSchema) });

/** `GET /api/team/invitations` (admin): invitations sent, newest first, with their state. */
export async function getInvitations(signal?: AbortSignal) {
  return (await apiRequest('/team/invitations', { schema: listSchema, signal })).items;
}

export const invitationsQueryOptions = () =>
  queryOptions({
    queryKey: teamKeys.invitations(),
    queryFn: ({ signal }) => getInvitations(signal),
  });

export function useInvitations() {
  return useQuery(invitationsQueryOptions());
}
