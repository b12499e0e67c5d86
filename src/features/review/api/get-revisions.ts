import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest } from '@/lib/api';
import { spoolKeys } from '@/features/spools/api/spool-schemas';
import { revisionListSchema, type RevisionInfo } from './review-schemas';

export async function getRevisions(spoolId: string, signal?: AbortSignal): Promise<RevisionInfo[]> {
  const r = await apiRequest(`/spools/${encodeURIComponent(spoolId)}/revisions`, {
    schema: revisionListSchema,
    signal,
  });
  return r.items;
}

export const revisionsQueryOptions = (spoolId: string) =>
  queryOptions({
    queryKey: spoolKeys.revisions(spoolId),
    queryFn: ({ signal }) => getRevisions(spoolId, signal),
  });

/** Every engineering revision of the spool (frozen ones and the current one). */
export function useRevisions(spoolId: string) {
  return useQuery(revisionsQueryOptions(spoolId));
}
