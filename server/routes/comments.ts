import { Router } from 'express';
import { and, asc, eq } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { z } from 'zod';
import type { Db } from '../db/client';
import { spoolComments, user } from '../db/schema';
import { getContext, getTeamId, requirePermission } from '../auth/member';
import { notFound, validationError } from '../errors';
import { intParam, parseBody, textParam } from '../validation';
import { TEXT_LIMITS, int, text } from '../../shared/model/fields';
import { getRevision, getSpool } from '../spools/repo';

const createSchema = z.object({
  body: text(TEXT_LIMITS.long, { trim: true, min: 1 }),
  /** Pin to an element of the revision; omit for the whole spool. */
  elementId: text(TEXT_LIMITS.id, { trim: true, min: 1 }).optional(),
  /** Revision commented on; default the current one. */
  revision: int(0).optional(),
});

const author = alias(user, 'author');
const resolver = alias(user, 'resolver');

/** /api/spools/:id/comments — review comments, pinned to elements where given. */
export function commentsRouter(deps: { db: Db }) {
  const { db } = deps;
  const r = Router({ mergeParams: true });

  async function readComments(spoolId: string, commentId?: number) {
    const rows = await db
      .select({
        c: spoolComments,
        authorId: author.id,
        authorName: author.name,
        resolverId: resolver.id,
        resolverName: resolver.name,
      })
      .from(spoolComments)
      .leftJoin(author, eq(author.id, spoolComments.userId))
      .leftJoin(resolver, eq(resolver.id, spoolComments.resolvedBy))
      .where(
        commentId === undefined
          ? eq(spoolComments.spoolId, spoolId)
          : and(eq(spoolComments.spoolId, spoolId), eq(spoolComments.id, commentId)),
      )
      .orderBy(asc(spoolComments.id));
    return rows.map((x) => ({
      id: x.c.id,
      revision: x.c.revision,
      elementId: x.c.elementId,
      body: x.c.body,
      user: x.authorId ? { id: x.authorId, name: x.authorName ?? '' } : null,
      createdAt: x.c.createdAt.toISOString(),
      resolvedAt: x.c.resolvedAt ? x.c.resolvedAt.toISOString() : null,
      resolvedBy: x.resolverId ? { id: x.resolverId, name: x.resolverName ?? '' } : null,
    }));
  }

  const spoolId = (params: unknown) =>
    textParam((params as { id?: unknown }).id, 'Spool not found', 100);

  r.get('/', requirePermission('spool:view'), async (req, res) => {
    const id = spoolId(req.params);
    if (!(await getSpool(db, getTeamId(res), id))) throw notFound('Spool not found');
    res.json({ items: await readComments(id) });
  });

  r.post('/', requirePermission('spool:comment'), async (req, res) => {
    const id = spoolId(req.params);
    const body = parseBody(createSchema, req.body ?? {});
    const teamId = getTeamId(res);
    const spool = await getSpool(db, teamId, id);
    if (!spool) throw notFound('Spool not found');
    const rev = await getRevision(db, teamId, id, body.revision ?? spool.revision);
    if (!rev)
      throw validationError([
        { path: 'revision', message: `spool has no revision ${body.revision ?? ''}` },
      ]);
    if (
      body.elementId !== undefined &&
      !rev.document.elements.some((e) => e.id === body.elementId)
    ) {
      throw validationError([
        {
          path: 'elementId',
          message: `no element "${body.elementId}" in revision ${rev.revision}`,
        },
      ]);
    }
    const [row] = await db
      .insert(spoolComments)
      .values({
        spoolId: id,
        revision: rev.revision,
        elementId: body.elementId ?? null,
        body: body.body,
        userId: getContext(res).user.id,
      })
      .returning({ id: spoolComments.id });
    const [out] = await readComments(id, row!.id);
    res.status(201).json(out);
  });

  r.patch('/:commentId', requirePermission('spool:comment'), async (req, res) => {
    const id = spoolId(req.params);
    const cid = intParam((req.params as { commentId?: unknown }).commentId, 'Comment not found');
    const body = parseBody(z.object({ resolved: z.boolean() }), req.body ?? {});
    if (!(await getSpool(db, getTeamId(res), id))) throw notFound('Spool not found');
    const done = await db
      .update(spoolComments)
      .set(
        body.resolved
          ? { resolvedAt: new Date(), resolvedBy: getContext(res).user.id }
          : { resolvedAt: null, resolvedBy: null },
      )
      .where(and(eq(spoolComments.id, cid), eq(spoolComments.spoolId, id)))
      .returning({ id: spoolComments.id });
    if (done.length === 0) throw notFound('Comment not found');
    const [out] = await readComments(id, cid);
    res.json(out);
  });

  return r;
}
