import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type request from 'supertest';
import { createTestApp, sampleDocument, type TestApp } from './helpers';
import { describeFault } from '../../server/logger';

// Every route of server/API.md, each with the hostile values that once reached PostgreSQL (NUL,
// lone surrogates, integers past 2^31 − 1, inherited property names, malformed percent-encoding,
// 100,000-character ids, temperatures below any table). Each must answer 4xx in the API's error
// shape, and validation refusals must name the field.

const NUL = 'bad\u0000name';
const LONE = 'bad\ud800name';
const HUGE = 'x'.repeat(100_000);

let t: TestApp;
let admin: request.Agent;
let spoolId: string;

beforeAll(async () => {
  t = await createTestApp();
  admin = await t.signIn('admin');
  const r = await admin.post('/api/spools').send({ document: sampleDocument('Hostile target') });
  expect(r.status).toBe(201);
  spoolId = r.body.id;
});
afterAll(async () => {
  await t?.close();
});

interface Hostile {
  name: string;
  method: 'get' | 'post' | 'put' | 'patch' | 'delete';
  path: () => string;
  body?: () => unknown;
  csv?: string;
  anonymous?: boolean;
  status: number | number[];
  /** A field path the error must name (422/400 details). */
  names?: string;
}

const doc = (over: Record<string, unknown> = {}) => sampleDocument('Hostile', over);
const withElement = (patch: Record<string, unknown>) => {
  const d = sampleDocument('Hostile');
  return { ...d, elements: [{ ...d.elements[0], ...patch }, ...d.elements.slice(1)] };
};
const withConditions = (patch: Record<string, unknown>) => {
  const d = sampleDocument('Hostile');
  return { ...d, conditions: { ...d.conditions, ...patch } };
};

/** Document variants every route taking a document must refuse, and the path each must name. */
const BAD_DOCUMENTS: { name: string; doc: () => unknown; names: string }[] = [
  { name: 'NUL in the name', doc: () => doc({ name: NUL }), names: 'name' },
  { name: 'lone surrogate in the name', doc: () => doc({ name: LONE }), names: 'name' },
  { name: 'NUL in the line', doc: () => doc({ line: NUL }), names: 'line' },
  { name: 'NUL in an element id', doc: () => withElement({ id: NUL }), names: 'elements[0].id' },
  {
    name: '100,000-character element id',
    doc: () => withElement({ id: HUGE }),
    names: 'elements[0].id',
  },
  {
    name: 'NUL in the material',
    doc: () => withConditions({ material: 'A106\u0000B' }),
    names: 'conditions.material',
  },
  {
    name: '100,000-character material',
    doc: () => withConditions({ material: HUGE }),
    names: 'conditions.material',
  },
  {
    name: 'temperature −500 °F',
    doc: () => withConditions({ temperature: -500 }),
    names: 'conditions.temperature',
  },
  {
    name: 'temperature −1e308 °F',
    doc: () => withConditions({ temperature: -1e308 }),
    names: 'conditions.temperature',
  },
  { name: 'NUL in an element tag', doc: () => withElement({ tag: NUL }), names: 'elements[0].tag' },
];

const CSV_HEAD = 'name,pressure,temperature,material';

