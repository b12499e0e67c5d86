import type { RecheckFields } from './material-schemas';

export type RecheckStatus = { state: 'done'; count: number } | { state: 'running'; jobId: string } | { state: 'unknown' };

/**
 * How far the re-check of the team's spools after a library change has got.
 *
 * Hook for the background re-check job: today the server re-checks before it answers, so the
 * answer's `rechecked` count is final. When the server answers with `recheckJob` instead, poll
 * that job's status route here (a TanStack Query with `refetchInterval` until it finishes) and
 * return its count; the pages already show the `running` state.
 */
export function useRecheckStatus(result: RecheckFields | undefined): RecheckStatus {
  if (!result) return { state: 'unknown' };
  if (typeof result.rechecked === 'number') return { state: 'done', count: result.rechecked };
  if (result.recheckJob) return { state: 'running', jobId: result.recheckJob.id };
  return { state: 'unknown' };
}
