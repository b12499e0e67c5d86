import { createHash, randomBytes, randomUUID } from 'node:crypto';
import { hashPassword } from 'better-auth/crypto';
import { and, desc, eq, gt, isNull } from 'drizzle-orm';
import type { Db } from '../db/client';
import { account, session, teamInvitations, teamMembers, teams, user } from '../db/schema';
import { createUserWithPassword } from '../db/seed';
import { HttpError, notFound } from '../errors';
import { sendQuietly, type MailMessage, type Mailer } from '../mail/mailer';
import type { Logger } from '../logger';
import { INVITATION_DAYS, type InviteMemberInput } from '../../shared/model/team';
import type { Role } from '../../shared/model/permissions';

/** The stored form of a one-use token: only its SHA-256 is kept. */
export const hashToken = (token: string) =>
  createHash('sha256').update(token, 'utf8').digest('hex');

export type InvitationState = 'pending' | 'accepted' | 'expired' | 'revoked';

type InvitationRow = typeof teamInvitations.$inferSelect;

export function invitationState(
  row: Pick<InvitationRow, 'acceptedAt' | 'revokedAt' | 'expiresAt'>,
  now = new Date(),
): InvitationState {
  if (row.acceptedAt) return 'accepted';
  if (row.revokedAt) return 'revoked';
  if (row.expiresAt <= now) return 'expired';
  return 'pending';
}

/** An invitation as the admin's list shows it (never the token). */
export function invitationView(row: InvitationRow & { invitedByName?: string | null }) {
  return {
    id: row.id,
    email: row.email,
    name: row.name,
    role: row.role,
    state: invitationState(row),
    createdAt: row.createdAt.toISOString(),
    expiresAt: row.expiresAt.toISOString(),
    acceptedAt: row.acceptedAt?.toISOString() ?? null,
    revokedAt: row.revokedAt?.toISOString() ?? null,
    invitedBy: row.invitedByName ?? null,
  };
}

const ROLE_WORDS: Record<Role, string> = {
  designer: 'a designer',
  checker: 'a checker',
  fabricator: 'a fabricator',
  lead: 'a lead',
  admin: 'a team admin',
};

/**
 * Invite someone to the team: a fresh one-use token (its hash stored), valid INVITATION_DAYS,
 * mailed as `${publicUrl}/accept-invite?token=…`. A pending invitation to the same address is
 * revoked, so the newest mail is the only link that works.
 */
export async function createInvitation(
  deps: { db: Db; mailer: Mailer; logger: Logger; publicUrl: string },
  v: { teamId: string; invitedBy: { id: string; name: string }; input: InviteMemberInput },
) {
  const { db } = deps;
  const email = v.input.email.toLowerCase();
  // A person removed from a team keeps the account and may be invited again; a member may not.
  const [existing] = await db
    .select({ id: user.id, teamId: teamMembers.teamId })
    .from(user)
    .leftJoin(teamMembers, eq(teamMembers.userId, user.id))
    .where(eq(user.email, email))
    .limit(1);
  if (existing?.teamId) {
    throw new HttpError(
      409,
      'conflict',
      `${email} is already a member of ${existing.teamId === v.teamId ? 'this' : 'another'} team`,
      [{ path: 'email', message: 'is already a team member' }],
    );
  }
  const [team] = await db
    .select({ name: teams.name })
    .from(teams)
    .where(eq(teams.id, v.teamId))
    .limit(1);
  const token = randomBytes(32).toString('base64url');
  const now = new Date();
  const row = {
    id: randomUUID(),
    teamId: v.teamId,
    email,
    name: v.input.name,
    role: v.input.role,
    tokenHash: hashToken(token),
    invitedBy: v.invitedBy.id,
    createdAt: now,
    expiresAt: new Date(now.getTime() + INVITATION_DAYS * 24 * 3600_000),
  };
  await db.transaction(async (tx) => {
    await tx
      .update(teamInvitations)
      .set({ revokedAt: now })
      .where(
        and(
          eq(teamInvitations.teamId, v.teamId),
          eq(teamInvitations.email, email),
          isNull(teamInvitations.acceptedAt),
          isNull(teamInvitations.revokedAt),
        ),
      );
    await tx.insert(teamInvitations).values(row);
  });
  const url = `${deps.publicUrl}/accept-invite?token=${token}`;
  // `teamId` tags the outbox row with the recipient's team (the mail contract's optional field).
  const message: MailMessage & { teamId: string } = {
    to: email,
    subject: `You are invited to ${team?.name ?? 'a team'} on Spoolwright`,
    text:
      `Hello ${v.input.name},\n\n${v.invitedBy.name} invited you to join ${team?.name ?? 'their team'} on Spoolwright as ${ROLE_WORDS[v.input.role]}.\n` +
      `Open this link within ${INVITATION_DAYS} days to choose your password; it works once:\n\n${url}\n\n` +
      `If you did not expect this, ignore this message.\n`,
    teamId: v.teamId,
  };
  await sendQuietly(deps.mailer, deps.logger, message);
  return invitationView({
    ...row,
    acceptedAt: null,
    revokedAt: null,
    invitedByName: v.invitedBy.name,
  });
}

