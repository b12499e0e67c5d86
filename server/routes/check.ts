import { Router } from 'express';
import { requireSignedIn } from '../auth/member';
import { parseDocument } from '../validation';
import { runCheck } from '../spools/check';

/** POST /api/check: the headless checker over HTTP (the body is a spool document). */
export function checkRouter() {
  const r = Router();
  r.post('/', requireSignedIn, (req, res) => {
    const doc = parseDocument(req.body);
    res.json(runCheck(doc));
  });
  return r;
}
