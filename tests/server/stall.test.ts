import { monitorEventLoopDelay } from 'node:perf_hooks';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, sampleDocument, type TestApp } from './helpers';
import { buildLongSpool } from '../../server/db/demo-spools';
import { checkSpool } from '../../shared/engine/index';
import { LINE_LIST_MAX_ROWS } from '../../server/spools/line-list';
import { SHARE_REQUESTS_PER_MINUTE } from '../../server/rate-limit';

// No single request may hold the event loop: big checks run in the worker pool, share links
// serve a stored check, line-list imports are capped and yield, the public share route is limited.

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t?.close();
});

/**
 * The largest event-loop delay while `work` runs, as a share of its duration: ~1 when one
 * stretch of work holds the loop, small when the loop keeps turning. (A share, not a time,
 * because this machine's load varies; the bench reports milliseconds.)
 */
async function loopHeldShare(work: () => Promise<unknown>): Promise<number> {
  const h = monitorEventLoopDelay({ resolution: 5 });
  const t0 = performance.now();
  h.enable();
  try {
    await work();
  } finally {
    h.disable();
  }
  const ms = performance.now() - t0;
  return ms < 200 ? 0 : h.max / 1e6 / ms;
}

describe('POST /api/check in the worker pool', () => {
  it('answers a 3,000-element check with the engine result without holding the event loop', async () => {
    const lead = await t.signIn('lead');
    const doc = buildLongSpool(3_000, 'Pool check');
    let body: { summary: unknown; elements: unknown[] } | undefined;
    const delay = await loopHeldShare(async () => {
      const r = await lead.post('/api/check').send(doc);
      expect(r.status).toBe(200);
      body = r.body;
    });
    const expected = JSON.parse(JSON.stringify(checkSpool(doc)));
    expect(body?.summary).toEqual(expected.summary);
    expect(body?.elements).toHaveLength(3_000);
    expect(body?.elements[1234]).toEqual(expected.elements[1234]);
    // Checking on the event loop held it for the whole request; in the pool the loop only moves
    // bytes (supertest's own parsing of the ~15 MB answer runs on this loop too, hence the margin).
    expect(delay).toBeLessThan(0.5);
  }, 60_000);

  it('refuses a bad document from the pool with the field named', async () => {
    const lead = await t.signIn('lead');
    const doc = buildLongSpool(400, 'Pool invalid');
    const bad = {
      ...doc,
      elements: doc.elements.map((e, i) => (i === 321 ? { ...e, id: 'x\u0000' } : e)),
    };
    const r = await lead.post('/api/check').send(bad);
    expect(r.status).toBe(422);
    expect(r.body.error.details[0].path).toBe('elements[321].id');
    const notJson = await lead
      .post('/api/check')
      .set('content-type', 'application/json')
      .send(`${JSON.stringify(doc).slice(0, 20_000)}`);
    expect(notJson.status).toBe(400);
    expect(notJson.body.error.details[0].path).toBe('body');
  }, 60_000);
});

