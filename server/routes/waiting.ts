import { Router } from 'express';
import { and, asc, desc, inArray, isNull } from 'drizzle-orm';
import type { Db } from '../db/client';
import { spoolComments, spoolEvents } from '../db/schema';
import { getContext, getTeamId, requirePermission } from '../auth/member';
import { listSpools, type SpoolSummary } from '../spools/repo';
import type { Role, SpoolStatus } from '../../shared/model/permissions';

/** The lifecycle state each role acts on next ("waiting on me"). */
export const WAITING_STATE: Readonly<Record<Role, SpoolStatus>> = {
  designer: 'draft',
  checker: 'submitted',
  lead: 'checked',
  // An admin holds the lead's release permission, so the lead's queue is theirs too.
  admin: 'checked',
  fabricator: 'released',
};

/** Most spools one answer lists (the register has the full search). */
const LIMIT = 200;

export interface WaitingComment {
  id: number;
  revision: number;
  elementId: string | null;
  body: string;
  createdAt: string;
}

export interface WaitingItem {
  spool: SpoolSummary;
  /** Open comments of the spool's current revision. */
  openComments: number;
  /** The designer's list carries the open comments themselves (oldest first, at most 20). */
  comments?: WaitingComment[];
  /** When the spool reached this state, from its last event (null when it never moved). */
  since: string | null;
  /** The note of that event (e.g. the checker's reason for a return). */
  note: string | null;
}

/**
 * GET /api/waiting — the spools waiting on the signed-in member's role: designers the spools
 * returned to draft by a checker (with their open comments), checkers the submitted ones, leads
 * and admins the checked ones awaiting release, fabricators the released ones.
 */
export function waitingRouter(deps: { db: Db }) {
  const { db } = deps;
  const r = Router();

  r.get('/', requirePermission('spool:view'), async (_req, res) => {
    const role = getContext(res).role as Role;
    const state = WAITING_STATE[role];
    const page = await listSpools(db, getTeamId(res), {
      status: [state],
      sort: '-updatedAt',
      page: 1,
      pageSize: LIMIT,
    });
    const ids = page.items.map((s) => s.id);
    const lastEvent = new Map<
      string,
      { from: string; to: string; note: string | null; createdAt: Date }
    >();
    const open = new Map<string, WaitingComment[]>();
    if (ids.length > 0) {
      const events = await db
        .select({
          spoolId: spoolEvents.spoolId,
          from: spoolEvents.fromStatus,
          to: spoolEvents.toStatus,
          note: spoolEvents.note,
          createdAt: spoolEvents.createdAt,
        })
        .from(spoolEvents)
        .where(inArray(spoolEvents.spoolId, ids))
        .orderBy(desc(spoolEvents.id));
      for (const e of events) if (!lastEvent.has(e.spoolId)) lastEvent.set(e.spoolId, e);
      const comments = await db
        .select({
          spoolId: spoolComments.spoolId,
          id: spoolComments.id,
          revision: spoolComments.revision,
          elementId: spoolComments.elementId,
          body: spoolComments.body,
          createdAt: spoolComments.createdAt,
        })
        .from(spoolComments)
        .where(and(inArray(spoolComments.spoolId, ids), isNull(spoolComments.resolvedAt)))
        .orderBy(asc(spoolComments.id));
      const revisionOf = new Map(page.items.map((s) => [s.id, s.revision]));
      for (const c of comments) {
        if (c.revision !== revisionOf.get(c.spoolId)) continue;
        const list = open.get(c.spoolId) ?? [];
        list.push({
          id: c.id,
          revision: c.revision,
          elementId: c.elementId,
          body: c.body,
          createdAt: c.createdAt.toISOString(),
        });
        open.set(c.spoolId, list);
      }
    }
    const items: WaitingItem[] = [];
    for (const spool of page.items) {
      const ev = lastEvent.get(spool.id);
      // A designer waits only on spools a checker sent back, not on every draft.
      if (role === 'designer' && !(ev && ev.from === 'submitted' && ev.to === 'draft')) continue;
      const comments = open.get(spool.id) ?? [];
      items.push({
        spool,
        openComments: comments.length,
        ...(role === 'designer' ? { comments: comments.slice(0, 20) } : {}),
        since: ev ? ev.createdAt.toISOString() : null,
        note: ev?.note ?? null,
      });
    }
    res.json({ role, state, items, total: items.length });
  });

  return r;
}
