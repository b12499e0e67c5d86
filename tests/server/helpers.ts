import { createHash, randomBytes } from 'node:crypto';
import { freePort } from '../../scripts/lib/tooling';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { PGlite } from '@electric-sql/pglite';
import pg from 'pg';
import request from 'supertest';
import { closeAppServices, createApp, getAppServices } from '../../server/app';
import { createAuth } from '../../server/auth/auth';
import { loadConfig, type ServerConfig } from '../../server/config';
import { MIGRATIONS_DIR, openPostgres, wrapPglite, type Database } from '../../server/db/client';
import { DEMO_PASSWORD, DEMO_USERS, seedDemo } from '../../server/db/seed';
import { createMailer, type Mailer } from '../../server/mail/mailer';
import { readMail, type ReadMailOptions } from '../e2e/harness';
import { silentLogger } from '../../server/logger';
import type { Role } from '../../shared/model/permissions';

export const ROOT = path.resolve(import.meta.dirname, '../..');
export { DEMO_PASSWORD };

/** Suites run against PostgreSQL when TEST_DATABASE_URL is set, else against embedded clones. */
export const TEST_DATABASE_URL = process.env.TEST_DATABASE_URL || undefined;

/** Files whose content decides what the template database holds. */
function templateKey(): string {
  const h = createHash('sha256');
  for (const f of fs.readdirSync(MIGRATIONS_DIR).sort()) {
    const p = path.join(MIGRATIONS_DIR, f);
    if (fs.statSync(p).isFile()) h.update(f).update(fs.readFileSync(p));
  }
  for (const f of [
    'server/db/seed.ts',
    'server/db/demo-spools.ts',
    'server/spools/check.ts',
    'server/spools/repo.ts',
  ])
    h.update(fs.readFileSync(path.join(ROOT, f)));
  // The stored check summaries come from the engine, so its sources are part of the key.
  for (const dir of ['shared/engine', 'shared/data', 'shared/model']) {
    for (const f of fs.readdirSync(path.join(ROOT, dir)).sort()) {
      const p = path.join(ROOT, dir, f);
      if (fs.statSync(p).isFile()) h.update(f).update(fs.readFileSync(p));
    }
  }
  return h.digest('hex').slice(0, 16);
}

let templatePromise: Promise<Blob> | undefined;

/**
 * A migrated and seeded embedded database, dumped once and cached on disk between suites
 * (initdb costs ~1.5 s per fresh instance; loading a dump ~0.35 s).
 */
function getTemplate(): Promise<Blob> {
  templatePromise ??= (async () => {
    const file = path.join(os.tmpdir(), `spoolwright-template-${templateKey()}.tar`);
    if (fs.existsSync(file)) return new Blob([fs.readFileSync(file)]);
    const client = await PGlite.create();
    const database = wrapPglite(client);
    await database.migrate();
    await seedDemo(database.db);
    const dump = await client.dumpDataDir('none');
    await client.close();
    const tmp = `${file}.${process.pid}.${randomBytes(4).toString('hex')}`;
    fs.writeFileSync(tmp, Buffer.from(await dump.arrayBuffer()));
    fs.renameSync(tmp, file);
    return dump;
  })();
  return templatePromise;
}

/** An empty database on the TEST_DATABASE_URL server: its URL and a function that drops it. */
export async function createEmptyPostgresDatabase(
  url: string,
): Promise<{ url: string; drop: () => Promise<void> }> {
  const name = `spoolwright_test_${process.pid}_${randomBytes(4).toString('hex')}`;
  const admin = new pg.Client({ connectionString: url });
  await admin.connect();
  await admin.query(`create database ${name}`);
  await admin.end();
  const u = new URL(url);
  u.pathname = `/${name}`;
  return {
    url: u.toString(),
    async drop() {
      const a = new pg.Client({ connectionString: url });
      await a.connect();
      await a.query(`drop database if exists ${name} with (force)`);
      await a.end();
    },
  };
}

/** A fresh PostgreSQL database on the TEST_DATABASE_URL server, migrated and seeded; dropped on close. */
async function createPostgresDatabase(url: string): Promise<Database> {
  const empty = await createEmptyPostgresDatabase(url);
  const database = openPostgres(empty.url);
  await database.migrate();
  await seedDemo(database.db);
  return {
    ...database,
    async close() {
      await database.close();
      await empty.drop();
    },
  };
}

