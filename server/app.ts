import fs from 'node:fs';
import path from 'node:path';
import express, { type RequestHandler } from 'express';
import type { Db } from './db/client';
import { sessionCacheOf, type Auth } from './auth/auth';
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
import { authHandler } from './auth/handler';
import { guardBody, guardPath, guardQuery } from './validation';
import { CheckPool } from './checks/pool';
import { RecheckJobs } from './jobs/recheck-jobs';
import { jobsRouter } from './routes/jobs';
import { shareRateLimit } from './rate-limit';
import { waitingRouter } from './routes/waiting';
import { invitationsRouter } from './routes/invitations';
import { cspMiddleware } from './csp';
import { guardAuthHandler, DEFAULT_SIGN_IN_LIMITS } from './auth/sign-in-limits';

export interface AppDeps {
  db: Db;
  auth: Auth;
  mailer: Mailer;
  config: ServerConfig;
  logger?: Logger;
  /** Built client to serve with SPA fallback (dist/); omitted in tests and the API-only dev server. */
  staticDir?: string | undefined;
  /** Worker pool for spool checks; one is made when omitted (close it with `closeAppServices`). */
  checks?: CheckPool;
}

/** What createApp starts besides routes: the check pool and the background re-check jobs. */
export interface AppServices {
  checks: CheckPool;
  jobs: RecheckJobs;
}

/** The services of an app made by createApp. */
export const getAppServices = (app: express.Express): AppServices =>
  app.locals.services as AppServices;

/** Stop background jobs and the check pool's threads. */
export async function closeAppServices(app: express.Express): Promise<void> {
  const s = getAppServices(app);
  await s.jobs.stop();
  await s.checks.close();
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
  app.use(cspMiddleware);

  // The validation layer's URL gates run before any route, better-auth's included.
  app.use('/api', guardPath, guardQuery);

  // better-auth reads the raw body itself, so it is mounted before the JSON parser. Its rate
  // limiter keys on x-forwarded-for: set it from the socket so clients cannot pick their key.
  // In front of better-auth: sign-in limits per account and per address, constant-time reset answers.
  const handleAuth = authHandler(
    guardAuthHandler((request) => deps.auth.handler(request), {
      limits: deps.config.rateLimit ? (deps.config.signInLimits ?? DEFAULT_SIGN_IN_LIMITS) : null,
    }),
  );
  app.all('/api/auth{/*any}', (req, res, next) => {
    req.headers['x-forwarded-for'] = req.socket.remoteAddress ?? '127.0.0.1';
    handleAuth(req, res, next);
  });

  app.use('/api', (_req, res, next) => {
    res.setHeader('Cache-Control', 'no-store');
    next();
  });
  if (deps.config.originCheck) app.use('/api', refuseForeignOrigins(deps.config.trustedOrigins));
  // POST /api/check hands its raw body to the check pool (parsing 2 MB of JSON is itself work).
  const json = express.json({ limit: JSON_LIMIT });
  app.use(
    '/api',
    (req, res, next) =>
      req.path === '/check' && req.method === 'POST' ? next() : json(req, res, next),
    guardBody,
  );

  app.get('/api/health', (_req, res) => {
    res.json({ ok: true });
  });

  const materials = new TeamMaterials(deps.db);
  const checks = deps.checks ?? new CheckPool();
  const jobs = new RecheckJobs({ db: deps.db, materials, checks, logger });
  app.locals.services = { checks, jobs } satisfies AppServices;
  app.use(
    '/api/share',
    shareRateLimit(deps.config.rateLimit),
    publicShareRouter({ db: deps.db, materials, checks }),
  );
  app.use('/api/share', publicCalcSheetRouter({ db: deps.db, materials }));
  const memberships = new MembershipCache(deps.db);
  app.use(
    '/api/invitations',
    invitationsRouter({ db: deps.db, memberships, rateLimit: deps.config.rateLimit }),
  );
  app.use('/api', loadSession(deps.auth, memberships));
  app.use('/api/me', meRouter());
  app.use('/api/waiting', waitingRouter({ db: deps.db }));
  app.use('/api/spools/:id/comments', commentsRouter({ db: deps.db }));
  app.use(
    '/api/spools/:id/shares',
    spoolSharesRouter({ db: deps.db, publicUrl: deps.config.publicUrl, materials, checks }),
  );
  app.use('/api/spools', calcSheetRouter({ db: deps.db, materials }));
  app.use(
    '/api/spools',
    spoolsRouter({
      db: deps.db,
      mailer: deps.mailer,
      logger,
      publicUrl: deps.config.publicUrl,
      materials,
      checks,
    }),
  );
  app.use('/api/check', checkRouter({ materials, checks }));
  app.use('/api', catalogRouter({ db: deps.db, materials, jobs }));
  app.use(
    '/api/team',
    teamRouter({
      db: deps.db,
      memberships,
      sessions: sessionCacheOf(deps.auth),
      mailer: deps.mailer,
      logger,
      publicUrl: deps.config.publicUrl,
    }),
  );
  app.use('/api/admin/jobs', jobsRouter({ jobs }));
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
  else if (filePath.includes(`${path.sep}assets${path.sep}`))
    res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
}
