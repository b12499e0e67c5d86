/**
 * Hostile-request benchmark: how `/api/health` answers while one heavy request is in flight.
 * A production-mode server process on a fresh embedded database; a prober sends one
 * `/api/health` every 5 ms over its own keep-alive connection and records each latency, first
 * with nothing else running, then during each hostile request:
 *   - four parallel `POST /api/check` of a 20,000-element document,
 *   - a 60,000-row line-list import (refused above 2,000 rows) and a 2,000-row one,
 *   - creating a share link of a 20,000-element spool, then four parallel public views of it.
 * Goal: health p99 ≤ 50 ms in every scenario. Prints a table.
 * Run: npm run bench:hostile   (BENCH_ROOT=<checkout> runs another checkout's server;
 * BENCH_TIMEOUT_S bounds each hostile request, default 120)
 */
import os from 'node:os';
import path from 'node:path';
import { Worker } from 'node:worker_threads';
import { buildLongSpool } from '../server/db/demo-spools';
import { signInHeaders, startBenchServer } from './lib/bench-server';

const ROOT = path.resolve(process.env.BENCH_ROOT ?? path.resolve(import.meta.dirname, '..'));
const TIMEOUT_MS = Number(process.env.BENCH_TIMEOUT_S ?? 120) * 1000;

const {
  url,
  child,
  stop: cleanup,
} = await startBenchServer(ROOT, { tmpPrefix: 'spoolwright-hostile-', env: { RATE_LIMIT: 'off' } });
const headers = await signInHeaders(url, 'lead@spoolwright.test');

async function call(method: string, p: string, body?: string, type = 'application/json') {
  const ctrl = new AbortController();
  const timer = setTimeout(() => ctrl.abort(), TIMEOUT_MS);
  const t0 = performance.now();
  try {
    const r = await fetch(`${url}${p}`, {
      method,
      headers: { ...headers, 'content-type': type },
      body,
      signal: ctrl.signal,
    });
    // Large answers are only counted, not decoded (keeps this process light).
    const buf = await r.arrayBuffer();
    const text = buf.byteLength < 5e6 ? Buffer.from(buf).toString('utf8') : '';
    return { status: r.status, ms: performance.now() - t0, bytes: buf.byteLength, text };
  } catch {
    return { status: 0, ms: performance.now() - t0, bytes: 0, text: 'timed out' };
  } finally {
    clearTimeout(timer);
  }
}

// The prober runs on its own thread, so the hostile clients' work in this process (receiving
// 100 MB answers) cannot delay its measurements.
const PROBER = `
const { parentPort, workerData } = require('node:worker_threads');
let running = true;
const latencies = [];
parentPort.on('message', () => { running = false; });
(async () => {
  while (running) {
    const t0 = performance.now();
    // A failed probe (server gone) counts as an infinite latency.
    const ok = await fetch(workerData.url + '/api/health').then((r) => r.text()).then(() => true, () => false);
    latencies.push(ok ? performance.now() - t0 : Infinity);
    await new Promise((r) => setTimeout(r, ok ? 5 : 200));
  }
  parentPort.postMessage(latencies);
})();
`;

/** Probe /api/health every 5 ms until `work` settles; latencies in ms. */
async function probeDuring(
  work: () => Promise<string>,
): Promise<{ latencies: number[]; note: string; ms: number }> {
  const prober = new Worker(PROBER, { eval: true, workerData: { url } });
  const done = new Promise<number[]>((resolve) => prober.once('message', resolve));
  await new Promise((r) => setTimeout(r, 50));
  const t0 = performance.now();
  const note = await work();
  const ms = performance.now() - t0;
  prober.postMessage('stop');
  const latencies = await done;
  await prober.terminate();
  return { latencies, note, ms };
}

const pct = (xs: number[], p: number) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length === 0 ? NaN : s[Math.min(s.length - 1, Math.floor((p / 100) * s.length))]!;
};

