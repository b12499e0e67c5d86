import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SpoolDocument } from '@shared/model/spool';
import { apiRequest, isApiError } from '@/lib/api';
import { spoolKeys, spoolSchema, type Spool } from './spool-schemas';

export interface UpdateSpoolInput {
  readonly id: string;
  readonly document: SpoolDocument;
  /** The `version` this edit started from; the server answers 409 when it is stale. */
  readonly baseVersion: number;
}

export function updateSpool({ id, document, baseVersion }: UpdateSpoolInput): Promise<Spool> {
  return apiRequest(`/spools/${encodeURIComponent(id)}`, {
    method: 'PUT',
    body: { document, baseVersion },
    schema: spoolSchema,
  });
}

/** The server's current spool from a 409 answer, or null when the error is something else. */
export function readConflict(error: unknown): Spool | null {
  if (!isApiError(error) || error.status !== 409) return null;
  const details = error.details as { current?: unknown } | undefined;
  const parsed = spoolSchema.safeParse(details?.current);
  return parsed.success ? parsed.data : null;
}

export function useUpdateSpool() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: updateSpool,
    onSuccess: async (spool) => {
      qc.setQueryData(spoolKeys.detail(spool.id), spool);
      await qc.invalidateQueries({ queryKey: spoolKeys.lists() });
      await qc.invalidateQueries({ queryKey: spoolKeys.revisions(spool.id) });
    },
  });
}
