import { Router } from 'express';
import { getContext, requireSignedIn } from '../auth/member';
import { listPermissions } from '../../shared/model/permissions';

/** GET /api/me: who is signed in, their team, role and what the role allows. */
export function meRouter() {
  const r = Router();
  r.get('/', requireSignedIn, (_req, res) => {
    const ctx = getContext(res);
    res.json({
      user: ctx.user,
      team: ctx.team,
      role: ctx.role,
      permissions: listPermissions(ctx.role),
    });
  });
  return r;
}
