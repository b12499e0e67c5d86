import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '@/lib/api';
import { shareKeys } from './share-schemas';

export interface RevokeShareInput {
  readonly spoolId: string;
  readonly shareId: string;
}

export async function revokeShare({ spoolId, shareId }: RevokeShareInput): Promise<void> {
  await apiRequest(`/spools/${encodeURIComponent(spoolId)}/shares/${encodeURIComponent(shareId)}`, {
    method: 'DELETE',
  });
}

export function useRevokeShare() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: revokeShare,
    onSuccess: async (_v, input) => {
      await qc.invalidateQueries({ queryKey: shareKeys.list(input.spoolId) });
    },
  });
}
