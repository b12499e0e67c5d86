import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { PGlite } from '@electric-sql/pglite';
import type { PgDatabase, PgQueryResultHKT } from 'drizzle-orm/pg-core';
import { drizzle as drizzlePglite } from 'drizzle-orm/pglite';
import { migrate as migratePglite } from 'drizzle-orm/pglite/migrator';
import { drizzle as drizzlePg } from 'drizzle-orm/node-postgres';
import { migrate as migratePg } from 'drizzle-orm/node-postgres/migrator';
import pg from 'pg';
import * as schema from './schema';
import { acquireDirLock, type DirLock } from './lock';

export type Schema = typeof schema;
/** The Drizzle database, whichever driver is underneath (embedded PGlite or node-postgres). */
export type Db = PgDatabase<PgQueryResultHKT, Schema>;

export interface Database {
  readonly db: Db;
  readonly kind: 'pglite' | 'postgres';
  /** Apply the committed migrations in drizzle/. */
  migrate(): Promise<void>;
  close(): Promise<void>;
}

/** drizzle/ beside server/, wherever the process was started from. */
export const MIGRATIONS_DIR = fileURLToPath(new URL('../../drizzle', import.meta.url));

/** Wrap an open PGlite instance (tests hand in clones of a migrated template). */
export function wrapPglite(client: PGlite, onClose?: () => void): Database {
  const db = drizzlePglite({ client, schema }) as unknown as Db;
  return {
    db,
    kind: 'pglite',
    migrate: () => migratePglite(db as never, { migrationsFolder: MIGRATIONS_DIR }),
    async close() {
      try {
        if (!client.closed) await client.close();
      } finally {
        onClose?.();
      }
    },
  };
}

/** Connect to a PostgreSQL server. */
export function openPostgres(url: string): Database {
  const pool = new pg.Pool({ connectionString: url, max: 10 });
  // An idle connection the server ends (restart, admin termination) is reported here; without a
  // listener it would crash the process. The pool drops that client and reconnects on demand.
  pool.on('error', (err) => {
    process.emitWarning(`PostgreSQL idle connection closed: ${err.message}`);
  });
  const db = drizzlePg({ client: pool, schema }) as unknown as Db;
  return {
    db,
    kind: 'postgres',
    migrate: () => migratePg(db as never, { migrationsFolder: MIGRATIONS_DIR }),
    close: () => pool.end(),
  };
}

/**
 * Open the embedded database in `dataDir/db`, holding the directory's exclusive lock for
 * as long as the database is open (a second process gets DataDirLockedError).
 */
export async function openPglite(dataDir: string): Promise<Database> {
  const lock: DirLock = acquireDirLock(dataDir);
  try {
    const client = await PGlite.create(path.join(dataDir, 'db'));
    return wrapPglite(client, () => lock.release());
  } catch (err) {
    lock.release();
    throw err;
  }
}

/** Open the configured database: PostgreSQL when a URL is given, else the embedded one. */
export function openDatabase(opts: {
  databaseUrl?: string | undefined;
  dataDir: string;
}): Promise<Database> {
  if (opts.databaseUrl) return Promise.resolve(openPostgres(opts.databaseUrl));
  return openPglite(opts.dataDir);
}
