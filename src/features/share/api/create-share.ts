import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '@/lib/api';
import { createdShareSchema, shareKeys, type CreatedShare } from './share-schemas';

export interface CreateShareInput {
  readonly spoolId: string;
  readonly revision?: number | undefined;
  readonly expiresInDays: number;
}

export function createShare({
  spoolId,
  revision,
  expiresInDays,
}: CreateShareInput): Promise<CreatedShare> {
  return apiRequest(`/spools/${encodeURIComponent(spoolId)}/shares`, {
    method: 'POST',
    body: { revision, expiresInDays },
    schema: createdShareSchema,
  });
}

export function useCreateShare() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: createShare,
    onSuccess: async (_s, input) => {
      await qc.invalidateQueries({ queryKey: shareKeys.list(input.spoolId) });
    },
  });
}
