/**
 * HTTP API benchmark: a production-mode server process on a fresh embedded database (or
 * DATABASE_URL), 10 connections over loopback, ~5 s per route, as a signed-in member.
 * Prints req/s and latency p50/p99 for: reading a 200-element spool, saving it (each
 * connection saves its own spool with the version it got back), listing 500 spools.
 * Run: npm run bench:api
 */
import os from 'node:os';
import path from 'node:path';
import autocannon from 'autocannon';
import { buildLongSpool } from '../server/db/demo-spools';
import { signInHeaders, startBenchServer } from './lib/bench-server';

const ROOT = path.resolve(import.meta.dirname, '..');
const CONNECTIONS = 10;
const DURATION = Number(process.env.BENCH_SECONDS ?? 5);

const { url, stop: cleanup } = await startBenchServer(ROOT, { tmpPrefix: 'spoolwright-bench-' });
const headers = await signInHeaders(url, 'lead@spoolwright.test');

async function post(p: string, body: unknown) {
  const r = await fetch(`${url}${p}`, { method: 'POST', headers, body: JSON.stringify(body) });
  if (r.status !== 201) throw new Error(`POST ${p}: ${r.status} ${await r.text()}`);
  return (await r.json()) as { id: string; version: number };
}

// Fixtures: 200-element spools for the connections to save (each its own, so saves do not conflict), then fill the team up to 500 spools.
const long = buildLongSpool(200, 'Bench long run');
const longBody = JSON.stringify({ document: long });
console.log(`200-element document: ${(longBody.length / 1024).toFixed(1)} kB of JSON`);
const own: { id: string; version: number }[] = [];
for (let i = 0; i < CONNECTIONS * 3; i++)
  own.push(await post('/api/spools', { document: { ...long, name: `Bench long run ${i}` } }));
const listed = (await (await fetch(`${url}/api/spools?pageSize=1`, { headers })).json()) as {
  total: number;
};
const small = buildLongSpool(5, 'x');
for (let i = listed.total; i < 500; i++)
  await post('/api/spools', {
    document: { ...small, name: `Bench spool ${String(i).padStart(3, '0')}` },
  });

interface Row {
  name: string;
  rps: number;
  p50: number;
  p99: number;
  non2xx: number;
  errors: number;
}
const rows: Row[] = [];

async function bench(name: string, opts: Partial<autocannon.Options> & { path?: string }) {
  const { path: p = '', ...rest } = opts;
  const r = await autocannon({
    url: `${url}${p}`,
    connections: CONNECTIONS,
    duration: DURATION,
    headers,
    ...rest,
  });
  const odd = Object.entries(r.statusCodeStats ?? {}).filter(([code]) => !code.startsWith('2'));
  if (odd.length > 0) console.log(`${name}: status codes ${JSON.stringify(r.statusCodeStats)}`);
  rows.push({
    name,
    rps: r.requests.average,
    p50: r.latency.p50,
    p99: r.latency.p99,
    non2xx: r.non2xx,
    errors: r.errors,
  });
}

await bench('GET /api/health (no session)', { path: '/api/health' });
await bench('GET /api/me (session from cookie cache)', { path: '/api/me' });
await bench('GET /api/spools/:id (200 elements)', { path: `/api/spools/${own[0]!.id}` });
await bench('GET /api/spools?pageSize=500 (500 spools)', { path: '/api/spools?pageSize=500' });
// autocannon resets a connection's context between requests, so spools circulate through a
// free pool: a spool is out with one request at a time and comes back with its new version.
const free = [...own];
await bench('PUT /api/spools/:id (200 elements, check + save)', {
  requests: [
    {
      method: 'PUT',
      setupRequest: (req, context) => {
        const spool = free.shift();
        if (!spool) throw new Error('spool pool ran dry');
        (context as { spool?: typeof spool }).spool = spool;
        return {
          ...req,
          path: `/api/spools/${spool.id}`,
          body: `{"baseVersion":${spool.version},${longBody.slice(1)}`,
        };
      },
      onResponse: (status, body, context) => {
        const spool = (context as { spool?: { id: string; version: number } }).spool;
        if (!spool) return;
        if (status === 200) spool.version = (JSON.parse(body) as { version: number }).version;
        free.push(spool);
      },
    },
  ],
});

console.log(
  `\nSpoolwright API, ${CONNECTIONS} connections, ${DURATION} s each, loopback, ${os.cpus().length} cores, ${process.env.DATABASE_URL ? 'PostgreSQL' : 'embedded PGlite'}`,
);
console.log(
  'route'.padEnd(52),
  'req/s'.padStart(8),
  'p50 ms'.padStart(8),
  'p99 ms'.padStart(8),
  'non-2xx'.padStart(8),
);
for (const r of rows) {
  console.log(
    r.name.padEnd(52),
    r.rps.toFixed(0).padStart(8),
    String(r.p50).padStart(8),
    String(r.p99).padStart(8),
    String(r.non2xx + r.errors).padStart(8),
  );
}
cleanup();
process.exit(0);
