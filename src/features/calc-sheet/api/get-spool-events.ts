import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiRequest } from '@/lib/api';
import { spoolKeys } from '@/features/spools/api/spool-schemas';

/** `GET /api/spools/:id/events`: every recorded lifecycle move (who, when, note). */
export const spoolEventsSchema = z.object({
  items: z.array(
    z.object({
      id: z.number(),
      revision: z.number().int(),
      from: z.string(),
      to: z.string(),
      note: z.string().nullable(),
      user: z.object({ id: z.string(), name: z.string() }).nullable(),
      createdAt: z.string(),
    }),
  ),
});
export type SpoolEvent = z.infer<typeof spoolEventsSchema>['items'][number];

export function getSpoolEvents(id: string, signal?: AbortSignal): Promise<SpoolEvent[]> {
  return apiRequest(`/spools/${encodeURIComponent(id)}/events`, {
    schema: spoolEventsSchema,
    signal,
  }).then((d) => d.items);
}

export const spoolEventsQueryOptions = (id: string) =>
  queryOptions({
    queryKey: [...spoolKeys.all, 'events', id] as const,
    queryFn: ({ signal }) => getSpoolEvents(id, signal),
  });

export function useSpoolEvents(id: string) {
  return useQuery(spoolEventsQueryOptions(id));
}
