import fs from 'node:fs';
import path from 'node:path';
import express, { type RequestHandler } from 'express';
import { toNodeHandler } from 'better-auth/node';
import type { Db } from './db/client';
import type { Auth } from './auth/auth';
import { MembershipCache, loadSession } from './auth/member';
import type { ServerConfig } from './config';
import type { Mailer } from './mail/mailer';
import { silentLogger, type Logger } from './logger';
import { HttpError, apiNotFound, errorHandler } from './errors';
import { spoolsRouter } from './routes/spools';
import { meRouter } from './routes/me';
import { checkRouter } from './routes/check';
import { catalogRouter } from './routes/catalog';
import { adminRouter } from './routes/admin';
import { publicShareRouter, spoolSharesRouter } from './routes/shares';
import { teamRouter } from './routes/team';
import { TeamMaterials } from './materials/team-materials';
import { commentsRouter } from './routes/comments';
import { calcSheetRouter, publicCalcSheetRouter } from './routes/calc-sheet';
import { waitingRouter } from './routes/waiting';
import { invitationsRouter } from './routes/invitations';

export interface AppDeps {
  db: Db;
  auth: Auth;
  mailer: Mailer;
  config: ServerConfig;
  logger?: Logger;
  /** Built client to serve with SPA fallback (dist/); omitted in tests and the API-only dev server. */
  staticDir?: string | undefined;
}

/** Largest JSON body accepted (a 20,000-element spool document fits comfortably). */
export const JSON_LIMIT = '2mb';

const securityHeaders: RequestHandler = (_req, res, next) => {
  res.setHeader('X-Content-Type-Options', 'nosniff');
  res.setHeader('Referrer-Policy', 'same-origin');
  res.setHeader('X-Frame-Options', 'DENY');
  next();
};

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/** Cookie-authenticated writes from a page on another origin are refused (CSRF belt to SameSite's braces). */
function refuseForeignOrigins(trusted: readonly string[]): RequestHandler {
  const allowed = new Set(trusted);
  return (req, _res, next) => {
    const origin = req.headers.origin;
    if (SAFE_METHODS.has(req.method) || origin === undefined || allowed.has(origin)) {
      next();
      return;
    }
    next(new HttpError(403, 'forbidden', `Requests from ${origin} are not accepted`));
  };
}

/** The Express app without listening, so tests mount it directly. */
export function createApp(deps: AppDeps) {
  const logger = deps.logger ?? silentLogger;
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', false);
  app.use(securityHeaders);

  // better-auth reads the raw body itself, so it is mounted before the JSON parser. Its rate
  // limiter keys on x-forwarded-for: set it from the socket so clients cannot pick their key.
  const authHandler = toNodeHandler(deps.auth);
  app.all('/api/auth{/*any}', (req, res, next) => {
    req.headers['x-forwarded-for'] = req.socket.remoteAddress ?? '127.0.0.1';
    authHandler(req, res).catch(next);
  });

  app.use('/api', (_req, res, next) => {
    res.setHeader('Cache-Control', 'no-store');
    next();
  });
  if (deps.config.originCheck) app.use('/api', refuseForeignOrigins(deps.config.trustedOrigins));
  app.use('/api', express.json({ limit: JSON_LIMIT }));

  app.get('/api/health', (_req, res) => {
    res.json({ ok: true });
  });

  const materials = new TeamMaterials(deps.db);
  app.use('/api/share', publicShareRouter({ db: deps.db, materials }));
  app.use('/api/share', publicCalcSheetRouter({ db: deps.db, materials }));
  const memberships = new MembershipCache(deps.db);
  app.use('/api/invitations', invitationsRouter({ db: deps.db, memberships, rateLimit: deps.config.rateLimit }));
  app.use('/api', loadSession(deps.auth, memberships));
  app.use('/api/me', meRouter());
  app.use('/api/waiting', waitingRouter({ db: deps.db }));
  app.use('/api/spools/:id/comments', commentsRouter({ db: deps.db }));
  app.use('/api/spools/:id/shares', spoolSharesRouter({ db: deps.db, publicUrl: deps.config.publicUrl }));
  app.use('/api/spools', calcSheetRouter({ db: deps.db, materials }));
  app.use('/api/spools', spoolsRouter({ db: deps.db, mailer: deps.mailer, logger, publicUrl: deps.config.publicUrl, materials }));
  app.use('/api/check', checkRouter({ materials }));
  app.use('/api', catalogRouter({ db: deps.db, materials }));
  app.use('/api/team', teamRouter({ db: deps.db, memberships, mailer: deps.mailer, logger, publicUrl: deps.config.publicUrl }));
  app.use('/api/admin', adminRouter({ db: deps.db, mailer: deps.mailer }));
  app.use('/api', apiNotFound);

  if (deps.staticDir) {
    const dir = path.resolve(deps.staticDir);
    const indexHtml = path.join(dir, 'index.html');
    app.use(express.static(dir, { index: false, maxAge: '1h', setHeaders: noCacheHtml }));
    // SPA fallback: any other GET that wants HTML gets the app shell.
    app.get('/{*any}', (req, res, next) => {
      if (!fs.existsSync(indexHtml)) {
        next();
        return;
      }
      res.setHeader('Cache-Control', 'no-cache');
      res.sendFile(indexHtml);
    });
  }

  app.use(errorHandler(logger));
  return app;
}

function noCacheHtml(res: express.Response, filePath: string) {
  if (filePath.endsWith('.html')) res.setHeader('Cache-Control', 'no-cache');
  else if (filePath.includes(`${path.sep}assets${path.sep}`)) res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
}
