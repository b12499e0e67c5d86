import { Router } from 'express';
import { getTeamId, requirePermission } from '../auth/member';
import { notFound } from '../errors';
import type { RecheckJobs } from '../jobs/recheck-jobs';
import { intParam } from '../validation';

/** /api/admin/jobs: the team's background jobs (re-checks after a materials change), newest first. */
export function jobsRouter(deps: { jobs: RecheckJobs }) {
  const r = Router();
  r.get('/', requirePermission('materials:manage'), async (_req, res) => {
    res.json({ items: await deps.jobs.list(getTeamId(res)) });
  });
  r.get('/:jobId', requirePermission('materials:manage'), async (req, res) => {
    const job = await deps.jobs.get(getTeamId(res), intParam(req.params.jobId, 'Job not found'));
    if (!job) throw notFound('Job not found');
    res.json(job);
  });
  return r;
}