describe('share links', () => {
  it('store the check of the frozen revision when created and serve it unchanged', async () => {
    const admin = await t.signIn('admin');
    // Invented team material; values chosen for the test, not from any table.
    const material =
      'id,spec,grade,tensile_ksi,yield_ksi,temp_f,stress_ksi\nSTALL-1,Team spec ST,1,70,38,100,23.3\nSTALL-1,,,,,400,23.3';
    await admin
      .post('/api/materials/import?source=stall%20test%20table')
      .set('content-type', 'text/csv')
      .send(material)
      .expect(201);
    const doc = sampleDocument('Shared frozen', {
      conditions: { pressure: 150, temperature: 300, material: 'STALL-1' },
    });
    const created = await admin.post('/api/spools').send({ document: doc });
    expect(created.body.summary.invalid).toBe(0);
    const share = await admin.post(`/api/spools/${created.body.id}/shares`).send({});
    expect(share.status).toBe(201);
    const token = share.body.url.split('/').pop();
    const first = await t.anon().get(`/api/share/${token}`);
    expect(first.status).toBe(200);
    expect(first.body.check.summary.invalid).toBe(0);
    expect(first.body.spool).toMatchObject({ name: 'Shared frozen', revision: 0 });
    // The team's material goes away: live checks change, the shared check does not.
    await admin.delete('/api/materials/STALL-1').expect(200);
    expect((await admin.post('/api/check').send(doc)).body.summary.invalid).toBe(3);
    const again = await t.anon().get(`/api/share/${token}`);
    expect(again.body.check).toEqual(first.body.check);
    expect(again.body).toMatchObject({
      sharedAt: first.body.sharedAt,
      expiresAt: first.body.expiresAt,
    });
    await t.idle();
  });

  it('limit the public route per address when rate limits are on', async () => {
    const limited = await createTestApp({ rateLimit: true });
    try {
      const codes: number[] = [];
      for (let i = 0; i < SHARE_REQUESTS_PER_MINUTE + 2; i++)
        codes.push((await limited.anon().get('/api/share/no-such-token')).status);
      expect(codes.slice(0, SHARE_REQUESTS_PER_MINUTE).every((c) => c === 404)).toBe(true);
      const over = await limited.anon().get('/api/share/no-such-token');
      expect(over.status).toBe(429);
      expect(over.body.error).toMatchObject({ code: 'rate_limited', message: expect.any(String) });
    } finally {
      await limited.close();
    }
    // Off (RATE_LIMIT=off, as in this suite's app): never limited.
    for (let i = 0; i < SHARE_REQUESTS_PER_MINUTE + 5; i++)
      expect((await t.anon().get('/api/share/no-such-token')).status).toBe(404);
  });
});

describe('line-list import', () => {
  const head = 'name,pressure,temperature,material';
  const rows = (n: number, prefix: string) =>
    Array.from({ length: n }, (_, i) => `${prefix}-${i},150,100,A106-B`).join('\n');

  it(`refuses more than ${LINE_LIST_MAX_ROWS} rows at once, saying so, and writes nothing`, async () => {
    const lead = await t.signIn('lead');
    const before = (await lead.get('/api/spools?pageSize=1')).body.total;
    let r:
      | {
          status: number;
          body: { error: { message: string; details: { path: string; message: string }[] } };
        }
      | undefined;
    // 60,000 short rows (~800 kB, under the 1 MB upload limit).
    const huge = `name,pressure,temperature\n${Array.from({ length: 60_000 }, (_, i) => `H${i},150,100`).join('\n')}`;
    const delay = await loopHeldShare(async () => {
      r = await lead.post('/api/spools/import').set('content-type', 'text/csv').send(huge);
    });
    expect(r?.status).toBe(422);
    expect(r?.body.error.message).toContain('2,000');
    expect(r?.body.error.details[0]).toMatchObject({
      path: 'file',
      message: expect.stringContaining('2,000'),
    });
    expect((await lead.get('/api/spools?pageSize=1')).body.total).toBe(before);
    expect(delay).toBeLessThan(0.5);
  });

  it(`imports ${LINE_LIST_MAX_ROWS} rows while the event loop keeps turning`, async () => {
    const lead = await t.signIn('lead');
    let r: { status: number; body: { created: number; items: { name: string }[] } } | undefined;
    const csv = `${head}\n${rows(LINE_LIST_MAX_ROWS, 'Cap')}`;
    const delay = await loopHeldShare(async () => {
      r = await lead.post('/api/spools/import').set('content-type', 'text/csv').send(csv);
    });
    expect(r?.status).toBe(201);
    expect(r?.body.created).toBe(LINE_LIST_MAX_ROWS);
    expect(r?.body.items[1999]?.name).toBe('Cap-1999');
    expect(delay).toBeLessThan(0.25);
  }, 120_000);
});
