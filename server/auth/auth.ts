import { betterAuth } from 'better-auth';
import { drizzleAdapter } from 'better-auth/adapters/drizzle';
import type { Db } from '../db/client';
import { authSchema } from '../db/auth-schema';
import type { ServerConfig } from '../config';
import type { Logger } from '../logger';
import { sendQuietly, type Mailer } from '../mail/mailer';
import { MAX_PASSWORD_LENGTH, MIN_PASSWORD_LENGTH } from '../../shared/model/team';

export { MIN_PASSWORD_LENGTH };

/**
 * better-auth with email + password, sessions in the database and a short cookie cache so that
 * most requests skip the session lookup. Sign-up is closed: team admins add members.
 */
export function createAuth(deps: { db: Db; config: ServerConfig; mailer: Mailer; logger: Logger }) {
  const { db, config, mailer, logger } = deps;
  return betterAuth({
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
      sendResetPassword: async ({ user, token }) => {
        // The link opens the app's own set-new-password page, which posts the token back.
        const url = `${config.publicUrl}/reset-password?token=${encodeURIComponent(token)}`;
        await sendQuietly(mailer, logger, {
          to: user.email,
          subject: 'Reset your Spoolwright password',
          text:
            `Hello ${user.name},\n\nSomeone (hopefully you) asked to reset the password of ${user.email}.\n` +
            `Open this link within an hour to choose a new one:\n\n${url}\n\nIf it was not you, ignore this message.\n`,
        });
      },
    },
    session: {
      expiresIn: 60 * 60 * 24 * 7,
      updateAge: 60 * 60 * 24,
      // Signed cache of the session in a cookie: a route reads it without a database lookup.
      cookieCache: { enabled: true, maxAge: 5 * 60 },
    },
    rateLimit: {
      enabled: config.rateLimit,
      storage: 'memory',
      window: 60,
      max: 300,
      customRules: {
        '/sign-in/email': { window: 10, max: 5 },
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
}

export type Auth = ReturnType<typeof createAuth>;
