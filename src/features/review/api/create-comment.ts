import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '@/lib/api';
import { commentSchema, reviewKeys, type ReviewComment } from './review-schemas';

export interface CreateCommentInput {
  readonly spoolId: string;
  readonly body: string;
  /** Pin to an element; omit for the whole spool. */
  readonly elementId?: string | undefined;
}

export function createComment({
  spoolId,
  body,
  elementId,
}: CreateCommentInput): Promise<ReviewComment> {
  return apiRequest(`/spools/${encodeURIComponent(spoolId)}/comments`, {
    method: 'POST',
    body: { body, elementId },
    schema: commentSchema,
  });
}

export function useCreateComment() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: createComment,
    onSuccess: async (_c, input) => {
      await qc.invalidateQueries({ queryKey: reviewKeys.comments(input.spoolId) });
      await qc.invalidateQueries({ queryKey: reviewKeys.waiting() });
    },
  });
}
