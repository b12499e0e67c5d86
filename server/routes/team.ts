import { Router } from 'express';
import { and, asc, count, eq } from 'drizzle-orm';
import { z } from 'zod';
import type { Db } from '../db/client';
import { teamMembers, user } from '../db/schema';
import { getTeamId, requirePermission, type MembershipCache } from '../auth/member';
import { HttpError, notFound } from '../errors';
import { parseBody, textParam } from '../validation';
import { isStorableText, text } from '../../shared/model/fields';
import { createUserWithPassword } from '../db/seed';
import { MIN_PASSWORD_LENGTH } from '../auth/auth';
import { ROLES } from '../../shared/model/permissions';

const roleSchema = z.enum(ROLES);
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

/** /api/team/members: everyone in the team may list; admins add, re-role and remove. */
export function teamRouter(deps: { db: Db; memberships: MembershipCache }) {
  const { db } = deps;
  const r = Router();

  const listMembers = (teamId: string) =>
    db
      .select({ userId: user.id, email: user.email, name: user.name, role: teamMembers.role, createdAt: teamMembers.createdAt })
      .from(teamMembers)
      .innerJoin(user, eq(user.id, teamMembers.userId))
      .where(eq(teamMembers.teamId, teamId))
      .orderBy(asc(user.name));

  const adminCount = async (teamId: string) => {
    const [x] = await db.select({ n: count() }).from(teamMembers).where(and(eq(teamMembers.teamId, teamId), eq(teamMembers.role, 'admin')));
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
    const [existing] = await db.select({ id: user.id }).from(user).where(eq(user.email, email)).limit(1);
    if (existing) throw new HttpError(409, 'conflict', 'A user with this e-mail already exists');
    const id = await createUserWithPassword(db, { email, name: body.name, password: body.password });
    await db.insert(teamMembers).values({ teamId, userId: id, role: body.role });
    deps.memberships.invalidate(id);
    res.status(201).json({ userId: id, email, name: body.name, role: body.role });
  });

  r.patch('/members/:userId', requirePermission('team:manage'), async (req, res) => {
    const body = parseBody(z.object({ role: roleSchema }), req.body ?? {});
    const teamId = getTeamId(res);
    const userId = textParam(req.params.userId, 'Member not found');
    const [m] = await db.select().from(teamMembers).where(and(eq(teamMembers.teamId, teamId), eq(teamMembers.userId, userId))).limit(1);
    if (!m) throw notFound('Member not found');
    if (m.role === 'admin' && body.role !== 'admin' && (await adminCount(teamId)) <= 1) {
      throw new HttpError(409, 'conflict', 'A team keeps at least one admin');
    }
    await db.update(teamMembers).set({ role: body.role }).where(and(eq(teamMembers.teamId, teamId), eq(teamMembers.userId, userId)));
    deps.memberships.invalidate(userId);
    const [row] = (await listMembers(teamId)).filter((x) => x.userId === userId);
    res.json({ ...row!, createdAt: row!.createdAt.toISOString() });
  });

  r.delete('/members/:userId', requirePermission('team:manage'), async (req, res) => {
    const teamId = getTeamId(res);
    const userId = textParam(req.params.userId, 'Member not found');
    const [m] = await db.select().from(teamMembers).where(and(eq(teamMembers.teamId, teamId), eq(teamMembers.userId, userId))).limit(1);
    if (!m) throw notFound('Member not found');
    if (m.role === 'admin' && (await adminCount(teamId)) <= 1) throw new HttpError(409, 'conflict', 'A team keeps at least one admin');
    await db.delete(teamMembers).where(and(eq(teamMembers.teamId, teamId), eq(teamMembers.userId, userId)));
    deps.memberships.invalidate(userId);
    res.status(204).end();
  });

  return r;
}
