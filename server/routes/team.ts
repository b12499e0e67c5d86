import { randomUUID } from 'node:crypto';
import { Router } from 'express';
import { and, asc, count, eq } from 'drizzle-orm';
import { z } from 'zod';
import type { Db } from '../db/client';
import { account, session, teamMembers, user } from '../db/schema';
import { hashPassword } from 'better-auth/crypto';
import { getContext, getTeamId, requirePermission, type MembershipCache } from '../auth/member';
import type { SessionCache } from '../auth/session-cache';
import { HttpError, notFound } from '../errors';
import { parseBody, textParam } from '../validation';
import { isStorableText, text } from '../../shared/model/fields';
import { createUserWithPassword } from '../db/seed';
import { MIN_PASSWORD_LENGTH } from '../auth/auth';
import { createInvitation, listInvitations, revokeInvitation } from '../auth/invitations';
import type { Mailer } from '../mail/mailer';
import type { Logger } from '../logger';
import { changeRoleSchema, inviteMemberSchema, roleSchema } from '../../shared/model/team';

/** Why the last admin stays (shown to the admin as is). */
const LAST_ADMIN =
  'A team keeps at least one admin: this is the only admin, so they cannot be removed or given another role. Make another member admin first.';
const addSchema = z.object({
  email: z.email({ error: 'must be an e-mail address' }).max(200),
  name: text(120, { trim: true, min: 1 }),
  role: roleSchema,
  password: z
    .string()
    .min(MIN_PASSWORD_LENGTH, `must be at least ${MIN_PASSWORD_LENGTH} characters`)
    .max(128, 'must be at most 128 characters')
    .refine(isStorableText, 'must not contain U+0000 or a lone surrogate'),
});

/**
 * /api/team/members: everyone in the team may list; admins invite, add, re-role and remove.
 * /api/team/invitations: admins list, send and withdraw invitations.
 */
export function teamRouter(deps: {
  db: Db;
  memberships: MembershipCache;
  sessions: SessionCache;
  mailer: Mailer;
  logger: Logger;
  publicUrl: string;
}) {
  const { db } = deps;
  const r = Router();

  const listMembers = (teamId: string) =>
    db
      .select({
        userId: user.id,
        email: user.email,
        name: user.name,
        role: teamMembers.role,
        createdAt: teamMembers.createdAt,
      })
      .from(teamMembers)
      .innerJoin(user, eq(user.id, teamMembers.userId))
      .where(eq(teamMembers.teamId, teamId))
      .orderBy(asc(user.name));

  const adminCount = async (teamId: string) => {
    const [x] = await db
      .select({ n: count() })
      .from(teamMembers)
      .where(and(eq(teamMembers.teamId, teamId), eq(teamMembers.role, 'admin')));
    return x?.n ?? 0;
  };

  r.get('/members', requirePermission('spool:view'), async (_req, res) => {
    const rows = await listMembers(getTeamId(res));
    res.json({ items: rows.map((m) => ({ ...m, createdAt: m.createdAt.toISOString() })) });
  });

  r.post('/members', requirePermission('team:manage'), async (req, res) => {
    const body = parseBody(addSchema, req.body ?? {});
    const teamId = getTeamId(res);
    const email = body.email.toLowerCase();
    const [existing] = await db
      .select({ id: user.id, teamId: teamMembers.teamId })
      .from(user)
      .leftJoin(teamMembers, eq(teamMembers.userId, user.id))
      .where(eq(user.email, email))
      .limit(1);
    if (existing?.teamId)
      throw new HttpError(409, 'conflict', 'A user with this e-mail already exists');
    let id: string;
    if (existing) {
      // A former member (removed from a team): join again with the name and password given now.
      id = existing.id;
      const passwordHash = await hashPassword(body.password);
      await db.transaction(async (tx) => {
        await tx.update(user).set({ name: body.name }).where(eq(user.id, id));
        await tx.delete(session).where(eq(session.userId, id));
        const done = await tx
          .update(account)
          .set({ password: passwordHash })
          .where(and(eq(account.userId, id), eq(account.providerId, 'credential')))
          .returning({ id: account.id });
        if (done.length === 0) {
          await tx.insert(account).values({
            id: randomUUID(),
            accountId: id,
            providerId: 'credential',
            userId: id,
            password: passwordHash,
            createdAt: new Date(),
            updatedAt: new Date(),
          });
        }
        await tx.insert(teamMembers).values({ teamId, userId: id, role: body.role });
      });
      deps.sessions.revokeUser(id);
    } else {
      id = await createUserWithPassword(db, { email, name: body.name, password: body.password });
      await db.insert(teamMembers).values({ teamId, userId: id, role: body.role });
    }
    deps.memberships.invalidate(id);
    res.status(201).json({ userId: id, email, name: body.name, role: body.role });
  });

  r.patch('/members/:userId', requirePermission('team:manage'), async (req, res) => {
    const body = parseBody(changeRoleSchema, req.body ?? {});
    const teamId = getTeamId(res);
    const userId = textParam(req.params.userId, 'Member not found');
    const [m] = await db
      .select()
      .from(teamMembers)
      .where(and(eq(teamMembers.teamId, teamId), eq(teamMembers.userId, userId)))
      .limit(1);
    if (!m) throw notFound('Member not found');
    if (m.role === 'admin' && body.role !== 'admin' && (await adminCount(teamId)) <= 1) {
      throw new HttpError(409, 'conflict', LAST_ADMIN, [
        { path: 'role', message: 'the last admin keeps the admin role' },
      ]);
    }
    await db
      .update(teamMembers)
      .set({ role: body.role })
      .where(and(eq(teamMembers.teamId, teamId), eq(teamMembers.userId, userId)));
    deps.memberships.invalidate(userId);
    const [row] = (await listMembers(teamId)).filter((x) => x.userId === userId);
    res.json({ ...row!, createdAt: row!.createdAt.toISOString() });
  });

  r.delete('/members/:userId', requirePermission('team:manage'), async (req, res) => {
    const teamId = getTeamId(res);
    const userId = textParam(req.params.userId, 'Member not found');
    const [m] = await db
      .select()
      .from(teamMembers)
      .where(and(eq(teamMembers.teamId, teamId), eq(teamMembers.userId, userId)))
      .limit(1);
    if (!m) throw notFound('Member not found');
    if (m.role === 'admin' && (await adminCount(teamId)) <= 1)
      throw new HttpError(409, 'conflict', LAST_ADMIN);
    await db
      .delete(teamMembers)
      .where(and(eq(teamMembers.teamId, teamId), eq(teamMembers.userId, userId)));
    // A removed member is signed out everywhere; the account stays, so they can be added again.
    await db.delete(session).where(eq(session.userId, userId));
    deps.sessions.revokeUser(userId);
    deps.memberships.invalidate(userId);
    res.status(204).end();
  });

  r.get('/invitations', requirePermission('team:manage'), async (_req, res) => {
    res.json({ items: await listInvitations(db, getTeamId(res)) });
  });

  r.post('/invitations', requirePermission('team:manage'), async (req, res) => {
    const input = parseBody(inviteMemberSchema, req.body ?? {});
    const ctx = getContext(res);
    const invitation = await createInvitation(deps, {
      teamId: getTeamId(res),
      invitedBy: { id: ctx.user.id, name: ctx.user.name || ctx.user.email },
      input,
    });
    res.status(201).json(invitation);
  });

  r.delete('/invitations/:invitationId', requirePermission('team:manage'), async (req, res) => {
    res.json(await revokeInvitation(db, getTeamId(res), String(req.params.invitationId)));
  });

  return r;
}
