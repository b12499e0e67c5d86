import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '@/lib/api';
import { reviewKeys } from '@/features/review/api/review-schemas';
import { spoolKeys, spoolSchema, type Spool, type SpoolStatus } from './spool-schemas';

export interface TransitionInput {
  readonly id: string;
  readonly to: SpoolStatus;
  readonly note?: string;
}

export function transitionSpool({ id, to, note }: TransitionInput): Promise<Spool> {
  return apiRequest(`/spools/${encodeURIComponent(id)}/transitions`, {
    method: 'POST',
    body: { to, note },
    schema: spoolSchema,
  });
}

export function useTransitionSpool() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: transitionSpool,
    onSuccess: async (spool) => {
      qc.setQueryData(spoolKeys.detail(spool.id), spool);
      await qc.invalidateQueries({ queryKey: spoolKeys.lists() });
      await qc.invalidateQueries({ queryKey: spoolKeys.revisions(spool.id) });
      // A return adds its note as a comment; every move adds an event and changes the queues.
      await qc.invalidateQueries({ queryKey: reviewKeys.comments(spool.id) });
      await qc.invalidateQueries({ queryKey: reviewKeys.events(spool.id) });
      await qc.invalidateQueries({ queryKey: reviewKeys.waiting() });
    },
  });
}
