import { randomUUID } from 'node:crypto';
import { Router } from 'express';
import { and, desc, eq } from 'drizzle-orm';
import { z } from 'zod';
import type { Db } from '../db/client';
import { shareLinks, spools, user } from '../db/schema';
import { getContext, getTeamId, requirePermission } from '../auth/member';
import { HttpError, notFound } from '../errors';
import { parseBody } from '../validation';
import { getRevision, getSpool } from '../spools/repo';
import { runCheck } from '../spools/check';
import type { TeamMaterials } from '../materials/team-materials';
import { hashShareToken, newShareToken, omitSourceNotes } from '../spools/share-tokens';

const createSchema = z.object({
  /** Revision to share; default the current one. */
  revision: z.number().int().min(0).optional(),
  expiresInDays: z.number().int().min(1).max(365).optional().default(30),
});

type ShareRow = typeof shareLinks.$inferSelect;

/** A link as listed: its state, never its token (only its hash is stored). */
function toShare(r: ShareRow, by: { id: string | null; name: string | null }) {
  const now = Date.now();
  const state = r.revokedAt ? 'revoked' : r.expiresAt.getTime() > now ? 'active' : 'expired';
  return {
    id: r.id,
    spoolId: r.spoolId,
    revision: r.revision,
    status: r.status,
    name: r.name,
    createdAt: r.createdAt.toISOString(),
    expiresAt: r.expiresAt.toISOString(),
    revokedAt: r.revokedAt ? r.revokedAt.toISOString() : null,
    state,
    active: state === 'active',
    createdBy: by.id ? { id: by.id, name: by.name ?? '' } : null,
  };
}

/** Share links of a spool: /api/spools/:id/shares (lead, admin). */
export function spoolSharesRouter(deps: { db: Db; publicUrl: string }) {
  const { db } = deps;
  const r = Router({ mergeParams: true });

  r.get('/', requirePermission('share:manage'), async (req, res) => {
    const params = req.params as { id: string };
    const teamId = getTeamId(res);
    if (!(await getSpool(db, teamId, params.id))) throw notFound('Spool not found');
    const rows = await db
      .select({ s: shareLinks, byId: user.id, byName: user.name })
      .from(shareLinks)
      .leftJoin(user, eq(user.id, shareLinks.createdBy))
      .where(and(eq(shareLinks.spoolId, params.id), eq(shareLinks.teamId, teamId)))
      .orderBy(desc(shareLinks.createdAt));
    res.json({ items: rows.map((x) => toShare(x.s, { id: x.byId, name: x.byName })) });
  });

  r.post('/', requirePermission('share:manage'), async (req, res) => {
    const params = req.params as { id: string };
    const body = parseBody(createSchema, req.body ?? {});
    const teamId = getTeamId(res);
    const spool = await getSpool(db, teamId, params.id);
    if (!spool) throw notFound('Spool not found');
    const rev = await getRevision(db, teamId, params.id, body.revision ?? spool.revision);
    if (!rev) throw notFound('Revision not found');
    const ctx = getContext(res);
    const { token, hash } = newShareToken();
    const [row] = await db
      .insert(shareLinks)
      .values({
        id: randomUUID(),
        tokenHash: hash,
        teamId,
        spoolId: params.id,
        revision: rev.revision,
        status: rev.status,
        name: rev.name,
        line: rev.line,
        // The link shows the revision as it is now, even if its draft is edited later.
        document: rev.document,
        createdBy: ctx.user.id,
        expiresAt: new Date(Date.now() + body.expiresInDays * 86_400_000),
      })
      .returning();
    // The only time the token is shown: it is not stored, only its hash.
    res.status(201).json({ ...toShare(row!, { id: ctx.user.id, name: ctx.user.name }), token, url: `${deps.publicUrl}/share/${token}` });
  });

  r.delete('/:shareId', requirePermission('share:manage'), async (req, res) => {
    const params = req.params as { id: string; shareId: string };
    const out = await db
      .update(shareLinks)
      .set({ revokedAt: new Date() })
      .where(and(eq(shareLinks.id, params.shareId), eq(shareLinks.spoolId, params.id), eq(shareLinks.teamId, getTeamId(res))))
      .returning({ id: shareLinks.id });
    if (out.length === 0) throw notFound('Share link not found');
    res.status(204).end();
  });

  return r;
}

/** The share link of a public token: 404 when unknown, 410 when revoked or expired. */
export async function findActiveShare(db: Db, token: string): Promise<ShareRow> {
  if (token.length > 100) throw notFound('Share link not found');
  // Only the token's hash is stored; a deleted spool's links are revoked with it.
  const [found] = await db
    .select({ row: shareLinks, spoolDeletedAt: spools.deletedAt })
    .from(shareLinks)
    .innerJoin(spools, eq(spools.id, shareLinks.spoolId))
    .where(eq(shareLinks.tokenHash, hashShareToken(token)))
    .limit(1);
  if (!found) throw notFound('Share link not found');
  const row = found.row;
  if (row.revokedAt || found.spoolDeletedAt) throw new HttpError(410, 'gone', 'This share link was revoked');
  if (row.expiresAt.getTime() <= Date.now()) throw new HttpError(410, 'gone', 'This share link has expired');
  return row;
}

/** Source notes of the team's own materials, which a shared view leaves out. */
export async function teamSourceNotes(materials: TeamMaterials, teamId: string): Promise<string[]> {
  return (await materials.list(teamId)).flatMap((m) => (m.origin === 'team' ? [m.sourceNote] : []));
}

/** GET /api/share/:token — the public read-only view; no account needed. */
export function publicShareRouter(deps: { db: Db; materials: TeamMaterials }) {
  const r = Router();
  r.get('/:token', async (req, res) => {
    const row = await findActiveShare(deps.db, String(req.params.token));
    // The name of who made the link (no e-mail, no other team data).
    const [by] = row.createdBy ? await deps.db.select({ name: user.name }).from(user).where(eq(user.id, row.createdBy)).limit(1) : [];
    const check = runCheck(row.document, await deps.materials.finder(row.teamId));
    const notes = await teamSourceNotes(deps.materials, row.teamId);
    res.json({
      spool: { name: row.name, line: row.line, revision: row.revision, status: row.status, document: row.document },
      check: omitSourceNotes(check, notes),
      sharedAt: row.createdAt.toISOString(),
      expiresAt: row.expiresAt.toISOString(),
      sharedBy: by?.name ?? null,
    });
  });
  return r;
}
