import { Router } from 'express';
import { z } from 'zod';
import { and, asc, eq, inArray, isNull } from 'drizzle-orm';
import type { Db } from '../db/client';
import { shareLinks, spoolComments, teamMembers, user } from '../db/schema';
import { getContext, getTeamId, requirePermission } from '../auth/member';
import { HttpError, forbidden, notFound, validationError } from '../errors';
import { countCsvRows, parseCsv, receiveCsv } from '../csv';
import { LINE_LIST_MAX_ROWS, readLineList } from '../spools/line-list';
import type { TeamMaterials } from '../materials/team-materials';
import { sendQuietly, type Mailer } from '../mail/mailer';
import type { Logger } from '../logger';
import { intParam, parseBody, parseDocument, textParam } from '../validation';
import { int, ownKeyOf, text } from '../../shared/model/fields';
import {
  can,
  findTransition,
  SPOOL_STATUSES,
  type Action,
  type Role,
  type SpoolStatus,
} from '../../shared/model/permissions';
import type { CheckPool } from '../checks/pool';
import type { SpoolDocument } from '../../shared/model/spool';
import {
  SORTS,
  getRevision,
  getSpool,
  getSpools,
  insertSpool,
  insertSpools,
  listEvents,
  listRevisions,
  listSpools,
  saveSpool,
  softDeleteSpool,
  transitionSpool,
  type SpoolSort,
} from '../spools/repo';

const statusSchema = z.enum(SPOOL_STATUSES);

const listQuerySchema = z.object({
  search: text(200, { trim: true }).optional(),
  status: text(200)
    .optional()
    .transform((s, ctx) => {
      if (!s) return undefined;
      const parts = s
        .split(',')
        .map((p) => p.trim())
        .filter(Boolean);
      const bad = parts.find((p) => !(SPOOL_STATUSES as readonly string[]).includes(p));
      if (bad !== undefined) {
        ctx.addIssue({
          code: 'custom',
          message: `unknown status "${bad}" (use ${SPOOL_STATUSES.join(', ')})`,
        });
        return z.NEVER;
      }
      return parts as SpoolStatus[];
    }),
  // Own keys only: `__proto__`, `toString` and other inherited names are not sorts.
  sort: ownKeyOf(SORTS).optional().default('-updatedAt') as z.ZodType<
    SpoolSort,
    string | undefined
  >,
  page: z.coerce.number().int().min(1).max(100_000).optional().default(1),
  pageSize: z.coerce.number().int().min(1).max(500).optional().default(50),
});

const saveBodySchema = z.object({
  document: z.unknown(),
  /** The version you loaded. */
  baseVersion: int(1),
});

const transitionBodySchema = z.object({
  to: statusSchema,
  note: text(2000, { trim: true }).optional(),
  baseVersion: int(1).optional(),
});

/** The action a move to `to` needs (the permission table decides who holds it). */
const ACTION_FOR_TARGET: Record<SpoolStatus, Action> = {
  submitted: 'spool:submit',
  checked: 'spool:check',
  draft: 'spool:check',
  released: 'spool:release',
};

/** Who hears about a transition: the role that acts next. */
const NEXT_ROLES: Partial<Record<SpoolStatus, Role[]>> = {
  submitted: ['checker', 'lead'],
  checked: ['lead'],
  released: ['fabricator'],
};

const idParam = (raw: unknown): string => textParam(raw, 'Spool not found', 100);

