import { Router, type Request, type Response } from 'express';
import { and, eq, sql } from 'drizzle-orm';
import type { Db } from '../db/client';
import { teamMaterials } from '../db/schema';
import { getContext, getTeamId, requirePermission, requireSignedIn } from '../auth/member';
import { HttpError, notFound, validationError } from '../errors';
import { parseBody } from '../validation';
import {
  buildTeamMaterial,
  isFromMemory,
  teamMaterialInputSchema,
} from '../../shared/model/team-material';
import { parseCsv, receiveCsv } from '../csv';
import { textParam } from '../validation';
import { TEXT_LIMITS, text } from '../../shared/model/fields';
import { readMaterialsCsv, type TeamMaterials } from '../materials/team-materials';
import { MATERIALS, type Material } from '../../shared/data/materials';
import type { RecheckJobs } from '../jobs/recheck-jobs';
import {
  NPS_SIZES,
  PIPE_DIMENSION_SOURCES,
  SCHEDULES,
  getPipeSize,
  listPipeWalls,
} from '../../shared/data/pipe-dimensions';

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
      walls: listPipeWalls(nps).map((w) => ({
        schedule: w.schedule,
        standard: w.standard,
        wallIn: w.wallIn,
        wallMm: w.wallMm,
        odIn: w.odIn,
        odMm: w.odMm,
      })),
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
    res.json({
      items: teamId
        ? await materials.list(teamId)
        : MATERIALS.map((m) => ({ ...m, origin: 'library' as const })),
    });
  });

  /** Source note and parsed rows of a materials upload; problems come back as issues, nothing is written. */
  const readUpload = (req: Request, res: Response) => {
    const fromBody = (req.body as Record<string, unknown> | undefined)?.source;
    const source = text(500, { trim: true, min: 3 }).safeParse(
      typeof fromBody === 'string' ? fromBody : req.query.source,
    );
    const problem = source.success ? '' : (source.error.issues[0]?.message ?? '');
    const sourceIssue = source.success
      ? []
      : [
          {
            line: null,
            column: 'source',
            path: 'source',
            message: /U\+0000|surrogate|at most/.test(problem)
              ? problem
              : 'give the source of the values (table, edition, document), at least 3 characters',
          },
        ];
    const csv = parseCsv(String(res.locals.csv ?? ''));
    if (csv.errors.length > 0) {
      return {
        source: source.data,
        materials: [],
        sourceIssue,
        issues: csv.errors.map((e) => ({
          line: e.line,
          column: null,
          path: `line ${e.line}`,
          message: e.message,
        })),
      };
    }
    const out = readMaterialsCsv(csv.headers, csv.rows, source.data ?? '');
    return { source: source.data, materials: out.materials, sourceIssue, issues: out.issues };
  };

  const saveMaterials = async (
    teamId: string,
    userId: string,
    list: readonly Material[],
    sourceNote: string,
  ) => {
    await db.transaction(async (tx) => {
      for (const m of list) {
        await tx
          .insert(teamMaterials)
          .values({ teamId, id: m.id, material: m, sourceNote, createdBy: userId })
          .onConflictDoUpdate({
            target: [teamMaterials.teamId, teamMaterials.id],
            set: { material: m, sourceNote, updatedAt: sql`now()` },
          });
      }
    });
  };

  // Dry run of the materials CSV: every problem by line and column, and what would be written. Never writes.
  r.post(
    '/materials/import/preview',
    requirePermission('materials:manage'),
    receiveCsv,
    async (req, res) => {
      const up = readUpload(req, res);
      const teamId = getTeamId(res);
      const current = new Map((await materials.list(teamId)).map((m) => [m.id, m.origin]));
      const issues = [...up.sourceIssue, ...up.issues];
      res.json({
        ok: issues.length === 0,
        issues,
        items: up.materials.map((m) => ({
          id: m.id,
          spec: m.spec,
          grade: m.grade,
          name: m.name,
          rows: m.stress.length,
          minTempF: m.stress[0]?.tempF ?? null,
          maxTempF: m.stress[m.stress.length - 1]?.tempF ?? null,
          fromMemory: isFromMemory(m),
          replaces: current.get(m.id) ?? null,
        })),
      });
    },
  );

  // Materials CSV with a source note (multipart field `source`, or ?source= with text/csv); all rows or none.
  r.post(
    '/materials/import',
    requirePermission('materials:manage'),
    receiveCsv,
    async (req, res) => {
      const up = readUpload(req, res);
      if (up.sourceIssue.length > 0 || up.source === undefined)
        throw validationError(up.sourceIssue);
      if (up.issues.length > 0) {
        throw validationError(
          up.issues,
          `${up.issues.length} problem${up.issues.length === 1 ? '' : 's'} in the materials file; nothing was imported`,
        );
      }
      const teamId = getTeamId(res);
      const userId = getContext(res).user.id;
      await saveMaterials(teamId, userId, up.materials, up.source);
      const job = await refresh(
        teamId,
        `materials import (${up.materials.length} material${up.materials.length === 1 ? '' : 's'})`,
        userId,
      );
      res.status(201).json({
        imported: up.materials.length,
        items: up.materials,
        job,
        recheckJob: { id: String(job.id) },
      });
    },
  );

  // One material from the form (shared schema); an id the team already has is a conflict.
  r.post('/materials', requirePermission('materials:manage'), async (req, res) => {
    const input = parseBody(teamMaterialInputSchema, req.body ?? {});
    const teamId = getTeamId(res);
    const [existing] = await db
      .select({ id: teamMaterials.id })
      .from(teamMaterials)
      .where(and(eq(teamMaterials.teamId, teamId), eq(teamMaterials.id, input.id)))
      .limit(1);
    if (existing)
      throw new HttpError(
        409,
        'conflict',
        `The team already has a material ${input.id}; delete it first or upload a CSV to replace it`,
        [{ path: 'id', message: 'is already a team material' }],
      );
    const material = buildTeamMaterial(input);
    const userId = getContext(res).user.id;
    await saveMaterials(teamId, userId, [material], input.sourceNote);
    const job = await refresh(teamId, `material ${input.id} added`, userId);
    res.status(201).json({
      item: { ...material, origin: 'team', sourceNote: input.sourceNote },
      replaces: MATERIALS.some((m) => m.id === input.id) ? 'library' : null,
      job,
      recheckJob: { id: String(job.id) },
    });
  });

  r.delete('/materials/:id', requirePermission('materials:manage'), async (req, res) => {
    const teamId = getTeamId(res);
    const gone = await db
      .delete(teamMaterials)
      .where(
        and(
          eq(teamMaterials.teamId, teamId),
          eq(
            teamMaterials.id,
            textParam(req.params.id, 'The team has no material with this id', TEXT_LIMITS.id),
          ),
        ),
      )
      .returning({ id: teamMaterials.id });
    if (gone.length === 0) throw notFound('The team has no material with this id');
    const job = await refresh(teamId, `material ${gone[0]!.id} deleted`, getContext(res).user.id);
    res.json({ deleted: gone[0]!.id, job, recheckJob: { id: String(job.id) } });
  });
  r.get('/dimensions', requireSignedIn, (_req, res) => {
    dimensions ??= buildDimensions();
    res.json(dimensions);
  });
  return r;
}
