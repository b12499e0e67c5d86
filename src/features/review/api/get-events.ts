import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest } from '@/lib/api';
import { eventListSchema, reviewKeys, type SpoolEvent } from './review-schemas';

export async function getEvents(spoolId: string, signal?: AbortSignal): Promise<SpoolEvent[]> {
  const r = await apiRequest(`/spools/${encodeURIComponent(spoolId)}/events`, {
    schema: eventListSchema,
    signal,
  });
  return r.items;
}

export const eventsQueryOptions = (spoolId: string) =>
  queryOptions({
    queryKey: reviewKeys.events(spoolId),
    queryFn: ({ signal }) => getEvents(spoolId, signal),
  });

/** The spool's lifecycle events, oldest first. */
export function useEvents(spoolId: string) {
  return useQuery(eventsQueryOptions(spoolId));
}
