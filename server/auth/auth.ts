import { betterAuth } from 'better-auth';
import { drizzleAdapter } from 'better-auth/adapters/drizzle';
import type { Db } from '../db/client';
import { authSchema } from '../db/auth-schema';
import type { ServerConfig } from '../config';
import type { Logger } from '../logger';
import { sendInBackground, type Mailer } from '../mail/mailer';
import { SessionCache } from './session-cache';
import { MAX_PASSWORD_LENGTH, MIN_PASSWORD_LENGTH } from '../../shared/model/team';

export { MIN_PASSWORD_LENGTH };

const sessionCaches = new WeakMap<object, SessionCache>();

/** The in-process session cache that `createAuth` wired to this auth's session delete hooks. */
export function sessionCacheOf(auth: Auth): SessionCache {
  const cache = sessionCaches.get(auth);
  if (!cache) throw new Error('sessionCacheOf: this auth was not made by createAuth');
  return cache;
}

/**
 * better-auth with email + password and sessions in the database. There is no signed session
 * cookie cache (a signed-out or revoked cookie would keep working until it expired); the
 * in-process SessionCache (server/auth/session-cache.ts) keeps most requests cheap instead and
 * is cleared by the session delete hooks below. Sign-up is closed: team admins add members.
 */
export function createAuth(deps: { db: Db; config: ServerConfig; mailer: Mailer; logger: Logger }) {
  const { db, config, mailer, logger } = deps;
  const sessions = new SessionCache();
  const auth = betterAuth({
    appName: 'Spoolwright',
    baseURL: config.publicUrl,
    basePath: '/api/auth',
    secret: config.authSecret,
    trustedOrigins: [...config.trustedOrigins],
    database: drizzleAdapter(db, { provider: 'pg', schema: authSchema }),
    emailAndPassword: {
      enabled: true,
      disableSignUp: true,
      minPasswordLength: MIN_PASSWORD_LENGTH,
      maxPasswordLength: MAX_PASSWORD_LENGTH,
      resetPasswordTokenExpiresIn: 60 * 60,
      revokeSessionsOnPasswordReset: true,
      // The link opens the client's set-new-password page. Sent in the background, so the
      // answer to the request takes as long for a known address as for an unknown one.
      sendResetPassword: async ({ user, token }) => {
        const url = `${config.publicUrl}/reset-password?token=${encodeURIComponent(token)}`;
        sendInBackground(mailer, logger, {
          to: user.email,
          subject: 'Reset your Spoolwright password',
          text:
            `Hello ${user.name},\n\nSomeone (hopefully you) asked to reset the password of ${user.email}.\n` +
            `Open this link within an hour to choose a new one:\n\n${url}\n\nIf it was not you, ignore this message.\n`,
        });
        return Promise.resolve();
      },
    },
    session: {
      expiresIn: 60 * 60 * 24 * 7,
      updateAge: 60 * 60 * 24,
      cookieCache: { enabled: false },
    },
    databaseHooks: {
      session: {
        delete: {
          before: (s) => {
            sessions.revokeToken(s.token);
            return Promise.resolve();
          },
          after: (s) => {
            sessions.revokeToken(s.token);
            return Promise.resolve();
          },
        },
      },
    },
    rateLimit: {
      enabled: config.rateLimit,
      storage: 'memory',
      window: 60,
      max: 300,
      customRules: {
        // Sign-in has its own limits per account and per address (server/auth/sign-in-limits.ts).
        '/sign-in/email': { window: 60, max: 300 },
        '/request-password-reset': { window: 60, max: 3 },
        '/reset-password': { window: 60, max: 5 },
      },
    },
    advanced: {
      // Explicit, so the check does not depend on NODE_ENV (better-auth skips it under test).
      disableOriginCheck: !config.originCheck,
      disableCSRFCheck: !config.originCheck,
      // The app sets x-forwarded-for from the socket address before auth sees the request.
      ipAddress: { ipAddressHeaders: ['x-forwarded-for'] },
      useSecureCookies: config.publicUrl.startsWith('https://'),
    },
    logger: {
      disabled: false,
      level: config.nodeEnv === 'test' ? 'error' : 'warn',
      log: (level, message, ...args) => {
        const text = `auth: ${message}`;
        if (level === 'error') logger.error(text, args.length ? args : undefined);
        else logger.warn(text, args.length ? args : undefined);
      },
    },
    telemetry: { enabled: false },
  });
  sessionCaches.set(auth, sessions);
  return auth;
}

export type Auth = ReturnType<typeof createAuth>;
