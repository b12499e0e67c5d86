import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { createTestApp, sampleDocument, type TestApp } from './helpers';

// A seeded fuzz of the whole API: 10,000 requests built from hostile pieces (NUL, lone
// surrogates, huge and negative numbers, inherited property names, bad percent-encoding, long
// strings) over every route of server/API.md. Expected: no 5xx; every 4xx in the
// `{ error: { code, message, details } }` shape, with a path on each detail of a 400/422.

const SEED = 20261202;
const RUNS = Number(process.env.FUZZ_RUNS ?? 10_000);
const PARALLEL = 6;

let t: TestApp;
let server: Server;
let base: string;
let cookie: string;
let spoolId: string;
let shareToken: string;

beforeAll(async () => {
  t = await createTestApp();
  server = t.app.listen(0, '127.0.0.1');
  await new Promise<void>((resolve) => server.once('listening', resolve));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  const signIn = await fetch(`${base}/api/auth/sign-in/email`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email: 'admin@spoolwright.test', password: 'spoolwright-demo' }),
  });
  expect(signIn.status).toBe(200);
  cookie = signIn.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
  const created = await fetch(`${base}/api/spools`, {
    method: 'POST',
    headers: { cookie, 'content-type': 'application/json' },
    body: JSON.stringify({ document: sampleDocument('Fuzz target') }),
  });
  spoolId = ((await created.json()) as { id: string }).id;
  const share = await fetch(`${base}/api/spools/${spoolId}/shares`, {
    method: 'POST',
    headers: { cookie, 'content-type': 'application/json' },
    body: '{}',
  });
  shareToken = ((await share.json()) as { id: string }).id;
}, 60_000);

afterAll(async () => {
  await new Promise<void>((resolve) => (server ? server.close(() => resolve()) : resolve()));
  server?.closeAllConnections();
  await t?.close();
});

const hostileString = fc.oneof(
  fc.constantFrom(
    '\u0000',
    'a\u0000b',
    '\ud800',
    'x\udc00',
    '\ud83d',
    '__proto__',
    'constructor',
    'toString',
    'hasOwnProperty',
    '',
    ' ',
    '-',
    '%',
    '..',
    '../..',
    'null',
    'undefined',
    'NaN',
    '1e10',
    '-1',
    '2147483648',
    '99999999999',
    '0x1F',
  ),
  fc.string({ maxLength: 20 }),
  fc.string({ unit: 'binary', maxLength: 12 }),
  fc.nat(3).map((n) => 'y'.repeat([150, 300, 5_000, 100_001][n]!)),
);
const hostileNumber = fc.oneof(
  fc.constantFrom(
    0,
    -1,
    1,
    2 ** 31 - 1,
    2 ** 31,
    2 ** 53,
    1e10,
    1e308,
    -1e308,
    -500,
    -460,
    0.5,
    -0.0,
  ),
  fc.integer(),
  fc.double({ noNaN: true, noDefaultInfinity: true }),
);
const hostileValue: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 3, arbitrary: hostileString },
  { weight: 3, arbitrary: hostileNumber },
  { weight: 1, arbitrary: fc.constantFrom(null, true, false, [], {}) },
  { weight: 1, arbitrary: fc.jsonValue({ maxDepth: 2 }) },
);

/** A URL segment: a valid id, or something percent-encoded (or malformed) and hostile. */
const segment = (valid: () => string) =>
  fc.oneof(
    { weight: 2, arbitrary: fc.constant(null).map(() => valid()) },
    // `.` and `..` segments are resolved by the client's URL parser before they are sent.
    {
      weight: 3,
      arbitrary: hostileString
        .map((s) => encodeURIComponent(s.replace(/[\ud800-\udfff]/g, '')).slice(0, 3_000))
        .map((s) => (/^\.{1,2}$/.test(s) ? 'dot' : s)),
    },
    {
      weight: 2,
      arbitrary: fc.constantFrom(
        '%00',
        '%E0%A4%A',
        '%ED%A0%80',
        '%',
        '%zz',
        '%C0%AF',
        '99999999999',
        '2147483648',
        '-1',
        '1.5',
        '%2e%2e%2f',
      ),
    },
  );

/** A spool document with one field replaced by a hostile value. */
const mutatedDocument = fc
  .record({
    where: fc.constantFrom(
      'name',
      'line',
      'units',
      'conditions.pressure',
      'conditions.temperature',
      'conditions.material',
      'conditions.productForm',
      'elements.0.id',
      'elements.0.nps',
      'elements.0.schedule',
      'elements.0.length',
      'elements.1.bendRadius',
      'elements.1.angle',
      'elements.0.kind',
      'elements.2.conditions',
      'elements',
      'origin',
    ),
    value: hostileValue,
  })
  .map(({ where, value }) => {
    const doc = structuredClone(sampleDocument('Fuzz')) as Record<string, unknown>;
    const keys = where.split('.');
    let o = doc as Record<string, unknown>;
    for (const k of keys.slice(0, -1)) o = o[k] as Record<string, unknown>;
    o[keys[keys.length - 1]!] = value;
    return doc;
  });
