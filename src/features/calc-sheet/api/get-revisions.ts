import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiRequest } from '@/lib/api';
import { spoolKeys, spoolStatusSchema } from '@/features/spools/api/spool-schemas';

/** `GET /api/spools/:id/revisions`: every engineering revision, the live one marked current. */
export const revisionListSchema = z.object({
  items: z.array(
    z
      .object({
        revision: z.number().int(),
        status: spoolStatusSchema,
        name: z.string(),
        current: z.boolean(),
      })
      .loose(),
  ),
});
export type RevisionListItem = z.infer<typeof revisionListSchema>['items'][number];

export function getRevisions(id: string, signal?: AbortSignal): Promise<RevisionListItem[]> {
  return apiRequest(`/spools/${encodeURIComponent(id)}/revisions`, {
    schema: revisionListSchema,
    signal,
  }).then((d) => d.items);
}

export const revisionsQueryOptions = (id: string) =>
  queryOptions({
    queryKey: spoolKeys.revisions(id),
    queryFn: ({ signal }) => getRevisions(id, signal),
  });

export function useRevisions(id: string) {
  return useQuery(revisionsQueryOptions(id));
}
