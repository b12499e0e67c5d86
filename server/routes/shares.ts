import { randomUUID } from 'node:crypto';
import { Router } from 'express';
import { and, desc, eq, sql } from 'drizzle-orm';
import { z } from 'zod';
import type { Db } from '../db/client';
import { shareLinks, spools, user } from '../db/schema';
import { getContext, getTeamId, requirePermission } from '../auth/member';
import { HttpError, notFound } from '../errors';
import { parseBody, textParam } from '../validation';
import { int } from '../../shared/model/fields';
import { getRevision, getSpool } from '../spools/repo';
import type { TeamMaterials } from '../materials/team-materials';
import type { CheckPool } from '../checks/pool';
import { hashShareToken, newShareToken } from '../spools/share-tokens';

const createSchema = z.object({
  /** Revision to share; default the current one. */
  revision: int(0).optional(),
  expiresInDays: int(1, 365).optional().default(30),
});

/** What the list of a spool's links reads (not the stored document or check). */
const shareListColumns = {
  id: shareLinks.id,
  spoolId: shareLinks.spoolId,
  revision: shareLinks.revision,
  status: shareLinks.status,
  name: shareLinks.name,
  createdAt: shareLinks.createdAt,
  expiresAt: shareLinks.expiresAt,
  revokedAt: shareLinks.revokedAt,
};
type ShareRow = Pick<typeof shareLinks.$inferSelect, keyof typeof shareListColumns>;

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
export function spoolSharesRouter(deps: {
  db: Db;
  publicUrl: string;
  materials: TeamMaterials;
  checks: CheckPool;
}) {
  const { db } = deps;
  const r = Router({ mergeParams: true });

  r.get('/', requirePermission('share:manage'), async (req, res) => {
    const params = { id: textParam((req.params as { id?: unknown }).id, 'Spool not found', 100) };
    const teamId = getTeamId(res);
    if (!(await getSpool(db, teamId, params.id))) throw notFound('Spool not found');
    const rows = await db
      .select({ s: shareListColumns, byId: user.id, byName: user.name })
      .from(shareLinks)
      .leftJoin(user, eq(user.id, shareLinks.createdBy))
      .where(and(eq(shareLinks.spoolId, params.id), eq(shareLinks.teamId, teamId)))
      .orderBy(desc(shareLinks.createdAt));
    res.json({ items: rows.map((x) => toShare(x.s, { id: x.byId, name: x.byName })) });
  });

  r.post('/', requirePermission('share:manage'), async (req, res) => {
    const params = { id: textParam((req.params as { id?: unknown }).id, 'Spool not found', 100) };
    const body = parseBody(createSchema, req.body ?? {});
    const teamId = getTeamId(res);
    const spool = await getSpool(db, teamId, params.id);
    if (!spool) throw notFound('Spool not found');
    const rev = await getRevision(db, teamId, params.id, body.revision ?? spool.revision);
    if (!rev) throw notFound('Revision not found');
    const ctx = getContext(res);
    // The shared revision is frozen, so its check is made once, here, and served as stored
    // (without the team's material source notes).
    const checkGz = await deps.checks.checkDocumentGz(
      rev.document,
      await deps.materials.ref(teamId),
      await teamSourceNotes(deps.materials, teamId),
    );
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
        checkGz,
        createdBy: ctx.user.id,
        expiresAt: new Date(Date.now() + body.expiresInDays * 86_400_000),
      })
      .returning(shareListColumns);
    // The only time the token is shown: it is not stored, only its hash.
    res.status(201).json({
      ...toShare(row!, { id: ctx.user.id, name: ctx.user.name }),
      token,
      url: `${deps.publicUrl}/share/${token}`,
    });
  });

  r.delete('/:shareId', requirePermission('share:manage'), async (req, res) => {
    const params = {
      id: textParam((req.params as { id?: unknown }).id, 'Spool not found', 100),
      shareId: textParam(
        (req.params as { shareId?: unknown }).shareId,
        'Share link not found',
        100,
      ),
    };
    const out = await db
      .update(shareLinks)
      .set({ revokedAt: new Date() })
      .where(
        and(
          eq(shareLinks.id, params.shareId),
          eq(shareLinks.spoolId, params.id),
          eq(shareLinks.teamId, getTeamId(res)),
        ),
      )
      .returning({ id: shareLinks.id });
    if (out.length === 0) throw notFound('Share link not found');
    res.status(204).end();
  });

  return r;
}

