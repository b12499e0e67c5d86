import type { RequestHandler } from 'express';
import { rateLimit } from 'express-rate-limit';
import { HttpError } from './errors';

/** Requests per minute one address may make to the public share view. */
export const SHARE_REQUESTS_PER_MINUTE = 60;

/**
 * The public share route needs no account, so it is limited per client address (the socket's:
 * `trust proxy` is off). Off with RATE_LIMIT=off, as the end-to-end runner sets.
 */
export function shareRateLimit(enabled: boolean): RequestHandler {
  if (!enabled) return (_req, _res, next) => next();
  return rateLimit({
    windowMs: 60_000,
    limit: SHARE_REQUESTS_PER_MINUTE,
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    handler: (_req, _res, next) => {
      next(
        new HttpError(
          429,
          'rate_limited',
          `Too many requests for shared spools from this address; at most ${SHARE_REQUESTS_PER_MINUTE} a minute`,
        ),
      );
    },
  });
}