interface Row {
  scenario: string;
  note: string;
  ms: number;
  latencies: number[];
}
const rows: Row[] = [];
async function scenario(name: string, work: () => Promise<string>) {
  const r = await probeDuring(work);
  rows.push({ scenario: name, ...r });
  if (child.exitCode !== null || child.signalCode !== null) {
    r.note += ` — the server process exited (${child.exitCode ?? child.signalCode})`;
    report();
    process.exit(1);
  }
  console.log(
    `${name}: ${r.note} (${(r.ms / 1000).toFixed(1)} s), health p99 ${pct(r.latencies, 99).toFixed(1)} ms over ${r.latencies.length} probes`,
  );
}

// Directions dropped (optional, sketch only) so the 20,000 elements fit the 2 MB JSON limit.
const long = buildLongSpool(20_000, 'Hostile 20k');
const big = { ...long, elements: long.elements.map(({ direction: _direction, ...el }) => el) };
const bigJson = JSON.stringify(big);
console.log(`20,000-element document: ${(bigJson.length / 1024).toFixed(0)} kB of JSON`);
const statuses = (rs: { status: number; ms: number; bytes: number }[]) =>
  rs
    .map(
      (r) =>
        `${r.status || 'timeout'} in ${(r.ms / 1000).toFixed(1)} s${r.bytes ? `, ${(r.bytes / 1e6).toFixed(1)} MB` : ''}`,
    )
    .join('; ');

await scenario('quiet (nothing else running)', async () => {
  await new Promise((r) => setTimeout(r, 3000));
  return '3 s idle';
});
await scenario('4 × POST /api/check, 20,000 elements', async () =>
  statuses(await Promise.all([1, 2, 3, 4].map(() => call('POST', '/api/check', bigJson)))),
);
const hugeCsv = `name,pressure,temperature\n${Array.from({ length: 60_000 }, (_, i) => `H${i},150,100`).join('\n')}`;
await scenario('POST /api/spools/import, 60,000 rows', async () =>
  statuses([await call('POST', '/api/spools/import', hugeCsv, 'text/csv')]),
);
const capCsv = `name,pressure,temperature,material\n${Array.from({ length: 2_000 }, (_, i) => `Cap-${i},150,100,A106-B`).join('\n')}`;
await scenario('POST /api/spools/import, 2,000 rows', async () =>
  statuses([await call('POST', '/api/spools/import', capCsv, 'text/csv')]),
);
const created = await call('POST', '/api/spools', JSON.stringify({ document: big }));
const spoolId = (JSON.parse(created.text) as { id?: string }).id;
let token = '';
await scenario('POST shares of a 20,000-element spool', async () => {
  const r = await call('POST', `/api/spools/${spoolId}/shares`, '{}');
  const body = JSON.parse(r.text) as { id?: string; url?: string };
  token = (body.url ?? '').split('/').pop() || body.id || '';
  return statuses([r]);
});
await scenario('4 × GET /api/share/:token (public, 20,000 elements)', async () =>
  statuses(await Promise.all([1, 2, 3, 4].map(() => call('GET', `/api/share/${token}`)))),
);

function report() {
  console.log(
    `\nSpoolwright /api/health under hostile requests, ${os.cpus().length} cores, load average ${os.loadavg()[0]!.toFixed(1)}, server ${path.relative(process.cwd(), ROOT) || '.'}`,
  );
  console.log(
    'scenario'.padEnd(52),
    'hostile s'.padStart(10),
    'probes'.padStart(7),
    'p50 ms'.padStart(8),
    'p99 ms'.padStart(8),
    'max ms'.padStart(8),
    ' answers',
  );
  for (const r of rows) {
    console.log(
      r.scenario.padEnd(52),
      (r.ms / 1000).toFixed(1).padStart(10),
      String(r.latencies.length).padStart(7),
      pct(r.latencies, 50).toFixed(1).padStart(8),
      pct(r.latencies, 99).toFixed(1).padStart(8),
      Math.max(...r.latencies)
        .toFixed(1)
        .padStart(8),
      r.note,
    );
  }
}
report();
cleanup();
process.exit(0);