const CASES: Hostile[] = [
  // auth
  {
    name: 'sign-in with NUL in the e-mail',
    method: 'post',
    path: () => '/api/auth/sign-in/email',
    body: () => ({ email: `a${NUL}@x.test`, password: 'whatever-long' }),
    anonymous: true,
    status: 422,
    names: 'email',
  },
  {
    name: 'sign-in with a lone surrogate in the password',
    method: 'post',
    path: () => '/api/auth/sign-in/email',
    body: () => ({ email: 'a@x.test', password: LONE }),
    anonymous: true,
    status: 422,
    names: 'password',
  },
  {
    name: 'sign-in with a wrong password',
    method: 'post',
    path: () => '/api/auth/sign-in/email',
    body: () => ({ email: 'lead@spoolwright.test', password: 'wrong-password' }),
    anonymous: true,
    status: 401,
  },
  {
    name: 'reset request with NUL',
    method: 'post',
    path: () => '/api/auth/request-password-reset',
    body: () => ({ email: NUL, redirectTo: '/reset-password' }),
    anonymous: true,
    status: 422,
    names: 'email',
  },
  {
    name: 'reset with a NUL token',
    method: 'post',
    path: () => '/api/auth/reset-password',
    body: () => ({ token: NUL, newPassword: 'long-enough-password' }),
    anonymous: true,
    status: 422,
    names: 'token',
  },
  {
    name: 'auth path with malformed encoding',
    method: 'get',
    path: () => '/api/auth/%E0%A4%A',
    anonymous: true,
    status: 400,
    names: 'url',
  },
  // spools list
  ...['__proto__', 'toString', 'constructor', 'hasOwnProperty', '-__proto__'].map(
    (sort): Hostile => ({
      name: `list sorted by ${sort}`,
      method: 'get',
      path: () => `/api/spools?sort=${sort}`,
      status: 422,
      names: 'query.sort',
    }),
  ),
  {
    name: 'list search with NUL',
    method: 'get',
    path: () => '/api/spools?search=%00',
    status: 422,
    names: 'query.search',
  },
  {
    name: 'list status with NUL',
    method: 'get',
    path: () => '/api/spools?status=draft%00',
    status: 422,
    names: 'query.status',
  },
  {
    name: 'list page 1e10',
    method: 'get',
    path: () => '/api/spools?page=1e10',
    status: 422,
    names: 'query.page',
  },
  {
    name: 'list pageSize 99999999999',
    method: 'get',
    path: () => '/api/spools?pageSize=99999999999',
    status: 422,
    names: 'query.pageSize',
  },
  {
    name: 'list sort given twice',
    method: 'get',
    path: () => '/api/spools?sort=name&sort=line',
    status: 422,
    names: 'query.sort',
  },
  // spool by id
  ...['%00', '%E0%A4%A', '%ED%A0%80', encodeURIComponent(HUGE.slice(0, 5000))].flatMap(
    (seg): Hostile[] => [
      {
        name: `GET spool ${seg.slice(0, 12)}`,
        method: 'get',
        path: () => `/api/spools/${seg}`,
        status: [400, 404],
      },
      {
        name: `PUT spool ${seg.slice(0, 12)}`,
        method: 'put',
        path: () => `/api/spools/${seg}`,
        body: () => ({ document: sampleDocument(), baseVersion: 1 }),
        status: [400, 404],
      },
      {
        name: `DELETE spool ${seg.slice(0, 12)}`,
        method: 'delete',
        path: () => `/api/spools/${seg}`,
        status: [400, 404],
      },
      {
        name: `GET revisions of ${seg.slice(0, 12)}`,
        method: 'get',
        path: () => `/api/spools/${seg}/revisions`,
        status: [400, 404],
      },
      {
        name: `GET comments of ${seg.slice(0, 12)}`,
        method: 'get',
        path: () => `/api/spools/${seg}/comments`,
        status: [400, 404],
      },
      {
        name: `GET shares of ${seg.slice(0, 12)}`,
        method: 'get',
        path: () => `/api/spools/${seg}/shares`,
        status: [400, 404],
      },
      {
        name: `GET events of ${seg.slice(0, 12)}`,
        method: 'get',
        path: () => `/api/spools/${seg}/events`,
        status: [400, 404],
      },
      {
        name: `GET share ${seg.slice(0, 12)}`,
        method: 'get',
        path: () => `/api/share/${seg}`,
        anonymous: true,
        status: [400, 404],
      },
      {
        name: `DELETE material ${seg.slice(0, 12)}`,
        method: 'delete',
        path: () => `/api/materials/${seg}`,
        status: [400, 404],
      },
      {
        name: `PATCH member ${seg.slice(0, 12)}`,
        method: 'patch',
        path: () => `/api/team/members/${seg}`,
        body: () => ({ role: 'designer' }),
        status: [400, 404],
      },
      {
        name: `DELETE member ${seg.slice(0, 12)}`,
        method: 'delete',
        path: () => `/api/team/members/${seg}`,
        status: [400, 404],
      },
    ],
  ),
  {
    name: 'malformed encoding names the url',
    method: 'get',
    path: () => '/api/spools/%E0%A4%A',
    status: 400,
    names: 'url',
  },
  // documents through every route that takes one
  ...BAD_DOCUMENTS.flatMap((b): Hostile[] => [
    {
      name: `create: ${b.name}`,
      method: 'post',
      path: () => '/api/spools',
      body: () => ({ document: b.doc() }),
      status: 422,
      names: `document.${b.names}`,
    },
    {
      name: `save: ${b.name}`,
      method: 'put',
      path: () => `/api/spools/${spoolId}`,
      body: () => ({ document: b.doc(), baseVersion: 1 }),
      status: 422,
      names: `document.${b.names}`,
    },
    {
      name: `check: ${b.name}`,
      method: 'post',
      path: () => '/api/check',
      body: () => b.doc(),
      status: 422,
      names: b.names,
    },
  ]),
  {
    name: 'save with baseVersion 2^31',
    method: 'put',
    path: () => `/api/spools/${spoolId}`,
    body: () => ({ document: sampleDocument(), baseVersion: 2 ** 31 }),
    status: 422,
    names: 'baseVersion',
  },
  {
    name: 'save with baseVersion "1"',
    method: 'put',
    path: () => `/api/spools/${spoolId}`,
    body: () => ({ document: sampleDocument(), baseVersion: '1' }),
    status: 422,
    names: 'baseVersion',
  },
  {
    name: 'NUL in a field name',
    method: 'post',
    path: () => '/api/spools',
    body: () => ({ document: { ...sampleDocument(), ['x\u0000y']: 1 } }),
    status: 422,
    names: 'document.(key)',
  },
  // transitions, revisions, events
  {
    name: 'transition to __proto__',
    method: 'post',
    path: () => `/api/spools/${spoolId}/transitions`,
    body: () => ({ to: '__proto__' }),
    status: 422,
    names: 'to',
  },
  {
    name: 'transition note with NUL',
    method: 'post',
    path: () => `/api/spools/${spoolId}/transitions`,
    body: () => ({ to: 'submitted', note: NUL }),
    status: 422,
    names: 'note',
  },
  {
    name: 'transition baseVersion 1e10',
    method: 'post',
    path: () => `/api/spools/${spoolId}/transitions`,
    body: () => ({ to: 'submitted', baseVersion: 1e10 }),
    status: 422,
    names: 'baseVersion',
  },
  ...['99999999999', '2147483648', '-1', '1e3', '%00', '0x10'].map(
    (rev): Hostile => ({
      name: `revision ${rev}`,
      method: 'get',
      path: () => `/api/spools/${spoolId}/revisions/${rev}`,
      status: [400, 404],
    }),
  ),
  // comments
  {
    name: 'comment body with NUL',
    method: 'post',
    path: () => `/api/spools/${spoolId}/comments`,
    body: () => ({ body: NUL }),
    status: 422,
    names: 'body',
  },
  {
    name: 'comment body with a lone surrogate',
    method: 'post',
    path: () => `/api/spools/${spoolId}/comments`,
    body: () => ({ body: LONE }),
    status: 422,
    names: 'body',
  },
  {
    name: 'comment on revision 2147483648',
    method: 'post',
    path: () => `/api/spools/${spoolId}/comments`,
    body: () => ({ body: 'hello', revision: 2147483648 }),
    status: 422,
    names: 'revision',
  },
  {
    name: 'comment elementId 100,000 characters',
    method: 'post',
    path: () => `/api/spools/${spoolId}/comments`,
    body: () => ({ body: 'hello', elementId: HUGE }),
    status: 422,
    names: 'elementId',
  },
  ...['99999999999', '2147483648', '%00', '-5', '1.5'].map(
    (cid): Hostile => ({
      name: `PATCH comment ${cid}`,
      method: 'patch',
      path: () => `/api/spools/${spoolId}/comments/${cid}`,
      body: () => ({ resolved: true }),
      status: [400, 404],
    }),
  ),
  // shares
  {
    name: 'share revision 1e10',
    method: 'post',
    path: () => `/api/spools/${spoolId}/shares`,
    body: () => ({ revision: 1e10 }),
    status: 422,
    names: 'revision',
  },
  {
    name: 'share revision 2^31',
    method: 'post',
    path: () => `/api/spools/${spoolId}/shares`,
    body: () => ({ revision: 2 ** 31 }),
    status: 422,
    names: 'revision',
  },
  {
    name: 'share expires in 1e10 days',
    method: 'post',
    path: () => `/api/spools/${spoolId}/shares`,
    body: () => ({ expiresInDays: 1e10 }),
    status: 422,
    names: 'expiresInDays',
  },
  {
    name: 'revoke share %00',
    method: 'delete',
    path: () => `/api/spools/${spoolId}/shares/%00`,
    status: [400, 404],
  },
  // CSV uploads
  {
    name: 'line-list cell with NUL',
    method: 'post',
    path: () => '/api/spools/import',
    csv: `${CSV_HEAD}\nA\u0000B,150,100,A106-B`,
    status: 422,
    names: 'line 2',
  },
  {
    name: 'line-list name with a 100,000-character id',
    method: 'post',
    path: () => '/api/spools/import',
    csv: `${CSV_HEAD}\nok,150,100,${HUGE}`,
    status: 422,
    names: 'line 2: material',
  },
  {
    name: 'line-list temperature −500',
    method: 'post',
    path: () => '/api/spools/import',
    csv: `${CSV_HEAD}\nCold,150,-500,A106-B`,
    status: 422,
    names: 'line 2: temperature',
  },
  {
    name: 'materials source with NUL',
    method: 'post',
    path: () => '/api/materials/import?source=abc%00def',
    csv: 'id,spec,grade,tensile_ksi,yield_ksi,temp_f,stress_ksi\nM1,S,G,60,35,100,20',
    status: 422,
    names: 'query.source',
  },
  {
    name: 'materials cell with NUL',
    method: 'post',
    path: () => '/api/materials/import?source=hostile%20test',
    csv: 'id,spec,grade,tensile_ksi,yield_ksi,temp_f,stress_ksi\nM1,S\u0000,G,60,35,100,20',
    status: 422,
    names: 'line 2',
  },
  {
    name: 'materials id of 100,000 characters',
    method: 'post',
    path: () => '/api/materials/import?source=hostile%20test',
    csv: `id,spec,grade,tensile_ksi,yield_ksi,temp_f,stress_ksi\n${HUGE},S,G,60,35,100,20`,
    status: 422,
    names: 'line 2: id',
  },
  // team
  {
    name: 'member name with NUL',
    method: 'post',
    path: () => '/api/team/members',
    body: () => ({
      email: 'nul@spoolwright.test',
      name: NUL,
      role: 'designer',
      password: 'long-enough-pw',
    }),
    status: 422,
    names: 'name',
  },
  {
    name: 'member name with a lone surrogate',
    method: 'post',
    path: () => '/api/team/members',
    body: () => ({
      email: 'lone@spoolwright.test',
      name: LONE,
      role: 'designer',
      password: 'long-enough-pw',
    }),
    status: 422,
    names: 'name',
  },
  {
    name: 'member role __proto__',
    method: 'post',
    path: () => '/api/team/members',
    body: () => ({
      email: 'proto@spoolwright.test',
      name: 'P',
      role: '__proto__',
      password: 'long-enough-pw',
    }),
    status: 422,
    names: 'role',
  },
  // admin, data, misc
  {
    name: 'outbox limit 1e10',
    method: 'get',
    path: () => '/api/admin/outbox?limit=1e10',
    status: 422,
    names: 'query.limit',
  },
  {
    name: 'outbox limit NUL',
    method: 'get',
    path: () => '/api/admin/outbox?limit=%00',
    status: 422,
    names: 'query.limit',
  },
  {
    name: 'materials with a NUL query',
    method: 'get',
    path: () => '/api/materials?x=%00',
    status: 422,
    names: 'query.x',
  },
  {
    name: 'dimensions with a NUL query',
    method: 'get',
    path: () => '/api/dimensions?%00=1',
    status: 422,
    names: 'query',
  },
  { name: 'me under a NUL path', method: 'get', path: () => '/api/me/%00', status: [400, 404] },
  {
    name: 'health with a malformed path',
    method: 'get',
    path: () => '/api/health/%E0%A4%A',
    anonymous: true,
    status: 400,
  },
  {
    name: 'JSON body that is not JSON',
    method: 'post',
    path: () => '/api/check',
    body: () => '{"units":',
    status: 400,
    names: 'body',
  },
  {
    name: 'JSON nested 100,000 deep',
    method: 'post',
    path: () => '/api/check',
    body: () => '['.repeat(100_000) + ']'.repeat(100_000),
    status: [400, 422],
  },
];

