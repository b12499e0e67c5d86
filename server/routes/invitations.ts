import { Router, type RequestHandler } from 'express';
import { rateLimit } from 'express-rate-limit';
import { z } from 'zod';
import type { Db } from '../db/client';
import { HttpError } from '../errors';
import { parseBody } from '../validation';
import { acceptInvitation, describeInvitation } from '../auth/invitations';
import type { MembershipCache } from '../auth/member';
import { acceptInvitationSchema } from '../../shared/model/team';

const tokenSchema = z.object({ token: acceptInvitationSchema.shape.token });

/**
 * Public invitation routes (no session): the accept page reads what the invitation is for,
 * then posts the chosen password. The token travels in the body, never in a URL the server logs.
 */
export function invitationsRouter(deps: {
  db: Db;
  memberships: MembershipCache;
  rateLimit: boolean;
}) {
  const r = Router();
  const limit: RequestHandler = deps.rateLimit
    ? rateLimit({
        windowMs: 60_000,
        limit: 20,
        standardHeaders: 'draft-8',
        legacyHeaders: false,
        handler: (_req, _res, next) =>
          next(new HttpError(429, 'bad_request', 'Too many attempts; wait a minute and try again')),
      })
    : (_req, _res, next) => next();

  r.post('/lookup', limit, async (req, res) => {
    const { token } = parseBody(tokenSchema, req.body ?? {});
    res.json(await describeInvitation(deps.db, token));
  });

  r.post('/accept', limit, async (req, res) => {
    const body = parseBody(acceptInvitationSchema, req.body ?? {});
    const out = await acceptInvitation(deps.db, body.token, body.password);
    deps.memberships.invalidate(out.userId);
    res.status(201).json({ email: out.email, name: out.name, role: out.role });
  });
  return r;
}
