import type { NextFunction, Request, RequestHandler, Response } from 'express';
import { fromNodeHeaders } from 'better-auth/node';
import { eq } from 'drizzle-orm';
import type { Db } from '../db/client';
import { teamMembers, teams } from '../db/schema';
import { HttpError, forbidden } from '../errors';
import { can, isRole, type Action, type Role } from '../../shared/model/permissions';
import { sessionCacheOf, type Auth } from './auth';
import type { CachedSession } from './session-cache';

export interface SignedInUser {
  id: string;
  email: string;
  name: string;
}

/** The signed-in user and their team membership (null when they belong to no team). */
export interface RequestContext {
  user: SignedInUser;
  team: { id: string; name: string } | null;
  role: Role | null;
}

/** The context set by `loadSession`; routes behind `requireSignedIn` can rely on it. */
export function getContext(res: Response): RequestContext {
  const ctx = res.locals.ctx as RequestContext | undefined;
  if (!ctx) throw new HttpError(401, 'unauthenticated', 'Sign in first');
  return ctx;
}

/** The member's team id; routes behind `requirePermission` always have one. */
export function getTeamId(res: Response): string {
  const ctx = getContext(res);
  if (!ctx.team) throw forbidden('You are not a member of a team');
  return ctx.team.id;
}

async function findMembership(db: Db, userId: string) {
  const [row] = await db
    .select({ teamId: teams.id, teamName: teams.name, role: teamMembers.role })
    .from(teamMembers)
    .innerJoin(teams, eq(teams.id, teamMembers.teamId))
    .where(eq(teamMembers.userId, userId))
    .limit(1);
  return row;
}

type Membership = Awaited<ReturnType<typeof findMembership>>;

/**
 * Memberships read in the last few seconds. Role changes made through this process clear the
 * entry at once; the TTL bounds how long another process (several servers on one PostgreSQL)
 * can act on a stale role.
 */
export class MembershipCache {
  private readonly entries = new Map<string, { value: Membership; expires: number }>();
  constructor(
    private readonly db: Db,
    private readonly ttlMs = 5_000,
  ) {}

  async get(userId: string): Promise<Membership> {
    const now = Date.now();
    const hit = this.entries.get(userId);
    if (hit && hit.expires > now) return hit.value;
    const value = await findMembership(this.db, userId);
    if (this.entries.size > 10_000) this.entries.clear();
    this.entries.set(userId, { value, expires: now + this.ttlMs });
    return value;
  }

  invalidate(userId?: string) {
    if (userId === undefined) this.entries.clear();
    else this.entries.delete(userId);
  }
}

/** Reads the session (the in-process session cache first) and the membership into res.locals.ctx; never rejects. */
export function loadSession(auth: Auth, memberships: MembershipCache): RequestHandler {
  const cache = sessionCacheOf(auth);
  const lookup = async (cookie: string): Promise<CachedSession | null> => {
    const hit = cache.get(cookie);
    if (hit) return hit;
    const generation = cache.begin();
    const found = await auth.api.getSession({ headers: fromNodeHeaders({ cookie }) });
    if (!found) return null;
    const value: CachedSession = {
      user: { id: found.user.id, email: found.user.email, name: found.user.name },
      session: {
        token: found.session.token,
        userId: found.session.userId,
        expiresAt: new Date(found.session.expiresAt),
      },
    };
    cache.set(cookie, value, generation);
    return value;
  };
  return async (req: Request, res: Response, next: NextFunction) => {
    const cookie = req.headers.cookie;
    const session = cookie ? await lookup(cookie) : null;
    if (session) {
      const m = await memberships.get(session.user.id);
      const ctx: RequestContext = {
        user: { id: session.user.id, email: session.user.email, name: session.user.name },
        team: m ? { id: m.teamId, name: m.teamName } : null,
        role: m && isRole(m.role) ? m.role : null,
      };
      res.locals.ctx = ctx;
    }
    next();
  };
}

/** 401 unless signed in. */
export const requireSignedIn: RequestHandler = (_req, res, next) => {
  if (!res.locals.ctx) {
    next(new HttpError(401, 'unauthenticated', 'Sign in first'));
    return;
  }
  next();
};

/** 401 signed out; 403 when the member's role lacks `action` (shared/model/permissions.ts). */
export function requirePermission(action: Action): RequestHandler {
  return (_req, res, next) => {
    const ctx = res.locals.ctx as RequestContext | undefined;
    if (!ctx) {
      next(new HttpError(401, 'unauthenticated', 'Sign in first'));
      return;
    }
    if (!ctx.team || !can(ctx.role, action)) {
      next(
        forbidden(
          ctx.team
            ? `Your role (${ctx.role ?? 'none'}) does not allow ${action}`
            : 'You are not a member of a team',
        ),
      );
      return;
    }
    next();
  };
}
