import { Router, type Response } from 'express';
import { z } from 'zod';
import type { Db } from '../db/client';
import { getContext, getTeamId, requirePermission } from '../auth/member';
import { HttpError, notFound } from '../errors';
import { parseBody } from '../validation';
import { getRevision, getSpool, listEvents } from '../spools/repo';
import { runCheck } from '../spools/check';
import type { TeamMaterials } from '../materials/team-materials';
import { findActiveShare, teamSourceNotes } from './shares';
import { omitSourceNotes } from '../spools/share-tokens';
import { buildCalcSheet, formatUtc, type CalcSheet } from '../../shared/report/calc-sheet';
import { renderCalcSheetPdf } from '../../shared/report/calc-sheet-pdf';

const querySchema = z.object({
  revision: z
    .string()
    .optional()
    .refine((s) => s === undefined || /^\d{1,9}$/.test(s), {
      message: 'must be a whole revision number (0, 1, 2 …)',
    })
    .transform((s) => (s === undefined ? undefined : Number(s))),
});

/** A file name from the spool name and revision: "CW-101-01-rev2-calc-sheet.pdf". */
export function calcSheetFileName(name: string, revision: number): string {
  const base =
    name
      .replace(/[^\w.-]+/g, '-')
      .replace(/^-+|-+$/g, '')
      .slice(0, 80) || 'spool';
  return `${base}-rev${revision}-calc-sheet.pdf`;
}

/**
 * Largest spool drawn as a PDF on a request: the renderer runs on the server's event loop
 * (a 100-element sheet takes a few seconds), so a 20,000-element document is refused with a
 * clear message instead of stalling every other request. The headless checker has no limit.
 */
export const CALC_SHEET_MAX_ELEMENTS = 500;

async function sendPdf(res: Response, sheet: CalcSheet, fileName: string) {
  if (sheet.elements.length > CALC_SHEET_MAX_ELEMENTS) {
    throw new HttpError(
      413,
      'payload_too_large',
      `A calc sheet PDF is made for spools of up to ${CALC_SHEET_MAX_ELEMENTS} elements; this one has ${sheet.elements.length}. Use "npm run check -- --pdf" for larger spools.`,
      { elements: sheet.elements.length, limit: CALC_SHEET_MAX_ELEMENTS },
    );
  }
  const pdf = await renderCalcSheetPdf(sheet);
  res.setHeader('Content-Type', 'application/pdf');
  res.setHeader('Content-Disposition', `attachment; filename="${fileName}"`);
  res.setHeader('Content-Length', String(pdf.length));
  res.end(pdf);
}

/** GET /api/spools/:id/calc-sheet.pdf?revision=N — the filed record of a revision (view permission). */
export function calcSheetRouter(deps: { db: Db; materials: TeamMaterials }) {
  const r = Router();
  r.get('/:id/calc-sheet.pdf', requirePermission('spool:view'), async (req, res) => {
    const id = String(req.params.id ?? '');
    if (id.length === 0 || id.length > 100) throw notFound('Spool not found');
    const q = parseBody(querySchema, req.query, ['query']);
    const teamId = getTeamId(res);
    const ctx = getContext(res);
    const spool = await getSpool(deps.db, teamId, id);
    if (!spool) throw notFound('Spool not found');
    const rev = await getRevision(deps.db, teamId, id, q.revision ?? spool.revision);
    if (!rev) throw notFound(`Revision ${q.revision ?? spool.revision} of this spool not found`);
    const check = runCheck(rev.document, await deps.materials.finder(teamId));
    const history = (await listEvents(deps.db, id)).filter((e) => e.revision === rev.revision);
    const sheet = buildCalcSheet({
      team: ctx.team?.name ?? null,
      revision: rev.revision,
      state: rev.status,
      document: rev.document,
      check,
      history,
      generatedAt: new Date().toISOString(),
    });
    await sendPdf(res, sheet, calcSheetFileName(rev.name, rev.revision));
  });
  return r;
}

/**
 * GET /api/share/:token/calc-sheet.pdf — the shared revision's calc sheet, public. It carries
 * only what the share view shows: no team name and no history (who moved it when).
 */
export function publicCalcSheetRouter(deps: { db: Db; materials: TeamMaterials }) {
  const r = Router();
  r.get('/:token/calc-sheet.pdf', async (req, res) => {
    const row = await findActiveShare(deps.db, String(req.params.token));
    const check = omitSourceNotes(
      runCheck(row.document, await deps.materials.finder(row.teamId)),
      await teamSourceNotes(deps.materials, row.teamId),
    );
    const sheet = buildCalcSheet({
      team: null,
      revision: row.revision,
      state: row.status,
      document: row.document,
      check,
      history: [],
      historyNote:
        "A shared copy does not include the history of the revision; ask the spool's team for the filed record.",
      generatedAt: new Date().toISOString(),
      origin: `shared read-only link, created ${formatUtc(row.createdAt.toISOString())}, expires ${formatUtc(row.expiresAt.toISOString())}`,
    });
    await sendPdf(res, sheet, calcSheetFileName(row.name, row.revision));
  });
  return r;
}
