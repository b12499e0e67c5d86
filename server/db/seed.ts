import { randomUUID } from 'node:crypto';
import { count, sql } from 'drizzle-orm';
import { hashPassword } from 'better-auth/crypto';
import type { Db } from './client';
import { account, spoolComments, spools, teamMembers, teams, user } from './schema';
import { DEMO_SPOOLS } from './demo-spools';
import { insertSpool } from '../spools/repo';
import { summarizeDocument } from '../spools/check';
import { transitionSpool } from '../spools/repo';
import { parseSpoolDocument } from '../../shared/model/spool';
import type { Role } from '../../shared/model/permissions';

export const DEMO_PASSWORD = 'spoolwright-demo';
export const DEMO_TEAM = { id: 'team-larkspur', name: 'Larkspur Reach Process Works' } as const;

/** Invented people, one per role. */
export const DEMO_USERS: readonly { email: string; name: string; role: Role }[] = [
  { email: 'designer@spoolwright.test', name: 'Mara Ellison', role: 'designer' },
  { email: 'checker@spoolwright.test', name: 'Tobin Reyes', role: 'checker' },
  { email: 'fabricator@spoolwright.test', name: 'Ines Calder', role: 'fabricator' },
  { email: 'lead@spoolwright.test', name: 'Jonah Pikeworth', role: 'lead' },
  { email: 'admin@spoolwright.test', name: 'Priya Vantongeren', role: 'admin' },
];

/** Create a user with an email/password account (the way better-auth stores credentials). */
export async function createUserWithPassword(
  db: Db,
  v: { email: string; name: string; password: string; id?: string },
) {
  const id = v.id ?? randomUUID();
  const now = new Date();
  await db.insert(user).values({
    id,
    email: v.email.toLowerCase(),
    name: v.name,
    emailVerified: true,
    createdAt: now,
    updatedAt: now,
  });
  await db.insert(account).values({
    id: randomUUID(),
    accountId: id,
    providerId: 'credential',
    userId: id,
    password: await hashPassword(v.password),
    createdAt: now,
    updatedAt: now,
  });
  return id;
}

export async function isDatabaseEmpty(db: Db): Promise<boolean> {
  const [r] = await db.select({ n: count() }).from(user);
  return (r?.n ?? 0) === 0;
}

/** Remove all data (used by `npm run seed` before seeding again). */
export async function clearDatabase(db: Db) {
  await db.execute(
    sql`truncate table "team_materials", "spool_comments", "spool_events", "spool_revisions", "share_links", "spools", "team_members", "teams", "outbox", "session", "account", "verification", "user" restart identity cascade`,
  );
}

/**
 * The demo scenario: one team, a member per role (password `spoolwright-demo`) and a few spools
 * covering pass, marginal, fail and a bend that needs heavier pipe before bending. One spool is
 * taken through submit → checked → released so the history and revisions have content.
 */
export async function seedDemo(db: Db) {
  await db.insert(teams).values({ id: DEMO_TEAM.id, name: DEMO_TEAM.name });
  const ids = new Map<Role, string>();
  for (const u of DEMO_USERS) {
    const id = await createUserWithPassword(db, {
      email: u.email,
      name: u.name,
      password: DEMO_PASSWORD,
    });
    await db.insert(teamMembers).values({ teamId: DEMO_TEAM.id, userId: id, role: u.role });
    ids.set(u.role, id);
  }
  const designer = ids.get('designer')!;
  const spoolIds: string[] = [];
  for (const raw of DEMO_SPOOLS) {
    const parsed = parseSpoolDocument(raw);
    if (!parsed.ok)
      throw new Error(
        `demo spool ${raw.name ?? ''} is invalid: ${parsed.issues.map((i) => `${i.path} ${i.message}`).join('; ')}`,
      );
    spoolIds.push(
      await insertSpool(db, {
        teamId: DEMO_TEAM.id,
        userId: designer,
        document: parsed.doc,
        checkSummary: summarizeDocument(parsed.doc),
      }),
    );
  }
  const allow = () => true;
  const [first, second] = spoolIds;
  if (first) {
    await transitionSpool(db, {
      teamId: DEMO_TEAM.id,
      id: first,
      userId: designer,
      to: 'submitted',
      note: 'Ready for check',
      isAllowed: allow,
    });
    await transitionSpool(db, {
      teamId: DEMO_TEAM.id,
      id: first,
      userId: ids.get('checker')!,
      to: 'checked',
      note: 'Walls and bend radii verified',
      isAllowed: allow,
    });
    await transitionSpool(db, {
      teamId: DEMO_TEAM.id,
      id: first,
      userId: ids.get('lead')!,
      to: 'released',
      note: 'Approved for fabrication',
      isAllowed: allow,
    });
  }
  if (second) {
    await transitionSpool(db, {
      teamId: DEMO_TEAM.id,
      id: second,
      userId: designer,
      to: 'submitted',
      note: 'Please check the bend margins',
      isAllowed: allow,
    });
    await db.insert(spoolComments).values({
      spoolId: second,
      revision: 0,
      elementId: 'SV-B1',
      body: 'Margin on this bend is thin at 5D; can we go to 10S → 40S here or open the radius?',
      userId: ids.get('checker')!,
    });
  }
  const [n] = await db.select({ n: count() }).from(spools);
  return { team: DEMO_TEAM, users: DEMO_USERS.length, spools: n?.n ?? 0 };
}
