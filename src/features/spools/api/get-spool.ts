import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest } from '@/lib/api';
import { spoolKeys, spoolSchema, type Spool } from './spool-schemas';

export function getSpool(id: string, signal?: AbortSignal): Promise<Spool> {
  return apiRequest(`/spools/${encodeURIComponent(id)}`, { schema: spoolSchema, signal });
}

export const spoolQueryOptions = (id: string) =>
  queryOptions({
    queryKey: spoolKeys.detail(id),
    queryFn: ({ signal }) => getSpool(id, signal),
    // The sketch holds unsaved edits; a background refetch must not surprise it.
    staleTime: Infinity,
  });

export function useSpool(id: string) {
  return useQuery(spoolQueryOptions(id));
}
