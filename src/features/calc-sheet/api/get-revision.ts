import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import type { SpoolDocument } from '@shared/model/spool';
import { apiRequest } from '@/lib/api';
import { spoolKeys, spoolStatusSchema } from '@/features/spools/api/spool-schemas';

/** `GET /api/spools/:id/revisions/:rev`: one revision with its document (stored documents were validated on write). */
export const revisionSchema = z
  .object({
    spoolId: z.string(),
    revision: z.number().int(),
    status: spoolStatusSchema,
    name: z.string(),
    line: z.string(),
    current: z.boolean(),
    document: z.custom<SpoolDocument>(
      (v) =>
        typeof v === 'object' &&
        v !== null &&
        Array.isArray((v as { elements?: unknown }).elements),
      'document must be a spool document',
    ),
  })
  .loose();
export type Revision = z.infer<typeof revisionSchema>;

export function getRevision(id: string, revision: number, signal?: AbortSignal): Promise<Revision> {
  return apiRequest(`/spools/${encodeURIComponent(id)}/revisions/${revision}`, {
    schema: revisionSchema,
    signal,
  });
}

export const revisionQueryOptions = (id: string, revision: number) =>
  queryOptions({
    queryKey: [...spoolKeys.revisions(id), revision] as const,
    queryFn: ({ signal }) => getRevision(id, revision, signal),
  });

export function useRevision(id: string, revision: number | undefined) {
  return useQuery({ ...revisionQueryOptions(id, revision ?? -1), enabled: revision !== undefined });
}
