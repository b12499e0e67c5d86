import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiRequest, isApiError } from '@/lib/api';

export const meSchema = z.object({
  user: z.object({ id: z.string(), email: z.string(), name: z.string().nullish() }),
  team: z.object({ id: z.string(), name: z.string() }).nullish(),
  role: z.string().nullable(),
  permissions: z.array(z.string()).default([]),
});
export type Me = z.infer<typeof meSchema>;

/** The signed-in user, or `null` when signed out (401). */
export async function getMe(signal?: AbortSignal): Promise<Me | null> {
  try {
    return await apiRequest('/me', { schema: meSchema, signal });
  } catch (e) {
    if (isApiError(e) && e.status === 401) return null;
    throw e;
  }
}

export const meQueryKey = ['me'] as const;

export const meQueryOptions = () =>
  queryOptions({ queryKey: meQueryKey, queryFn: ({ signal }) => getMe(signal), staleTime: 60_000 });

export function useMe() {
  return useQuery(meQueryOptions());
}
