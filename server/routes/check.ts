import { Router } from 'express';
import { getContext, requireSignedIn } from '../auth/member';
import type { TeamMaterials } from '../materials/team-materials';
import { parseDocument } from '../validation';
import { runCheck } from '../spools/check';

/** POST /api/check: the headless checker over HTTP (the body is a spool document). */
export function checkRouter(deps: { materials: TeamMaterials }) {
  const r = Router();
  r.post('/', requireSignedIn, async (req, res) => {
    const doc = parseDocument(req.body);
    res.json(runCheck(doc, await deps.materials.finder(getContext(res).team?.id)));
  });
  return r;
}
