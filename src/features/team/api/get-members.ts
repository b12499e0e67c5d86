import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiRequest } from '@/lib/api';
import { memberSchema, teamKeys } from './team-schemas';

const listSchema = z.object({ items: z.array(memberSchema) });

/** `GET /api/team/members`: everyone in the signed-in member's team. */
export async function getMembers(signal?: AbortSignal) {
  return (await apiRequest('/team/members', { schema: listSchema, signal })).items;
}

export const membersQueryOptions = () =>
  queryOptions({ queryKey: teamKeys.members(), queryFn: ({ signal }) => getMembers(signal) });

export function useMembers() {
  return useQuery(membersQueryOptions());
}