/** A fresh database holding the demo data (embedded clone, or PostgreSQL when configured). */
export async function createTestDatabase(): Promise<Database> {
  if (TEST_DATABASE_URL) return createPostgresDatabase(TEST_DATABASE_URL);
  const client = await PGlite.create({ loadDataDir: await getTemplate() });
  return wrapPglite(client);
}

export interface TestApp {
  app: ReturnType<typeof createApp>;
  database: Database;
  config: ServerConfig;
  /** A supertest agent signed in as the demo member with `role`. */
  signIn(role: Role): Promise<request.Agent>;
  /** A supertest agent without a session. */
  anon(): request.Agent;
  /** Resolves when no background job (re-checks) is running. */
  idle(): Promise<void>;
  /** Drop the cached agent of `role` (after its sessions were revoked), so signIn signs in afresh. */
  forget(role: Role): void;
  mailer: Mailer;
  /** The newest mail to `to` the catcher kept (its decoded text), waiting for it to arrive. */
  readMail(to: string, opts?: ReadMailOptions): Promise<string>;
  close(): Promise<void>;
}

export function demoEmail(role: Role): string {
  const u = DEMO_USERS.find((x) => x.role === role);
  if (!u) throw new Error(`no demo user for ${role}`);
  return u.email;
}

/** createApp() over a fresh demo database, quiet, rate limiter off unless asked for. */
export async function createTestApp(overrides: Partial<ServerConfig> = {}): Promise<TestApp> {
  const database = await createTestDatabase();
  const dataDir = overrides.dataDir ?? fs.mkdtempSync(path.join(os.tmpdir(), 'spoolwright-test-'));
  const config = loadConfig(
    { NODE_ENV: 'test' },
    { rateLimit: false, originCheck: false, ...overrides, dataDir },
  );
  const mailer = await createMailer({
    db: database.db,
    smtpUrl: config.smtpUrl,
    from: config.mailFrom,
    logger: silentLogger,
    mailDir: path.join(dataDir, 'mail'),
  });
  const auth = createAuth({ db: database.db, config, mailer, logger: silentLogger });
  const app = createApp({ db: database.db, auth, mailer, config, logger: silentLogger });
  const agents = new Map<Role, request.Agent>();
  return {
    app,
    database,
    config,
    async signIn(role) {
      const cached = agents.get(role);
      if (cached) return cached;
      const agent = request.agent(app);
      const r = await agent
        .post('/api/auth/sign-in/email')
        .send({ email: demoEmail(role), password: DEMO_PASSWORD });
      if (r.status !== 200) throw new Error(`sign-in as ${role} failed: ${r.status} ${r.text}`);
      agents.set(role, agent);
      return agent;
    },
    anon: () => request.agent(app),
    forget: (role) => agents.delete(role),
    mailer,
    readMail: (to, opts) => readMail(dataDir, to, opts),
    idle: () => getAppServices(app).jobs.idle(),
    async close() {
      await closeAppServices(app);
      await mailer.close();
      await database.close();
      if (!overrides.dataDir) fs.rmSync(dataDir, { recursive: true, force: true });
    },
  };
}

/** A free loopback port for a child server. */
export const getFreePort = freePort;

/** A valid small spool document for tests. */
export function sampleDocument(name = 'Test spool', overrides: Record<string, unknown> = {}) {
  return {
    units: 'imperial',
    name,
    line: '2"-TS-0001-A1',
    conditions: { pressure: 150, temperature: 100, material: 'A106-B', corrosionAllowance: 0.0625 },
    elements: [
      { kind: 'straight', id: 'S1', nps: '2', schedule: '40', direction: 'east', length: 24 },
      {
        kind: 'bend',
        id: 'B1',
        nps: '2',
        schedule: '40',
        direction: 'north',
        bendRadius: { multipleOfD: 3 },
        angle: 90,
      },
      { kind: 'straight', id: 'S2', nps: '2', schedule: '40', direction: 'north', length: 36 },
    ],
    ...overrides,
  };
}
