import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  DEMO_PASSWORD,
  TEST_DATABASE_URL,
  createEmptyPostgresDatabase,
  sampleDocument,
} from './helpers';
import { api, signInCookie, spawnServer, stopServer, type ServerProcess } from './server-process';

// Real server processes: on the embedded database in a temp directory, or on a fresh
// PostgreSQL database when TEST_DATABASE_URL is set (the lock test is the embedded one's).
const embeddedOnly = TEST_DATABASE_URL ? it.skip : it;

let dir: string;
let pgDb: { url: string; drop: () => Promise<void> } | undefined;
const started: ServerProcess[] = [];
const start = async (opts: Parameters<typeof spawnServer>[1] = {}) => {
  const p = await spawnServer(
    dir,
    pgDb ? { ...opts, env: { DATABASE_URL: pgDb.url, ...opts.env } } : opts,
  );
  started.push(p);
  return p;
};

beforeAll(async () => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'spoolwright-persist-'));
  if (TEST_DATABASE_URL) pgDb = await createEmptyPostgresDatabase(TEST_DATABASE_URL);
});
afterAll(async () => {
  for (const p of started) await stopServer(p, 'SIGKILL');
  fs.rmSync(dir, { recursive: true, force: true });
  await pgDb?.drop();
});

// Each test starts real server processes (initdb, migrations, seed): generous time on a loaded machine.
describe(
  `the ${TEST_DATABASE_URL ? 'PostgreSQL' : 'embedded'} database across processes`,
  { timeout: 180_000 },
  () => {
    it('keeps a saved spool across a restart and seeds only once', async () => {
      const a = await start();
      expect(a.output()).toContain(`Spoolwright is running at ${a.url}`);
      const cookie = await signInCookie(a.url, 'designer@spoolwright.test', DEMO_PASSWORD);
      const created = await api(a.url, cookie, 'POST', '/api/spools', {
        document: sampleDocument('Survivor'),
      });
      expect(created.status).toBe(201);
      const saved = await api(a.url, cookie, 'PUT', `/api/spools/${created.body.id as string}`, {
        document: sampleDocument('Survivor', { line: '2"-TS-0099-A1' }),
        baseVersion: 1,
      });
      expect(saved.status).toBe(200);
      const before = await api(a.url, cookie, 'GET', '/api/spools?pageSize=500');
      expect(await stopServer(a)).toBe(0);
      if (!pgDb) expect(fs.existsSync(path.join(dir, 'spoolwright.lock'))).toBe(false);

      const b = await start();
      const cookie2 = await signInCookie(b.url, 'checker@spoolwright.test', DEMO_PASSWORD);
      const back = await api(b.url, cookie2, 'GET', `/api/spools/${created.body.id as string}`);
      expect(back.status).toBe(200);
      expect(back.body).toMatchObject({ name: 'Survivor', line: '2"-TS-0099-A1', version: 2 });
      const after = await api(b.url, cookie2, 'GET', '/api/spools?pageSize=500');
      expect(after.body.total).toBe(before.body.total);
      await stopServer(b);
    });

    embeddedOnly(
      'refuses a second process on the same data directory with a clear message',
      async () => {
        const a = await start();
        const b = await start({ waitReady: false });
        expect(await b.exited).toBe(3);
        expect(b.output()).toMatch(
          /data directory is in use by another Spoolwright process \(pid \d+\)/,
        );
        // The first server is unharmed.
        expect((await fetch(`${a.url}/api/health`)).status).toBe(200);
        await stopServer(a);
      },
    );

    it('loses no acknowledged save when killed -9 in a write loop, and takes over the stale lock', async () => {
      const a = await start();
      const cookie = await signInCookie(a.url, 'lead@spoolwright.test', DEMO_PASSWORD);
      const first = await api(a.url, cookie, 'POST', '/api/spools', {
        document: sampleDocument('Crash loop'),
      });
      const id = first.body.id as string;
      let version = 1;
      let ackedLine = '';
      const ackedIds: string[] = [];
      let stop = false;
      const saveLoop = (async () => {
        for (let i = 0; !stop; i++) {
          const line = `CRASH-${i}`;
          const r = await api(a.url, cookie, 'PUT', `/api/spools/${id}`, {
            document: sampleDocument('Crash loop', { line }),
            baseVersion: version,
          }).catch(() => null);
          if (!r || r.status !== 200) break;
          version = r.body.version as number;
          ackedLine = line;
        }
      })();
      const createLoop = (async () => {
        for (let i = 0; !stop; i++) {
          const r = await api(a.url, cookie, 'POST', '/api/spools', {
            document: sampleDocument(`Crash new ${i}`),
          }).catch(() => null);
          if (!r || r.status !== 201) break;
          ackedIds.push(r.body.id as string);
        }
      })();
      // Kill mid-loop once a few writes are acknowledged (at least 1.5 s in; longer on a loaded machine).
      const t0 = Date.now();
      while (
        Date.now() - t0 < 1500 ||
        ((version <= 4 || ackedIds.length <= 4) && Date.now() - t0 < 30_000)
      )
        await new Promise((r) => setTimeout(r, 100));
      a.child.kill('SIGKILL');
      expect(await a.exited).toBe('SIGKILL');
      stop = true;
      await Promise.all([saveLoop, createLoop]);
      expect(version).toBeGreaterThan(3);
      expect(ackedIds.length).toBeGreaterThan(3);

      const b = await start();
      const cookie2 = await signInCookie(b.url, 'lead@spoolwright.test', DEMO_PASSWORD);
      const back = await api(b.url, cookie2, 'GET', `/api/spools/${id}`);
      // The save in flight at the kill may or may not have landed; every acknowledged one has.
      expect(back.body.version as number).toBeGreaterThanOrEqual(version);
      if (back.body.version === version) expect(back.body.line).toBe(ackedLine);
      const missing: string[] = [];
      for (const sid of ackedIds)
        if ((await api(b.url, cookie2, 'GET', `/api/spools/${sid}`)).status !== 200)
          missing.push(sid);
      expect(missing).toEqual([]);
      console.log(
        `kill -9 fault test: ${version - 1} acknowledged saves and ${ackedIds.length} acknowledged creates before the kill, all present after restart`,
      );
      await stopServer(b);
    });
  },
);
