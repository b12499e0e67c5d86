import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest } from '@/lib/api';
import { reviewKeys, revisionSchema, type Revision } from './review-schemas';

export function getRevision(
  spoolId: string,
  revision: number,
  signal?: AbortSignal,
): Promise<Revision> {
  return apiRequest(`/spools/${encodeURIComponent(spoolId)}/revisions/${revision}`, {
    schema: revisionSchema,
    signal,
  });
}

export const revisionQueryOptions = (spoolId: string, revision: number) =>
  queryOptions({
    queryKey: reviewKeys.revision(spoolId, revision),
    queryFn: ({ signal }) => getRevision(spoolId, revision, signal),
  });

/** One revision with its document (frozen revisions never change; the current one follows saves). */
export function useRevision(spoolId: string, revision: number | null) {
  return useQuery({
    ...revisionQueryOptions(spoolId, revision ?? -1),
    enabled: revision !== null && revision >= 0,
  });
}