/** The share link of a public token: 404 when unknown, 410 when revoked or expired. */
export async function findActiveShare(
  db: Db,
  token: string,
): Promise<typeof shareLinks.$inferSelect> {
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
  if (row.revokedAt || found.spoolDeletedAt)
    throw new HttpError(410, 'gone', 'This share link was revoked');
  if (row.expiresAt.getTime() <= Date.now())
    throw new HttpError(410, 'gone', 'This share link has expired');
  return row;
}

/** Source notes of the team's own materials, which a shared view leaves out. */
export async function teamSourceNotes(materials: TeamMaterials, teamId: string): Promise<string[]> {
  return (await materials.list(teamId)).flatMap((m) => (m.origin === 'team' ? [m.sourceNote] : []));
}

/** GET /api/share/:token — the public read-only view; no account needed. */
export function publicShareRouter(deps: { db: Db; materials: TeamMaterials; checks: CheckPool }) {
  const r = Router();
  r.get('/:token', async (req, res) => {
    const token = textParam(req.params.token, 'Share link not found', 100);
    // Only the token's hash is stored; a deleted spool's links are revoked with it.
    // The document comes as PostgreSQL's JSON text and the check as base64 of its gzip: neither
    // is parsed on the event loop; the pool unpacks the check and joins the answer.
    const [row] = await deps.db
      .select({
        id: shareLinks.id,
        teamId: shareLinks.teamId,
        name: shareLinks.name,
        line: shareLinks.line,
        revision: shareLinks.revision,
        status: shareLinks.status,
        createdAt: shareLinks.createdAt,
        expiresAt: shareLinks.expiresAt,
        revokedAt: shareLinks.revokedAt,
        createdBy: shareLinks.createdBy,
        documentJson: sql<string>`${shareLinks.document}::text`,
        checkB64: sql<string | null>`encode(${shareLinks.checkGz}, 'base64')`,
        spoolDeletedAt: spools.deletedAt,
      })
      .from(shareLinks)
      .innerJoin(spools, eq(spools.id, shareLinks.spoolId))
      .where(eq(shareLinks.tokenHash, hashShareToken(token)))
      .limit(1);
    if (!row) throw notFound('Share link not found');
    if (row.revokedAt || row.spoolDeletedAt)
      throw new HttpError(410, 'gone', 'This share link was revoked');
    if (row.expiresAt.getTime() <= Date.now())
      throw new HttpError(410, 'gone', 'This share link has expired');
    let check: Uint8Array | string | null = row.checkB64;
    if (check === null) {
      // A link made before checks were stored: check once in the pool and keep the result.
      const [full] = await deps.db
        .select({ document: shareLinks.document })
        .from(shareLinks)
        .where(eq(shareLinks.id, row.id))
        .limit(1);
      check = await deps.checks.checkDocumentGz(
        full!.document,
        await deps.materials.ref(row.teamId),
        await teamSourceNotes(deps.materials, row.teamId),
      );
      await deps.db.update(shareLinks).set({ checkGz: check }).where(eq(shareLinks.id, row.id));
    }
    const meta = JSON.stringify({
      name: row.name,
      line: row.line,
      revision: row.revision,
      status: row.status,
    });
    // The name of who made the link (no e-mail, no other team data).
    const [by] = row.createdBy
      ? await deps.db
          .select({ name: user.name })
          .from(user)
          .where(eq(user.id, row.createdBy))
          .limit(1)
      : [];
    const tail = JSON.stringify({
      sharedAt: row.createdAt.toISOString(),
      expiresAt: row.expiresAt.toISOString(),
      sharedBy: by?.name ?? null,
    });
    const bytes = await deps.checks.shareView(
      `{"spool":${meta.slice(0, -1)},"document":${row.documentJson}},"check":`,
      check,
      `,${tail.slice(1)}`,
    );
    res
      .type('application/json')
      .send(Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength));
  });
  return r;
}
