import { useQuery } from '@tanstack/react-query';
import { apiRequest, isApiError } from '@/lib/api';
import { publicShareSchema, shareKeys, type PublicShare } from './share-schemas';

/** The shared revision behind a public link (no session needed; 410 when revoked or expired). */
export function getPublicShare(token: string, signal?: AbortSignal): Promise<PublicShare> {
  return apiRequest(`/share/${encodeURIComponent(token)}`, { schema: publicShareSchema, signal });
}

export function usePublicShare(token: string) {
  return useQuery({
    queryKey: shareKeys.public(token),
    queryFn: ({ signal }) => getPublicShare(token, signal),
    // A revoked, expired or unknown link stays so: no retries.
    retry: (n, e) => !(isApiError(e) && e.status >= 400 && e.status < 500) && n < 2,
    staleTime: Infinity,
  });
}