function expectErrorShape(r: request.Response, label: string) {
  expect(r.status, `${label}: ${r.text.slice(0, 300)}`).toBeGreaterThanOrEqual(400);
  expect(r.status, `${label}: ${r.text.slice(0, 300)}`).toBeLessThan(500);
  expect(typeof r.body?.error?.code, `${label}: ${r.text.slice(0, 300)}`).toBe('string');
  expect(typeof r.body.error.message, label).toBe('string');
  if (r.status === 400 || r.status === 422) {
    expect(Array.isArray(r.body.error.details), `${label}: details`).toBe(true);
    for (const d of r.body.error.details as { path: unknown; message: unknown }[]) {
      expect(
        typeof d.path === 'string' && d.path.length > 0,
        `${label}: a detail names its path`,
      ).toBe(true);
      expect(typeof d.message, label).toBe('string');
    }
  }
}

describe('hostile values on every route', () => {
  it.each(CASES.map((c) => [c.name, c] as const))('%s', async (_name, c) => {
    const agent = c.anonymous ? t.anon() : admin;
    let req = agent[c.method](c.path());
    if (c.csv !== undefined) req = req.set('content-type', 'text/csv').send(c.csv);
    else if (c.body !== undefined) {
      const b = c.body();
      req =
        typeof b === 'string'
          ? req.set('content-type', 'application/json').send(b)
          : req.send(b as object);
    }
    const r = await req;
    expectErrorShape(r, c.name);
    const allowed = Array.isArray(c.status) ? c.status : [c.status];
    expect(allowed, `${c.name}: got ${r.status} ${r.text.slice(0, 300)}`).toContain(r.status);
    if (c.names) {
      const paths = ((r.body.error.details ?? []) as { path: string }[]).map((d) => d.path);
      expect(
        paths.some(
          (p) =>
            p === c.names ||
            p.startsWith(`${c.names}.`) ||
            p.startsWith(`${c.names}[`) ||
            p.startsWith(`${c.names}:`),
        ),
        `${c.name}: paths ${JSON.stringify(paths)}`,
      ).toBe(true);
    }
  });

  it('still serves the target spool afterwards (nothing was half-written)', async () => {
    const r = await admin.get(`/api/spools/${spoolId}`);
    expect(r.status).toBe(200);
    expect(r.body.name).toBe('Hostile target');
  });
});

describe('the log of a failed query', () => {
  it('keeps the error code and drops the SQL text and its parameters', () => {
    const cause = Object.assign(new Error('invalid byte sequence for encoding "UTF8": 0x00'), {
      code: '22021',
    });
    const err = Object.assign(
      new Error('Failed query: insert into "spools" ("name") values ($1)\nparams: secret-name'),
      { query: 'insert …', params: ['secret-name'], cause },
    );
    const line = describeFault(err);
    expect(line).toContain('22021');
    expect(line).not.toContain('insert into');
    expect(line).not.toContain('secret-name');
    expect(line).not.toContain('0x00"');
  });
});
