import { Router } from 'express';
import { and, eq, sql } from 'drizzle-orm';
import type { Db } from '../db/client';
import { teamMaterials } from '../db/schema';
import { getContext, getTeamId, requirePermission, requireSignedIn } from '../auth/member';
import { notFound, validationError } from '../errors';
import { parseCsv, receiveCsv } from '../csv';
import { textParam } from '../validation';
import { TEXT_LIMITS, text } from '../../shared/model/fields';
import { readMaterialsCsv, type TeamMaterials } from '../materials/team-materials';
import { MATERIALS } from '../../shared/data/materials';
import type { RecheckJobs } from '../jobs/recheck-jobs';
import { NPS_SIZES, PIPE_DIMENSION_SOURCES, SCHEDULES, getPipeSize, listPipeWalls } from '../../shared/data/pipe-dimensions';

/** Pickers' data: built once, it never changes while the process runs. */
function buildDimensions() {
  const sizes = NPS_SIZES.map((nps) => {
    const size = getPipeSize(nps) ?? getPipeSize(nps, 'B36.19M');
    return {
      nps,
      npsValue: size?.npsValue ?? null,
      dn: size?.dn ?? null,
      odIn: size?.odIn ?? null,
      odMm: size?.odMm ?? null,
      walls: listPipeWalls(nps).map((w) => ({ schedule: w.schedule, standard: w.standard, wallIn: w.wallIn, wallMm: w.wallMm, odIn: w.odIn, odMm: w.odMm })),
    };
  });
  return { schedules: SCHEDULES, sizes, sources: PIPE_DIMENSION_SOURCES };
}

export function catalogRouter(deps: { db: Db; materials: TeamMaterials; jobs: RecheckJobs }) {
  const { db, materials } = deps;
  const r = Router();
  let dimensions: ReturnType<typeof buildDimensions> | undefined;

  /** New materials apply to checks at once; stored summaries follow in a background job. */
  const refresh = (teamId: string, reason: string, userId: string) => {
    materials.invalidate(teamId);
    return deps.jobs.start(teamId, reason, userId);
  };

  /** Library rows (`origin: 'library'`) and the team's own (`origin: 'team'`, with `sourceNote`), team first. */
  r.get('/materials', requireSignedIn, async (_req, res) => {
    const teamId = getContext(res).team?.id;
    res.json({ items: teamId ? await materials.list(teamId) : MATERIALS.map((m) => ({ ...m, origin: 'library' as const })) });
  });

  // Materials CSV with a source note (multipart field `source`, or ?source= with text/csv); all rows or none.
  r.post('/materials/import', requirePermission('materials:manage'), receiveCsv, async (req, res) => {
    const fromBody = (req.body as Record<string, unknown> | undefined)?.source;
    const source = text(500, { trim: true, min: 3 }).safeParse(typeof fromBody === 'string' ? fromBody : req.query.source);
    if (!source.success) {
      const problem = source.error.issues[0]?.message ?? '';
      throw validationError([{ path: 'source', message: /U\+0000|surrogate|at most/.test(problem) ? problem : 'give the source of the values (table, edition, document), at least 3 characters' }]);
    }
    const csv = parseCsv(String(res.locals.csv ?? ''));
    if (csv.errors.length > 0) throw validationError(csv.errors.map((e) => ({ path: `line ${e.line}`, message: e.message })), 'The CSV could not be read');
    const out = readMaterialsCsv(csv.headers, csv.rows, source.data);
    if (out.issues.length > 0) throw validationError(out.issues, `${out.issues.length} problem${out.issues.length === 1 ? '' : 's'} in the materials file; nothing was imported`);
    const teamId = getTeamId(res);
    const userId = getContext(res).user.id;
    await db.transaction(async (tx) => {
      for (const m of out.materials) {
        await tx
          .insert(teamMaterials)
          .values({ teamId, id: m.id, material: m, sourceNote: source.data, createdBy: userId })
          .onConflictDoUpdate({ target: [teamMaterials.teamId, teamMaterials.id], set: { material: m, sourceNote: source.data, updatedAt: sql`now()` } });
      }
    });
    const job = await refresh(teamId, `materials import (${out.materials.length} material${out.materials.length === 1 ? '' : 's'})`, userId);
    res.status(201).json({ imported: out.materials.length, items: out.materials, job });
  });

  r.delete('/materials/:id', requirePermission('materials:manage'), async (req, res) => {
    const teamId = getTeamId(res);
    const gone = await db
      .delete(teamMaterials)
      .where(and(eq(teamMaterials.teamId, teamId), eq(teamMaterials.id, textParam(req.params.id, 'The team has no material with this id', TEXT_LIMITS.id))))
      .returning({ id: teamMaterials.id });
    if (gone.length === 0) throw notFound('The team has no material with this id');
    await refresh(teamId, `material ${gone[0]!.id} deleted`, getContext(res).user.id);
    res.status(204).end();
  });
  r.get('/dimensions', requireSignedIn, (_req, res) => {
    dimensions ??= buildDimensions();
    res.json(dimensions);
  });
  return r;
}
