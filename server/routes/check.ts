import express, { Router } from 'express';
import { getContext, requireSignedIn } from '../auth/member';
import type { TeamMaterials } from '../materials/team-materials';
import type { CheckPool } from '../checks/pool';
import { runCheckTask } from '../checks/check-task';
import { HttpError, validationError } from '../errors';

/** Bodies up to this size are parsed and checked on the event loop (a few milliseconds). */
const INLINE_BYTES = 8 * 1024;

/** POST /api/check: the headless checker over HTTP (the body is a spool document). */
export function checkRouter(deps: { materials: TeamMaterials; checks: CheckPool }) {
  const r = Router();
  // The raw body goes to the check pool, which parses, validates, checks and serialises it.
  r.post(
    '/',
    requireSignedIn,
    express.raw({ type: () => true, limit: '2mb' }),
    async (req, res) => {
      const raw = Buffer.isBuffer(req.body) ? req.body : Buffer.alloc(0);
      const text = raw.toString('utf8');
      if (text.trim() === '')
        throw validationError([{ path: '(document)', message: 'is required' }]);
      const materials = await deps.materials.ref(getContext(res).team?.id);
      let bytes: Uint8Array;
      if (raw.length <= INLINE_BYTES) {
        const out = await runCheckTask({ kind: 'check-json', text, materials });
        if (out.kind === 'invalid')
          throw new HttpError(
            out.status,
            out.status === 400 ? 'bad_request' : 'validation',
            out.message,
            out.issues,
          );
        if (out.kind !== 'json') throw new Error('unexpected check answer');
        bytes = out.bytes;
      } else bytes = await deps.checks.checkJson(text, materials);
      res
        .type('application/json')
        .send(Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength));
    },
  );
  return r;
}
