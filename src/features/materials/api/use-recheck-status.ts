import { useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiRequest } from '@/lib/api';
import type { RecheckFields } from './material-schemas';

export type RecheckStatus =
  | { state: 'done'; count: number }
  | { state: 'running'; jobId: string; done: number; total: number }
  | { state: 'failed'; error: string }
  | { state: 'unknown' };

const jobSchema = z.object({
  id: z.number(),
  status: z.enum(['queued', 'running', 'done', 'failed']),
  total: z.number(),
  done: z.number(),
  error: z.string().nullable(),
});

/**
 * How far the re-check of the team's spools after a library change has got. The server runs it
 * as a background job (`recheckJob` in the answer): this polls GET /api/admin/jobs/:id every
 * half second until the job is done, then gives its count. An answer with a final `rechecked`
 * count is shown as it is.
 */
export function useRecheckStatus(result: RecheckFields | undefined): RecheckStatus {
  const jobId = result && typeof result.rechecked !== 'number' ? result.recheckJob?.id : undefined;
  const job = useQuery({
    queryKey: ['admin', 'jobs', jobId],
    queryFn: ({ signal }) =>
      apiRequest(`/admin/jobs/${encodeURIComponent(jobId!)}`, { schema: jobSchema, signal }),
    enabled: jobId !== undefined,
    refetchInterval: (q) =>
      q.state.data && (q.state.data.status === 'done' || q.state.data.status === 'failed')
        ? false
        : 500,
  });
  if (!result) return { state: 'unknown' };
  if (typeof result.rechecked === 'number') return { state: 'done', count: result.rechecked };
  if (jobId === undefined) return { state: 'unknown' };
  const j = job.data;
  if (j?.status === 'done') return { state: 'done', count: j.done };
  if (j?.status === 'failed') return { state: 'failed', error: j.error ?? 'the re-check failed' };
  return { state: 'running', jobId, done: j?.done ?? 0, total: j?.total ?? 0 };
}
