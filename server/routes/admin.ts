import { Router } from 'express';
import { desc, eq } from 'drizzle-orm';
import { z } from 'zod';
import type { Db } from '../db/client';
import { outbox } from '../db/schema';
import { getTeamId, requirePermission } from '../auth/member';
import { notFound } from '../errors';
import type { Mailer } from '../mail/mailer';
import { parseBody } from '../validation';

/**
 * GET /api/admin/outbox: mail the development catcher received for the viewer's own team, with
 * one-use links already redacted (absent when real SMTP is configured).
 */
export function adminRouter(deps: { db: Db; mailer: Mailer }) {
  const r = Router();
  r.get('/outbox', requirePermission('outbox:read'), async (req, res) => {
    if (deps.mailer.kind !== 'outbox')
      throw notFound('Mail goes to an SMTP server; there is no outbox');
    const q = parseBody(
      z.object({ limit: z.coerce.number().int().min(1).max(500).optional().default(50) }),
      req.query,
      ['query'],
    );
    const rows = await deps.db
      .select({
        id: outbox.id,
        to: outbox.to,
        from: outbox.from,
        subject: outbox.subject,
        text: outbox.text,
        createdAt: outbox.createdAt,
      })
      .from(outbox)
      .where(eq(outbox.teamId, getTeamId(res)))
      .orderBy(desc(outbox.id))
      .limit(q.limit);
    res.json({ items: rows.map((m) => ({ ...m, createdAt: m.createdAt.toISOString() })) });
  });
  return r;
}
