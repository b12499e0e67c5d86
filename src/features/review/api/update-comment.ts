import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '@/lib/api';
import { commentSchema, reviewKeys, type ReviewComment } from './review-schemas';

export interface UpdateCommentInput {
  readonly spoolId: string;
  readonly commentId: number;
  readonly resolved: boolean;
}

/** Resolve or reopen a comment. */
export function updateComment({
  spoolId,
  commentId,
  resolved,
}: UpdateCommentInput): Promise<ReviewComment> {
  return apiRequest(`/spools/${encodeURIComponent(spoolId)}/comments/${commentId}`, {
    method: 'PATCH',
    body: { resolved },
    schema: commentSchema,
  });
}

export function useUpdateComment() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: updateComment,
    onSuccess: async (_c, input) => {
      await qc.invalidateQueries({ queryKey: reviewKeys.comments(input.spoolId) });
      await qc.invalidateQueries({ queryKey: reviewKeys.waiting() });
    },
  });
}