const body = fc.oneof(
  { weight: 3, arbitrary: fc.dictionary(hostileString, hostileValue, { maxKeys: 4 }) },
  { weight: 1, arbitrary: hostileValue },
);

interface Req {
  method: string;
  path: string;
  query: string;
  body?: unknown;
  csv?: string;
  anonymous?: boolean;
}

const query = fc
  .array(
    fc.tuple(
      fc.constantFrom(
        'sort',
        'search',
        'status',
        'page',
        'pageSize',
        'limit',
        'source',
        'revision',
        '__proto__',
        '%00',
      ),
      hostileString,
    ),
    { maxLength: 3 },
  )
  .map((pairs) =>
    pairs
      .map(
        ([k, v]) =>
          `${k.startsWith('%') ? k : encodeURIComponent(k)}=${encodeURIComponent(v.replace(/[\ud800-\udfff]/g, '\ufffd').slice(0, 2_000))}`,
      )
      .join('&'),
  );

const csvCell = hostileString.map((s) => s.replace(/[\ud800-\udfff]/g, '').slice(0, 2_000));
const csvText = (head: string) =>
  fc
    .array(fc.array(csvCell, { minLength: 1, maxLength: 8 }), { minLength: 1, maxLength: 4 })
    .map((rows) => `${head}\n${rows.map((r) => r.join(',')).join('\n')}`);

const sid = () => spoolId;
const request: fc.Arbitrary<Req> = fc.oneof(
  fc.record({ method: fc.constant('GET'), path: fc.constant('/api/spools'), query }),
  fc.record({
    method: fc.constant('POST'),
    path: fc.constant('/api/spools'),
    query,
    body: fc.oneof(
      mutatedDocument.map((document) => ({ document })),
      body,
    ),
  }),
  fc.record({
    method: fc.constantFrom('GET', 'DELETE'),
    path: segment(sid).map((s) => `/api/spools/${s}`),
    query,
  }),
  fc.record({
    method: fc.constant('PUT'),
    path: segment(sid).map((s) => `/api/spools/${s}`),
    query,
    body: fc.oneof(fc.record({ document: mutatedDocument, baseVersion: hostileValue }), body),
  }),
  fc.record({
    method: fc.constant('POST'),
    path: segment(sid).map((s) => `/api/spools/${s}/transitions`),
    query,
    body: fc.oneof(
      fc.record(
        {
          to: fc.oneof(fc.constantFrom('submitted', 'draft', 'checked', 'released'), hostileString),
          note: hostileValue,
          baseVersion: hostileValue,
        },
        { requiredKeys: ['to'] },
      ),
      body,
    ),
  }),
  fc.record({
    method: fc.constant('GET'),
    path: fc
      .tuple(segment(sid), fc.constantFrom('revisions', 'events', 'comments', 'shares'))
      .map(([s, w]) => `/api/spools/${s}/${w}`),
    query,
  }),
  fc.record({
    method: fc.constant('GET'),
    path: fc
      .tuple(
        segment(sid),
        segment(() => '0'),
      )
      .map(([s, r]) => `/api/spools/${s}/revisions/${r}`),
    query,
  }),
  fc.record({
    method: fc.constant('POST'),
    path: segment(sid).map((s) => `/api/spools/${s}/comments`),
    query,
    body: fc.oneof(
      fc.record(
        { body: hostileValue, elementId: hostileValue, revision: hostileValue },
        { requiredKeys: ['body'] },
      ),
      body,
    ),
  }),
  fc.record({
    method: fc.constant('PATCH'),
    path: fc
      .tuple(
        segment(sid),
        segment(() => '1'),
      )
      .map(([s, c]) => `/api/spools/${s}/comments/${c}`),
    query,
    body: fc.oneof(fc.record({ resolved: hostileValue }), body),
  }),
  fc.record({
    method: fc.constant('POST'),
    path: segment(sid).map((s) => `/api/spools/${s}/shares`),
    query,
    body: fc.oneof(
      fc.record({ revision: hostileValue, expiresInDays: hostileValue }, { requiredKeys: [] }),
      body,
    ),
  }),
  fc.record({
    method: fc.constant('DELETE'),
    path: fc
      .tuple(
        segment(sid),
        segment(() => 'nope'),
      )
      .map(([s, x]) => `/api/spools/${s}/shares/${x}`),
    query,
  }),
  fc.record({
    method: fc.constant('GET'),
    path: segment(() => shareToken).map((s) => `/api/share/${s}`),
    query,
    anonymous: fc.constant(true),
  }),
  fc.record({
    method: fc.constant('POST'),
    path: fc.constant('/api/check'),
    query,
    body: fc.oneof(mutatedDocument, body),
  }),
  fc.record({
    method: fc.constant('GET'),
    path: fc.constantFrom(
      '/api/materials',
      '/api/dimensions',
      '/api/me',
      '/api/team/members',
      '/api/admin/outbox',
      '/api/admin/jobs',
      '/api/health',
    ),
    query,
  }),
  fc.record({
    method: fc.constant('DELETE'),
    path: segment(() => 'NOPE-1').map((s) => `/api/materials/${s}`),
    query,
  }),
  fc.record({
    method: fc.constantFrom('PATCH', 'DELETE'),
    path: segment(() => 'nobody').map((s) => `/api/team/members/${s}`),
    query,
    body: fc.record({ role: hostileValue }),
  }),
  fc.record({
    method: fc.constant('POST'),
    path: fc.constant('/api/team/members'),
    query,
    body: fc.oneof(
      fc.record({
        email: hostileValue,
        name: hostileValue,
        role: hostileValue,
        password: hostileValue,
      }),
      body,
    ),
  }),
  fc.record({
    method: fc.constant('POST'),
    path: fc.constant('/api/spools/import'),
    query,
    csv: csvText('name,pressure,temperature,material,line,units'),
  }),
  fc.record({
    method: fc.constant('POST'),
    path: fc.constant('/api/materials/import'),
    query,
    csv: csvText('id,spec,grade,tensile_ksi,yield_ksi,temp_f,stress_ksi'),
  }),
  fc.record({
    method: fc.constant('POST'),
    path: fc.constantFrom(
      '/api/auth/sign-in/email',
      '/api/auth/request-password-reset',
      '/api/auth/reset-password',
      '/api/auth/sign-up/email',
    ),
    query,
    body: fc.oneof(
      fc.record(
        {
          email: hostileValue,
          password: hostileValue,
          token: hostileValue,
          newPassword: hostileValue,
          redirectTo: hostileValue,
        },
        { requiredKeys: [] },
      ),
      body,
    ),
    anonymous: fc.constant(true),
  }),
  fc.record({
    method: fc.constantFrom('GET', 'POST', 'PUT', 'DELETE'),
    path: fc
      .array(
        segment(() => 'x'),
        { minLength: 1, maxLength: 4 },
      )
      .map((s) => `/api/${s.join('/')}`),
    query,
  }),
);

