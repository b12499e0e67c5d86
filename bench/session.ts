/**
 * Cost of the session check: /api/me (signed in) against /api/health in the same run, in
 * process over loopback, sequential requests, interleaved rounds. Three cases: the in-process
 * session cache hit (the usual request), a miss on every request (better-auth's session lookup
 * in the database, as another process or the first request after 5 s sees it), and signed out.
 * Run: npx tsx bench/session.ts   (BENCH_N=2000 requests per case and round)
 */
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { createTestApp } from '../tests/server/helpers';
import { sessionCacheOf } from '../server/auth/auth';
import { createAuth } from '../server/auth/auth';
import { createApp } from '../server/app';
import { silentLogger } from '../server/logger';

const N = Number(process.env.BENCH_N ?? 1000);
const ROUNDS = 3;

const t = await createTestApp();
const auth = createAuth({
  db: t.database.db,
  config: t.config,
  mailer: t.mailer,
  logger: silentLogger,
});
const app = createApp({
  db: t.database.db,
  auth,
  mailer: t.mailer,
  config: t.config,
  logger: silentLogger,
});
const server = http.createServer(app).listen(0, '127.0.0.1');
await new Promise((r) => server.once('listening', r));
const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
const login = await fetch(`${base}/api/auth/sign-in/email`, {
  method: 'POST',
  headers: { 'content-type': 'application/json' },
  body: JSON.stringify({ email: 'lead@spoolwright.test', password: 'spoolwright-demo' }),
});
const cookie = login.headers
  .getSetCookie()
  .map((c) => c.split(';')[0])
  .join('; ');
const cache = sessionCacheOf(auth);
const realGet = cache.get.bind(cache);

async function time(
  path: string,
  headers: Record<string, string>,
  expect: number,
): Promise<number[]> {
  const ts: number[] = [];
  for (let i = 0; i < N; i++) {
    const t0 = performance.now();
    const r = await fetch(`${base}${path}`, { headers });
    await r.arrayBuffer();
    if (r.status !== expect) throw new Error(`${path}: ${r.status}`);
    ts.push(performance.now() - t0);
  }
  return ts;
}

const all: Record<string, number[]> = {
  health: [],
  'me (cache hit)': [],
  'me (lookup every request)': [],
  'me (signed out, 401)': [],
};
await time('/api/health', {}, 200);
await time('/api/me', { cookie }, 200);
for (let round = 0; round < ROUNDS; round++) {
  all.health!.push(...(await time('/api/health', {}, 200)));
  cache.get = realGet;
  all['me (cache hit)']!.push(...(await time('/api/me', { cookie }, 200)));
  cache.get = () => undefined;
  all['me (lookup every request)']!.push(...(await time('/api/me', { cookie }, 200)));
  cache.get = realGet;
  all['me (signed out, 401)']!.push(...(await time('/api/me', {}, 401)));
}
const q = (xs: number[], p: number) =>
  [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor(xs.length * p))]!;
const h50 = q(all.health!, 0.5);
for (const [name, xs] of Object.entries(all)) {
  console.log(
    `${name.padEnd(28)} p50 ${q(xs, 0.5).toFixed(2)} ms  p90 ${q(xs, 0.9).toFixed(2)} ms  p50 ratio to health ${(q(xs, 0.5) / h50).toFixed(2)}×`,
  );
}
server.close();
await t.close();