export async function listInvitations(db: Db, teamId: string) {
  const rows = await db
    .select({ inv: teamInvitations, invitedByName: user.name })
    .from(teamInvitations)
    .leftJoin(user, eq(user.id, teamInvitations.invitedBy))
    .where(eq(teamInvitations.teamId, teamId))
    .orderBy(desc(teamInvitations.createdAt))
    .limit(200);
  return rows.map((r) => invitationView({ ...r.inv, invitedByName: r.invitedByName }));
}

export async function revokeInvitation(db: Db, teamId: string, id: string) {
  const [row] = await db
    .select()
    .from(teamInvitations)
    .where(and(eq(teamInvitations.teamId, teamId), eq(teamInvitations.id, id)))
    .limit(1);
  if (!row) throw notFound('Invitation not found');
  const state = invitationState(row);
  if (state !== 'pending')
    throw new HttpError(409, 'conflict', `The invitation is already ${state}`);
  const [updated] = await db
    .update(teamInvitations)
    .set({ revokedAt: new Date() })
    .where(eq(teamInvitations.id, id))
    .returning();
  return invitationView(updated!);
}

const GONE: Record<Exclude<InvitationState, 'pending'>, string> = {
  accepted:
    'This invitation has already been used. Sign in with the password you chose, or use "Forgot password".',
  expired: 'This invitation has expired. Ask your team admin to invite you again.',
  revoked: 'This invitation was withdrawn (a newer one may have been sent). Ask your team admin.',
};

async function findByToken(db: Db, token: string) {
  const [row] = await db
    .select({ inv: teamInvitations, teamName: teams.name })
    .from(teamInvitations)
    .innerJoin(teams, eq(teams.id, teamInvitations.teamId))
    .where(eq(teamInvitations.tokenHash, hashToken(token)))
    .limit(1);
  if (!row)
    throw notFound('This invitation link is not valid. Check that the whole link was copied.');
  const state = invitationState(row.inv);
  if (state !== 'pending') throw new HttpError(410, 'gone', GONE[state], { state });
  return row;
}

/** What the accept page shows before the person chooses a password. */
export async function describeInvitation(db: Db, token: string) {
  const { inv, teamName } = await findByToken(db, token);
  return {
    email: inv.email,
    name: inv.name,
    role: inv.role,
    team: { name: teamName },
    expiresAt: inv.expiresAt.toISOString(),
  };
}

/**
 * Use an invitation: claim it (one use, even under concurrent requests), create the account
 * with the chosen password and add the membership, all in one transaction.
 */
export async function acceptInvitation(db: Db, token: string, password: string) {
  const { inv } = await findByToken(db, token);
  return db.transaction(async (tx) => {
    const t = tx as unknown as Db;
    const claimed = await t
      .update(teamInvitations)
      .set({ acceptedAt: new Date() })
      .where(
        and(
          eq(teamInvitations.id, inv.id),
          isNull(teamInvitations.acceptedAt),
          isNull(teamInvitations.revokedAt),
          gt(teamInvitations.expiresAt, new Date()),
        ),
      )
      .returning({ id: teamInvitations.id });
    if (claimed.length === 0)
      throw new HttpError(410, 'gone', GONE.accepted, { state: 'accepted' });
    const [existing] = await t
      .select({ id: user.id, teamId: teamMembers.teamId })
      .from(user)
      .leftJoin(teamMembers, eq(teamMembers.userId, user.id))
      .where(eq(user.email, inv.email))
      .limit(1);
    if (existing?.teamId)
      throw new HttpError(
        409,
        'conflict',
        `${inv.email} is already a team member; sign in instead`,
      );
    let userId: string;
    if (existing) {
      // A former member: the chosen password replaces the old one and their sessions end.
      userId = existing.id;
      const hash = await hashPassword(password);
      const updated = await t
        .update(account)
        .set({ password: hash, updatedAt: new Date() })
        .where(and(eq(account.userId, userId), eq(account.providerId, 'credential')))
        .returning({ id: account.id });
      if (updated.length === 0) {
        const now = new Date();
        await t.insert(account).values({
          id: randomUUID(),
          accountId: userId,
          providerId: 'credential',
          userId,
          password: hash,
          createdAt: now,
          updatedAt: now,
        });
      }
      await t.delete(session).where(eq(session.userId, userId));
    } else {
      userId = await createUserWithPassword(t, { email: inv.email, name: inv.name, password });
    }
    await t.insert(teamMembers).values({ teamId: inv.teamId, userId, role: inv.role });
    return { userId, email: inv.email, name: inv.name, role: inv.role };
  });
}
