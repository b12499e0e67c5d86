import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest } from '@/lib/api';
import { shareKeys, shareListSchema, type Share } from './share-schemas';

export async function getShares(spoolId: string, signal?: AbortSignal): Promise<Share[]> {
  const r = await apiRequest(`/spools/${encodeURIComponent(spoolId)}/shares`, {
    schema: shareListSchema,
    signal,
  });
  return r.items;
}

export const sharesQueryOptions = (spoolId: string) =>
  queryOptions({
    queryKey: shareKeys.list(spoolId),
    queryFn: ({ signal }) => getShares(spoolId, signal),
  });

/** Every share link of the spool, newest first (lead, admin). */
export function useShares(spoolId: string, enabled = true) {
  return useQuery({ ...sharesQueryOptions(spoolId), enabled });
}