async function send(r: Req) {
  const headers: Record<string, string> = r.anonymous ? {} : { cookie };
  let payload: string | undefined;
  if (r.csv !== undefined) {
    headers['content-type'] = 'text/csv';
    payload = r.csv;
  } else if (r.body !== undefined && r.method !== 'GET' && r.method !== 'DELETE') {
    headers['content-type'] = 'application/json';
    payload = JSON.stringify(r.body);
  }
  const res = await fetch(`${base}${r.path}${r.query ? `?${r.query}` : ''}`, {
    method: r.method,
    headers,
    body: payload,
  });
  const text = await res.text();
  return { status: res.status, text };
}

function problemWith(r: Req, status: number, text: string): string | undefined {
  const label = `${r.method} ${r.path.slice(0, 120)}?${r.query.slice(0, 80)} → ${status} ${text.slice(0, 200)}`;
  if (status >= 500) return label;
  if (status < 400) return undefined;
  let data: { error?: { code?: unknown; message?: unknown; details?: unknown } };
  try {
    data = JSON.parse(text) as typeof data;
  } catch {
    return `not JSON: ${label}`;
  }
  const e = data.error;
  if (!e || typeof e.code !== 'string' || typeof e.message !== 'string')
    return `not the error shape: ${label}`;
  if (status === 400 || status === 422) {
    if (!Array.isArray(e.details) || e.details.length === 0) return `no details: ${label}`;
    for (const d of e.details as { path?: unknown }[])
      if (typeof d.path !== 'string' || d.path === '') return `a detail without a path: ${label}`;
  }
  return undefined;
}

describe('seeded API fuzz', () => {
  it(`answers ${RUNS} hostile requests with no 5xx and every 4xx in the error shape`, async () => {
    const requests = fc.sample(request, { seed: SEED, numRuns: RUNS });
    const problems: string[] = [];
    const statuses = new Map<number, number>();
    let next = 0;
    const slow: [number, string][] = [];
    const t0 = Date.now();
    await Promise.all(
      Array.from({ length: PARALLEL }, async () => {
        while (next < requests.length) {
          const r = requests[next++]!;
          const s0 = performance.now();
          const { status, text } = await send(r);
          const ms = performance.now() - s0;
          if (process.env.FUZZ_SLOW)
            slow.push([
              ms,
              `${r.method} ${r.path.slice(0, 60)} ${status} ${(r.csv ?? JSON.stringify(r.body) ?? '').length}`,
            ]);
          statuses.set(status, (statuses.get(status) ?? 0) + 1);
          const p = problemWith(r, status, text);
          if (p && problems.length < 20) problems.push(p);
        }
      }),
    );
    if (process.env.FUZZ_SLOW)
      console.log(
        slow
          .sort((a, b) => b[0] - a[0])
          .slice(0, 25)
          .map((x) => `${x[0].toFixed(0)} ${x[1]}`)
          .join('\n'),
      );
    const counts = [...statuses.entries()].sort((a, b) => a[0] - b[0]);
    // One line of figures for the run log.
    console.log(
      `fuzz: ${RUNS} requests in ${Date.now() - t0} ms, statuses ${JSON.stringify(Object.fromEntries(counts))}`,
    );
    expect(problems).toEqual([]);
    expect(counts.filter(([s]) => s >= 500)).toEqual([]);
  }, 300_000);
});
