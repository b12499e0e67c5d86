import path from 'node:path';
import type { SignInLimits } from './auth/sign-in-limits';

export interface ServerConfig {
  readonly port: number;
  readonly host: string;
  /** Directory of the embedded database, the lock file and other local state. */
  readonly dataDir: string;
  /** Origin the app is reached at (auth base URL, links in mail). */
  readonly publicUrl: string;
  /** PostgreSQL server URL; when unset the embedded database in dataDir is used. */
  readonly databaseUrl: string | undefined;
  /** SMTP server for production mail; when unset the in-process catcher keeps it (DATA_DIR/mail, outbox). */
  readonly smtpUrl: string | undefined;
  readonly nodeEnv: 'development' | 'production' | 'test';
  /** Secret that signs session cookies. */
  readonly authSecret: string;
  /** Origins allowed to call the auth endpoints with cookies. */
  readonly trustedOrigins: readonly string[];
  /** better-auth's rate limiter; on unless explicitly turned off. */
  readonly rateLimit: boolean;
  /** Refuse state-changing requests whose Origin is not trusted (better-auth's check and ours). */
  readonly originCheck: boolean;
  /** Sender address of outgoing mail. */
  readonly mailFrom: string;
  /** Sign-in limits when `rateLimit` is on (default DEFAULT_SIGN_IN_LIMITS in server/auth/sign-in-limits.ts). */
  readonly signInLimits?: SignInLimits | undefined;
}

/** Placeholder used when no secret is configured; the server replaces it with one kept in DATA_DIR. */
export const DEV_SECRET = 'spoolwright-development-secret-change-me-0123456789';

function parsePort(raw: string | undefined, fallback: number): number {
  if (raw === undefined || raw === '') return fallback;
  const n = Number(raw);
  if (!Number.isInteger(n) || n < 0 || n > 65535)
    throw new Error(`PORT must be an integer 0–65535, got "${raw}"`);
  return n;
}

/** Read the server configuration from environment variables (see DEVELOPERS.md). */
export function loadConfig(
  env: NodeJS.ProcessEnv = process.env,
  overrides: Partial<ServerConfig> = {},
): ServerConfig {
  const port = overrides.port ?? parsePort(env.PORT, 5174);
  const host = overrides.host ?? (env.HOST || '127.0.0.1');
  const nodeEnv =
    overrides.nodeEnv ??
    (env.NODE_ENV === 'production'
      ? 'production'
      : env.NODE_ENV === 'test'
        ? 'test'
        : 'development');
  const publicUrl = (overrides.publicUrl ?? (env.PUBLIC_URL || `http://${host}:${port}`)).replace(
    /\/+$/,
    '',
  );
  const secret = overrides.authSecret ?? env.AUTH_SECRET ?? env.BETTER_AUTH_SECRET ?? DEV_SECRET;
  const origins = new Set<string>([
    publicUrl,
    `http://localhost:${port}`,
    `http://127.0.0.1:${port}`,
    'http://localhost:5173',
    'http://127.0.0.1:5173',
  ]);
  for (const o of (env.TRUSTED_ORIGINS ?? '').split(',')) if (o.trim()) origins.add(o.trim());
  return {
    port,
    host,
    dataDir: path.resolve(overrides.dataDir ?? (env.DATA_DIR || './data')),
    publicUrl,
    databaseUrl: overrides.databaseUrl ?? (env.DATABASE_URL || undefined),
    smtpUrl: overrides.smtpUrl ?? (env.SMTP_URL || undefined),
    nodeEnv,
    authSecret: secret,
    trustedOrigins: overrides.trustedOrigins ?? [...origins],
    rateLimit: overrides.rateLimit ?? env.RATE_LIMIT !== 'off',
    originCheck: overrides.originCheck ?? env.ORIGIN_CHECK !== 'off',
    mailFrom: overrides.mailFrom ?? (env.MAIL_FROM || 'Spoolwright <no-reply@spoolwright.test>'),
    signInLimits: overrides.signInLimits,
  };
}
