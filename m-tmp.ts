import { spawn } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { buildLongSpool } from './server/db/demo-spools';
const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'sw-repro-'));
const port = 5391;
const url = `http://127.0.0.1:${port}`;
const child = spawn('npx', ['tsx', 'server/index.ts'], {
  env: {
    ...process.env,
    NODE_ENV: 'production',
    DATA_DIR: dataDir,
    PORT: String(port),
    RATE_LIMIT: 'off',
  },
  stdio: ['ignore', 'pipe', 'pipe'],
});
let out = '';
child.stdout.on('data', (d) => (out += d));
child.stderr.on('data', (d) => (out += d));
child.on('exit', (c, s) => console.log('EXIT', c, s));
while (!out.includes('running at')) await new Promise((r) => setTimeout(r, 200));
const si = await fetch(`${url}/api/auth/sign-in/email`, {
  method: 'POST',
  headers: { 'content-type': 'application/json', origin: url },
  body: JSON.stringify({ email: 'lead@spoolwright.test', password: 'spoolwright-demo' }),
});
const cookie = si.headers
  .getSetCookie()
  .map((c) => c.split(';')[0])
  .join('; ');
const h = { cookie, origin: url, 'content-type': 'application/json' };
const long = buildLongSpool(20_000, 'R');
const big = { ...long, elements: long.elements.map(({ direction: _d, ...e }) => e) };
let t = performance.now();
const c1 = await fetch(`${url}/api/check`, {
  method: 'POST',
  headers: h,
  body: JSON.stringify(buildLongSpool(500)),
});
console.log(
  'check 500 (pool, tsx CLI)',
  c1.status,
  (await c1.arrayBuffer()).byteLength,
  (performance.now() - t).toFixed(0),
);
t = performance.now();
const r = await fetch(`${url}/api/spools`, {
  method: 'POST',
  headers: h,
  body: JSON.stringify({ document: big }),
}).catch((e) => ({ status: String(e), text: async () => '' }));
console.log(
  'create 20k',
  r.status,
  (await r.text()).slice(0, 200),
  (performance.now() - t).toFixed(0),
);
console.log(out.slice(-2000));
child.kill('SIGTERM');