export function spoolsRouter(deps: {
  db: Db;
  mailer: Mailer;
  logger: Logger;
  publicUrl: string;
  materials: TeamMaterials;
  checks: CheckPool;
}) {
  const { db, mailer, logger } = deps;
  const r = Router();

  /** Check with the team's materials and keep what the list shows. */
  const checkDocument = async (teamId: string, doc: SpoolDocument) =>
    (await deps.checks.summaries([doc], await deps.materials.ref(teamId)))[0]!;

  r.get('/', requirePermission('spool:view'), async (req, res) => {
    const q = parseBody(listQuerySchema, req.query, ['query']);
    res.json(await listSpools(db, getTeamId(res), q));
  });

  r.post('/', requirePermission('spool:edit'), async (req, res) => {
    const body = parseBody(z.object({ document: z.unknown() }), req.body ?? {});
    const document = parseDocument(body.document, ['document']);
    const ctx = getContext(res);
    const teamId = getTeamId(res);
    const id = await insertSpool(db, {
      teamId,
      userId: ctx.user.id,
      document,
      checkSummary: await checkDocument(teamId, document),
    });
    res
      .status(201)
      .location(`/api/spools/${id}`)
      .json(await getSpool(db, teamId, id));
  });

  // Dry run of the line-list CSV: the spools it would create and every bad cell by line and column. Never writes.
  r.post('/import/preview', requirePermission('spool:edit'), receiveCsv, async (_req, res) => {
    const text = String(res.locals.csv ?? '');
    if (countCsvRows(text, LINE_LIST_MAX_ROWS) > LINE_LIST_MAX_ROWS) {
      throw validationError(
        [
          {
            path: 'file',
            message: `has more than ${LINE_LIST_MAX_ROWS.toLocaleString('en-US')} data rows; split it into files of at most ${LINE_LIST_MAX_ROWS.toLocaleString('en-US')} rows`,
          },
        ],
        `A line list may hold at most ${LINE_LIST_MAX_ROWS.toLocaleString('en-US')} rows per import`,
      );
    }
    const csv = parseCsv(text);
    if (csv.errors.length > 0) {
      res.json({
        ok: false,
        issues: csv.errors.map((e) => ({
          path: `line ${e.line}`,
          line: e.line,
          column: null,
          message: e.message,
        })),
        items: [],
      });
      return;
    }
    const { docs, lines, issues } = await readLineList(csv.headers, csv.rows);
    const items = docs.map((document, i) => ({
      line: lines[i] ?? null,
      name: document.name,
      pipeLine: document.line ?? '',
      units: document.units,
      conditions: document.conditions,
    }));
    res.json({ ok: issues.length === 0, issues, items, rows: csv.rows.length });
  });

  // Line-list CSV: one spool per row with its design conditions; all rows or none.
  // At most LINE_LIST_MAX_ROWS rows, refused before parsing; reading and validating yield to
  // the event loop every few milliseconds, so an import never stalls other requests.
  r.post('/import', requirePermission('spool:edit'), receiveCsv, async (_req, res) => {
    const text = String(res.locals.csv ?? '');
    const rowCount = countCsvRows(text, LINE_LIST_MAX_ROWS);
    if (rowCount > LINE_LIST_MAX_ROWS) {
      throw validationError(
        [
          {
            path: 'file',
            message: `has more than ${LINE_LIST_MAX_ROWS.toLocaleString('en-US')} data rows; split it into files of at most ${LINE_LIST_MAX_ROWS.toLocaleString('en-US')} rows`,
          },
        ],
        `A line list may hold at most ${LINE_LIST_MAX_ROWS.toLocaleString('en-US')} rows per import; nothing was imported`,
      );
    }
    const teamId = getTeamId(res);
    const userId = getContext(res).user.id;
    // Parsing, validating and checking the rows happen in the check pool.
    const { documents: docs, summaries } = await deps.checks.lineList(
      text,
      await deps.materials.ref(teamId),
    );
    const items = docs.map((document, i) => ({ document, checkSummary: summaries[i] ?? null }));
    const ids = await db.transaction((tx) =>
      insertSpools(tx as unknown as Db, { teamId, userId, items }, 25),
    );
    res.status(201).json({ created: ids.length, items: await getSpools(db, teamId, ids, 50) });
  });

  r.get('/:id', requirePermission('spool:view'), async (req, res) => {
    const spool = await getSpool(db, getTeamId(res), idParam(req.params.id));
    if (!spool) throw notFound('Spool not found');
    res.json(spool);
  });

  r.put('/:id', requirePermission('spool:edit'), async (req, res) => {
    const id = idParam(req.params.id);
    const body = parseBody(saveBodySchema, req.body ?? {});
    const document = parseDocument(body.document, ['document']);
    const teamId = getTeamId(res);
    const out = await saveSpool(db, {
      teamId,
      id,
      userId: getContext(res).user.id,
      baseVersion: body.baseVersion,
      document,
      checkSummary: await checkDocument(teamId, document),
    });
    if (out.kind === 'not_found') throw notFound('Spool not found');
    if (out.kind === 'conflict') {
      const current = await getSpool(db, teamId, id);
      if (!current) throw notFound('Spool not found');
      throw new HttpError(
        409,
        'conflict',
        `Someone saved this spool since you loaded it (now version ${current.version})`,
        { current },
      );
    }
    res.json(await getSpool(db, teamId, id));
  });

  r.delete('/:id', requirePermission('spool:delete'), async (req, res) => {
    const id = idParam(req.params.id);
    const teamId = getTeamId(res);
    const ok = await softDeleteSpool(db, teamId, id, getContext(res).user.id);
    if (!ok) throw notFound('Spool not found');
    // Its share links stop working with it.
    await db
      .update(shareLinks)
      .set({ revokedAt: new Date() })
      .where(
        and(
          eq(shareLinks.spoolId, id),
          eq(shareLinks.teamId, teamId),
          isNull(shareLinks.revokedAt),
        ),
      );
    res.status(204).end();
  });

  r.post('/:id/transitions', requirePermission('spool:view'), async (req, res) => {
    const id = idParam(req.params.id);
    const body = parseBody(transitionBodySchema, req.body ?? {});
    const ctx = getContext(res);
    if (!can(ctx.role, ACTION_FOR_TARGET[body.to]))
      throw forbidden(`Your role (${ctx.role ?? 'none'}) cannot move a spool to ${body.to}`);
    const teamId = getTeamId(res);
    if (body.to === 'checked') {
      // A spool is not checked while a comment of the revision under check is still open.
      const before = await getSpool(db, teamId, id);
      if (!before) throw notFound('Spool not found');
      const open = await db
        .select({
          id: spoolComments.id,
          elementId: spoolComments.elementId,
          body: spoolComments.body,
        })
        .from(spoolComments)
        .where(
          and(
            eq(spoolComments.spoolId, id),
            eq(spoolComments.revision, before.revision),
            isNull(spoolComments.resolvedAt),
          ),
        )
        .orderBy(asc(spoolComments.id));
      if (open.length > 0) {
        const where = open
          .map(
            (c) =>
              `${c.elementId ?? 'spool'} (“${c.body.length > 40 ? `${c.body.slice(0, 40)}…` : c.body}”)`,
          )
          .join(', ');
        throw new HttpError(
          409,
          'open_comments',
          `${open.length} comment${open.length === 1 ? ' is' : 's are'} still open on revision ${before.revision}: ${where}. Resolve ${open.length === 1 ? 'it' : 'them'} first.`,
          { revision: before.revision, comments: open },
        );
      }
    }
    const out = await transitionSpool(db, {
      teamId,
      id,
      userId: ctx.user.id,
      to: body.to,
      note: body.note,
      baseVersion: body.baseVersion,
      isAllowed: (from, to) => findTransition(from, to) !== undefined,
    });
    if (out.kind === 'not_found') throw notFound('Spool not found');
    if (out.kind === 'conflict') {
      throw new HttpError(409, 'conflict', 'Someone changed this spool since you loaded it', {
        current: await getSpool(db, teamId, id),
      });
    }
    if (out.kind === 'invalid') {
      throw new HttpError(
        409,
        'invalid_transition',
        `A ${out.from} spool cannot move to ${body.to}`,
        { from: out.from, to: body.to },
      );
    }
    if (out.kind === 'check_failed') {
      throw new HttpError(
        409,
        'check_failed',
        'A spool with failing or invalid elements cannot be released',
        { summary: out.summary },
      );
    }
    if (body.to === 'draft' && body.note) {
      // The reason for a return is the first comment the designer reads on the revision.
      await db.insert(spoolComments).values({
        spoolId: id,
        revision: out.revision,
        elementId: null,
        body: body.note,
        userId: ctx.user.id,
      });
    }
    const spool = await getSpool(db, teamId, id);
    if (!spool) throw notFound('Spool not found');
    await notifyTransition({
      teamId,
      spoolName: spool.name,
      spoolId: id,
      from: out.from,
      to: body.to,
      note: body.note,
      actor: ctx.user,
      lastEditors: out.lastEditors,
    });
    res.json(spool);
  });

  r.get('/:id/revisions', requirePermission('spool:view'), async (req, res) => {
    const items = await listRevisions(db, getTeamId(res), idParam(req.params.id));
    if (!items) throw notFound('Spool not found');
    res.json({ items });
  });

  r.get('/:id/revisions/:rev', requirePermission('spool:view'), async (req, res) => {
    const rev = intParam(req.params.rev, 'Revision not found');
    const out = await getRevision(db, getTeamId(res), idParam(req.params.id), rev);
    if (!out) throw notFound('Revision not found');
    res.json(out);
  });

  r.get('/:id/events', requirePermission('spool:view'), async (req, res) => {
    const id = idParam(req.params.id);
    const spool = await getSpool(db, getTeamId(res), id);
    if (!spool) throw notFound('Spool not found');
    res.json({ items: await listEvents(db, id) });
  });

  async function notifyTransition(n: {
    teamId: string;
    spoolId: string;
    spoolName: string;
    from: SpoolStatus;
    to: SpoolStatus;
    note: string | undefined;
    actor: { id: string; name: string };
    lastEditors: string[];
  }) {
    const roles = NEXT_ROLES[n.to];
    let rows: { email: string; id: string }[];
    if (roles) {
      rows = await db
        .select({ email: user.email, id: user.id })
        .from(teamMembers)
        .innerJoin(user, eq(user.id, teamMembers.userId))
        .where(and(eq(teamMembers.teamId, n.teamId), inArray(teamMembers.role, roles)));
    } else if (n.lastEditors.length > 0) {
      rows = await db
        .select({ email: user.email, id: user.id })
        .from(user)
        .where(inArray(user.id, n.lastEditors));
    } else rows = [];
    const to = [...new Set(rows.filter((r) => r.id !== n.actor.id).map((r) => r.email))];
    if (to.length === 0) return;
    const verb = n.to === 'draft' ? 'returned to draft' : n.to;
    await sendQuietly(mailer, logger, {
      to,
      subject: `Spool ${n.spoolName} ${verb}`,
      text:
        `${n.actor.name} moved spool ${n.spoolName} from ${n.from} to ${n.to}.\n` +
        (n.note ? `\nNote: ${n.note}\n` : '') +
        `\nOpen it: ${deps.publicUrl}/spools/${n.spoolId}\n`,
    });
  }

  return r;
}
