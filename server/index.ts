import fs from 'node:fs';
import type { AddressInfo } from 'node:net';
import { fileURLToPath } from 'node:url';
import { randomBytes } from 'node:crypto';
import path from 'node:path';
import { DEV_SECRET, loadConfig, type ServerConfig } from './config';
import { openDatabase, type Database } from './db/client';
import { DataDirLockedError } from './db/lock';
import { isDatabaseEmpty, seedDemo } from './db/seed';
import { createAuth } from './auth/auth';
import { createMailer, type Mailer } from './mail/mailer';
import { closeAppServices, createApp, getAppServices } from './app';
import { createLogger, type Logger } from './logger';

export const DIST_DIR = fileURLToPath(new URL('../dist', import.meta.url));

export interface RunningServer {
  url: string;
  port: number;
  database: Database;
  close(): Promise<void>;
}

/** Without AUTH_SECRET, sessions are signed with a random secret kept in DATA_DIR (created on first start). */
function readOrCreateSecret(dataDir: string): string {
  const file = path.join(dataDir, 'auth-secret');
  try {
    const s = fs.readFileSync(file, 'utf8').trim();
    if (s.length >= 32) return s;
  } catch {
    // first start
  }
  fs.mkdirSync(dataDir, { recursive: true });
  const secret = randomBytes(32).toString('base64url');
  fs.writeFileSync(file, `${secret}\n`, { mode: 0o600 });
  return secret;
}

/** Open the database, migrate, seed demo data into an empty one, and listen. */
export async function startServer(
  config: ServerConfig,
  logger: Logger = createLogger(),
): Promise<RunningServer> {
  const t0 = Date.now();
  if (config.authSecret === DEV_SECRET)
    config = { ...config, authSecret: readOrCreateSecret(config.dataDir) };
  const database = await openDatabase(config);
  // Without SMTP_URL an in-process SMTP catcher receives the mail (DATA_DIR/mail, the outbox);
  // it starts while the database migrates.
  const mailerReady = createMailer({
    db: database.db,
    smtpUrl: config.smtpUrl,
    from: config.mailFrom,
    logger,
    mailDir: path.join(config.dataDir, 'mail'),
  });
  mailerReady.catch(() => undefined);
  try {
    await database.migrate();
    if (await isDatabaseEmpty(database.db)) {
      const seeded = await seedDemo(database.db);
      logger.info(
        `seeded demo data: team "${seeded.team.name}", ${seeded.users} users, ${seeded.spools} spools (password spoolwright-demo)`,
      );
    }
  } catch (err) {
    await mailerReady.then(
      (m) => m.close(),
      () => undefined,
    );
    await database.close();
    throw err;
  }
  let mailer: Mailer;
  try {
    mailer = await mailerReady;
  } catch (err) {
    await database.close();
    throw err;
  }
  const auth = createAuth({ db: database.db, config, mailer, logger });
  const serveClient = config.nodeEnv === 'production' || fs.existsSync(`${DIST_DIR}/index.html`);
  const app = createApp({
    db: database.db,
    auth,
    mailer,
    config,
    logger,
    staticDir: serveClient ? DIST_DIR : undefined,
  });
  // Re-checks left unfinished by an earlier process run again (in the background).
  getAppServices(app)
    .jobs.resume()
    .catch((err: unknown) => logger.error('could not resume background jobs', err));
  const server = app.listen(config.port, config.host);
  await new Promise<void>((resolve, reject) => {
    server.once('listening', resolve);
    server.once('error', reject);
  }).catch(async (err: unknown) => {
    await mailer.close();
    await database.close();
    throw err;
  });
  if (mailer.kind === 'outbox')
    logger.info(`mail goes to the development catcher: ${mailer.mailDir} (no SMTP_URL)`);
  const port = (server.address() as AddressInfo).port;
  const url = config.port === 0 ? `http://${config.host}:${port}` : config.publicUrl;
  logger.info(
    `ready in ${Date.now() - t0} ms (${database.kind}${database.kind === 'pglite' ? ` in ${config.dataDir}` : ''})`,
  );
  let closing: Promise<void> | undefined;
  return {
    url,
    port,
    database,
    close() {
      closing ??= new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      })
        .then(() => closeAppServices(app))
        .then(() => mailer.close())
        .then(() => database.close());
      return closing;
    },
  };
}

/** Run the server as a process: print the URL, stop cleanly on SIGINT/SIGTERM. */
export async function runMain() {
  const logger = createLogger({ silent: process.env.SPOOLWRIGHT_QUIET === '1' });
  const config = loadConfig();
  let running: RunningServer;
  try {
    running = await startServer(config, logger);
  } catch (err) {
    if (err instanceof DataDirLockedError) {
      console.error(err.message);
      process.exit(3);
    }
    throw err;
  }
  // One line that scripts and people can rely on.
  console.log(`Spoolwright is running at ${running.url}`);
  const stop = (signal: string) => {
    logger.info(`${signal}: shutting down`);
    running.close().then(
      () => process.exit(0),
      (err: unknown) => {
        logger.error('shutdown failed', err);
        process.exit(1);
      },
    );
  };
  process.once('SIGINT', () => stop('SIGINT'));
  process.once('SIGTERM', () => stop('SIGTERM'));
}

const isEntry = (() => {
  try {
    return !!process.argv[1] && fileURLToPath(import.meta.url) === fs.realpathSync(process.argv[1]);
  } catch {
    return false;
  }
})();
if (isEntry) {
  runMain().catch((err: unknown) => {
    console.error(err instanceof Error ? err.message : err);
    process.exit(1);
  });
}
