import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest } from '@/lib/api';
import { reviewKeys, waitingSchema, type Waiting } from './review-schemas';

export function getWaiting(signal?: AbortSignal): Promise<Waiting> {
  return apiRequest('/waiting', { schema: waitingSchema, signal });
}

export const waitingQueryOptions = () =>
  queryOptions({
    queryKey: reviewKeys.waiting(),
    queryFn: ({ signal }) => getWaiting(signal),
    staleTime: 30_000,
  });

/** The spools waiting on the signed-in member's role. */
export function useWaiting(enabled = true) {
  return useQuery({ ...waitingQueryOptions(), enabled });
}
