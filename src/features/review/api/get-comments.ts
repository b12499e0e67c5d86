import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest } from '@/lib/api';
import { commentListSchema, reviewKeys, type ReviewComment } from './review-schemas';

export async function getComments(spoolId: string, signal?: AbortSignal): Promise<ReviewComment[]> {
  const r = await apiRequest(`/spools/${encodeURIComponent(spoolId)}/comments`, {
    schema: commentListSchema,
    signal,
  });
  return r.items;
}

export const commentsQueryOptions = (spoolId: string) =>
  queryOptions({
    queryKey: reviewKeys.comments(spoolId),
    queryFn: ({ signal }) => getComments(spoolId, signal),
  });

/** Every comment of the spool, all revisions, oldest first. */
export function useComments(spoolId: string) {
  return useQuery(commentsQueryOptions(spoolId));
}
