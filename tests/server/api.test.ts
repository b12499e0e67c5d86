import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, DEMO_PASSWORD, demoEmail, sampleDocument, type TestApp } from './helpers';
import { teams, teamMembers } from '../../server/db/schema';
import { createUserWithPassword } from '../../server/db/seed';
import { buildLongSpool } from '../../server/db/demo-spools';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t?.close();
});

async function createSpool(
  name = 'API test spool',
  doc: Record<string, unknown> = sampleDocument(name),
) {
  const lead = await t.signIn('lead');
  const r = await lead.post('/api/spools').send({ document: doc });
  expect(r.status).toBe(201);
  return r.body as { id: string; version: number; revision: number; status: string };
}

describe('health, session and /api/me', () => {
  it('answers health without a session', async () => {
    const r = await t.anon().get('/api/health');
    expect(r.status).toBe(200);
    expect(r.body).toEqual({ ok: true });
  });

  it('refuses signed-out requests with 401 and the error shape', async () => {
    const r = await t.anon().get('/api/spools');
    expect(r.status).toBe(401);
    expect(r.body.error).toMatchObject({ code: 'unauthenticated' });
  });

  it('rejects a wrong password', async () => {
    const r = await t
      .anon()
      .post('/api/auth/sign-in/email')
      .send({ email: demoEmail('designer'), password: 'not-the-password' });
    expect(r.status).toBe(401);
  });

  it('has no public sign-up', async () => {
    const r = await t
      .anon()
      .post('/api/auth/sign-up/email')
      .send({ email: 'new@spoolwright.test', password: 'long-enough-pw', name: 'New' });
    expect(r.status).toBeGreaterThanOrEqual(400);
  });

  it('describes the signed-in member', async () => {
    const r = await (await t.signIn('checker')).get('/api/me');
    expect(r.status).toBe(200);
    expect(r.body).toEqual({
      user: { id: expect.any(String), email: 'checker@spoolwright.test', name: expect.any(String) },
      team: { id: expect.any(String), name: expect.any(String) },
      role: 'checker',
      permissions: expect.arrayContaining(['spool:view', 'spool:check']),
    });
    expect(r.body.permissions).not.toContain('spool:edit');
  });

  it('signs out', async () => {
    const agent = t.anon();
    await agent
      .post('/api/auth/sign-in/email')
      .send({ email: demoEmail('fabricator'), password: 'spoolwright-demo' })
      .expect(200);
    await agent.get('/api/me').expect(200);
    await agent.post('/api/auth/sign-out').send({}).expect(200);
    await agent.get('/api/me').expect(401);
  });

  it('serves unknown API routes as JSON 404', async () => {
    const r = await (await t.signIn('lead')).get('/api/nothing-here');
    expect(r.status).toBe(404);
    expect(r.body.error.code).toBe('not_found');
  });
});

describe('spools', () => {
  it('creates, reads and lists a spool with its check summary', async () => {
    const created = await createSpool('Create-read spool');
    expect(created).toMatchObject({
      name: 'Create-read spool',
      line: '2"-TS-0001-A1',
      status: 'draft',
      revision: 0,
      version: 1,
    });
    const lead = await t.signIn('lead');
    const r = await lead.get(`/api/spools/${created.id}`);
    expect(r.status).toBe(200);
    expect(r.body.document.elements).toHaveLength(3);
    expect(r.body.summary).toMatchObject({ pass: expect.any(Number), fail: 0 });
    expect(r.body.createdBy).toMatchObject({ id: expect.any(String), name: expect.any(String) });
    const list = await lead.get('/api/spools').query({ search: 'create-read' });
    expect(list.body.total).toBe(1);
    expect(list.body.items[0]).not.toHaveProperty('document');
    expect(list.body.items[0]).toMatchObject({
      id: created.id,
      worst: { elementId: expect.any(String), status: expect.any(String) },
    });
  });

  it('lists the demo spools with search, status filter, sort and pages', async () => {
    const lead = await t.signIn('lead');
    const all = await lead.get('/api/spools').query({ sort: 'name', pageSize: 500 });
    expect(all.status).toBe(200);
    const names = all.body.items.map((s: { name: string }) => s.name);
    expect(names).toEqual([...names].sort((a: string, b: string) => (a < b ? -1 : a > b ? 1 : 0)));
    const released = await lead.get('/api/spools').query({ status: 'released' });
    expect(released.body.items.length).toBeGreaterThan(0);
    expect(released.body.items.every((s: { status: string }) => s.status === 'released')).toBe(
      true,
    );
    const paged = await lead.get('/api/spools').query({ sort: 'name', page: 2, pageSize: 2 });
    expect(paged.body).toMatchObject({ page: 2, pageSize: 2, total: all.body.total });
    expect(paged.body.items.map((s: { name: string }) => s.name)).toEqual(names.slice(2, 4));
    const bad = await lead.get('/api/spools').query({ sort: 'colour', status: 'lost' });
    expect(bad.status).toBe(422);
    expect(bad.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual([
      'query.sort',
      'query.status',
    ]);
  });

  it('names each invalid field with its path (422)', async () => {
    const doc = sampleDocument('Bad');
    (doc.elements[1] as Record<string, unknown>).bendRadius = -2;
    (doc.conditions as Record<string, unknown>).pressure = 'high';
    const r = await (await t.signIn('designer')).post('/api/spools').send({ document: doc });
    expect(r.status).toBe(422);
    expect(r.body.error.code).toBe('validation');
    const paths = r.body.error.details.map((d: { path: string }) => d.path);
    expect(paths).toContain('document.conditions.pressure');
    expect(paths.some((p: string) => p.startsWith('document.elements[1].bendRadius'))).toBe(true);
    const missing = await (await t.signIn('designer')).post('/api/spools').send({});
    expect(missing.status).toBe(422);
    expect(missing.body.error.details[0].path).toBe('document');
  });

  it('refuses bodies over the limit (413) and broken JSON (400) without internals', async () => {
    const designer = await t.signIn('designer');
    const huge = { document: { ...sampleDocument('Huge'), padding: 'x'.repeat(3 * 1024 * 1024) } };
    const r = await designer.post('/api/spools').send(huge);
    expect(r.status).toBe(413);
    expect(r.body.error.code).toBe('payload_too_large');
    const b = await designer
      .post('/api/spools')
      .set('content-type', 'application/json')
      .send('{"document": ');
    expect(b.status).toBe(400);
    expect(JSON.stringify(b.body)).not.toMatch(/at .*\.(ts|js):\d+/);
  });

  it('saves with the current baseVersion and answers 409 with the current spool when stale', async () => {
    const s = await createSpool('Versioned');
    const designer = await t.signIn('designer');
    const doc = sampleDocument('Versioned', { line: '2"-TS-0002-A1' });
    const ok = await designer.put(`/api/spools/${s.id}`).send({ document: doc, baseVersion: 1 });
    expect(ok.status).toBe(200);
    expect(ok.body).toMatchObject({ version: 2, line: '2"-TS-0002-A1' });
    const stale = await designer
      .put(`/api/spools/${s.id}`)
      .send({ document: sampleDocument('Versioned', { line: 'lost' }), baseVersion: 1 });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('conflict');
    expect(stale.body.error.details.current).toMatchObject({
      id: s.id,
      version: 2,
      line: '2"-TS-0002-A1',
    });
    expect(stale.body.error.details.current.document).toBeDefined();
  });

  it('lets exactly one of many concurrent saves from the same base win', async () => {
    const s = await createSpool('Race');
    const agents = [await t.signIn('designer'), await t.signIn('lead'), await t.signIn('admin')];
    const results = await Promise.all(
      Array.from({ length: 9 }, (_, i) =>
        agents[i % 3]!.put(`/api/spools/${s.id}`).send({
          document: sampleDocument('Race', { line: `L-${i}` }),
          baseVersion: 1,
        }),
      ),
    );
    const codes = results.map((r) => r.status).sort();
    expect(codes.filter((c) => c === 200)).toHaveLength(1);
    expect(codes.filter((c) => c === 409)).toHaveLength(8);
    const winner = results.find((r) => r.status === 200)!;
    const now = await agents[0]!.get(`/api/spools/${s.id}`);
    expect(now.body).toMatchObject({ version: 2, line: winner.body.line });
  });

  it('keeps other teams out (404)', async () => {
    const s = await createSpool('Team-only');
    await t.database.db.insert(teams).values({ id: 'team-other', name: 'Other Team' });
    const id = await createUserWithPassword(t.database.db, {
      email: 'outsider@spoolwright.test',
      name: 'Out Sider',
      password: 'outsider-password',
    });
    await t.database.db
      .insert(teamMembers)
      .values({ teamId: 'team-other', userId: id, role: 'admin' });
    const out = t.anon();
    await out
      .post('/api/auth/sign-in/email')
      .send({ email: 'outsider@spoolwright.test', password: 'outsider-password' })
      .expect(200);
    expect((await out.get(`/api/spools/${s.id}`)).status).toBe(404);
    expect(
      (await out.put(`/api/spools/${s.id}`).send({ document: sampleDocument('x'), baseVersion: 1 }))
        .status,
    ).toBe(404);
    expect((await out.delete(`/api/spools/${s.id}`)).status).toBe(404);
    expect((await out.get('/api/spools')).body.total).toBe(0);
  });

  it('soft-deletes (204) and then answers 404', async () => {
    const s = await createSpool('Doomed');
    const lead = await t.signIn('lead');
    await lead.delete(`/api/spools/${s.id}`).expect(204);
    await lead.get(`/api/spools/${s.id}`).expect(404);
    await lead.delete(`/api/spools/${s.id}`).expect(404);
  });

  it('stores a 200-element spool and reads it back unchanged', async () => {
    const doc = buildLongSpool(200);
    const s = await createSpool(doc.name, doc as unknown as Record<string, unknown>);
    const r = await (await t.signIn('fabricator')).get(`/api/spools/${s.id}`);
    expect(r.body.document.elements).toHaveLength(200);
    expect(
      r.body.summary.pass +
        r.body.summary.marginal +
        r.body.summary.fail +
        r.body.summary.review +
        r.body.summary.invalid,
    ).toBe(200);
  });
});

describe('lifecycle, revisions and mail', () => {
  it('goes draft → submitted → checked → released, records events and mails the next role', async () => {
    const s = await createSpool('Lifecycle');
    const designer = await t.signIn('designer');
    const checker = await t.signIn('checker');
    const lead = await t.signIn('lead');
    const admin = await t.signIn('admin');
    expect(
      (
        await designer
          .post(`/api/spools/${s.id}/transitions`)
          .send({ to: 'submitted', note: 'please check' })
      ).body.status,
    ).toBe('submitted');
    expect(
      (await checker.post(`/api/spools/${s.id}/transitions`).send({ to: 'checked' })).body.status,
    ).toBe('checked');
    const rel = await lead
      .post(`/api/spools/${s.id}/transitions`)
      .send({ to: 'released', note: 'go' });
    expect(rel.status).toBe(200);
    expect(rel.body).toMatchObject({ status: 'released', revision: 0, version: 4 });
    const ev = await checker.get(`/api/spools/${s.id}/events`);
    expect(ev.body.items.map((e: { from: string; to: string }) => `${e.from}>${e.to}`)).toEqual([
      'draft>submitted',
      'submitted>checked',
      'checked>released',
    ]);
    expect(ev.body.items[0]).toMatchObject({
      note: 'please check',
      user: { name: expect.any(String) },
      createdAt: expect.any(String),
    });
    const mail = await admin.get('/api/admin/outbox');
    expect(mail.status).toBe(200);
    const subjects = mail.body.items.map(
      (m: { subject: string; to: string }) => `${m.subject} -> ${m.to}`,
    );
    expect(subjects).toContain(
      'Spool Lifecycle submitted -> checker@spoolwright.test, lead@spoolwright.test',
    );
    expect(
      subjects.some(
        (x: string) =>
          x.startsWith('Spool Lifecycle released') && x.includes('fabricator@spoolwright.test'),
      ),
    ).toBe(true);
  });

  it('refuses moves the lifecycle does not allow (409) and releasing a failing spool', async () => {
    const s = await createSpool('Out of order');
    const lead = await t.signIn('lead');
    const r = await lead.post(`/api/spools/${s.id}/transitions`).send({ to: 'released' });
    expect(r.status).toBe(409);
    expect(r.body.error).toMatchObject({
      code: 'invalid_transition',
      details: { from: 'draft', to: 'released' },
    });
    const bad = await lead.post(`/api/spools/${s.id}/transitions`).send({ to: 'approved' });
    expect(bad.status).toBe(422);
    const failing = await createSpool(
      'Failing',
      sampleDocument('Failing', {
        conditions: {
          pressure: 2500,
          temperature: 100,
          material: 'A106-B',
          corrosionAllowance: 0.0625,
        },
      }),
    );
    await lead.post(`/api/spools/${failing.id}/transitions`).send({ to: 'submitted' }).expect(200);
    await lead.post(`/api/spools/${failing.id}/transitions`).send({ to: 'checked' }).expect(200);
    const rel = await lead.post(`/api/spools/${failing.id}/transitions`).send({ to: 'released' });
    expect(rel.status).toBe(409);
    expect(rel.body.error.code).toBe('check_failed');
  });

  it('returns a submitted spool to draft with a note, mailing its designer', async () => {
    const designer = await t.signIn('designer');
    const c = await designer.post('/api/spools').send({ document: sampleDocument('Returned') });
    await designer
      .post(`/api/spools/${c.body.id}/transitions`)
      .send({ to: 'submitted' })
      .expect(200);
    const back = await (await t.signIn('checker'))
      .post(`/api/spools/${c.body.id}/transitions`)
      .send({ to: 'draft', note: 'B1 radius?' });
    expect(back.body.status).toBe('draft');
    const mail = await (await t.signIn('admin')).get('/api/admin/outbox');
    expect(
      mail.body.items.find(
        (m: { subject: string }) => m.subject === 'Spool Returned returned to draft',
      ),
    ).toMatchObject({
      to: 'designer@spoolwright.test',
      text: expect.stringContaining('B1 radius?'),
    });
  });

  it('opens a new revision in draft when a checked spool is edited; the old one stays readable', async () => {
    const s = await createSpool('Revised');
    const lead = await t.signIn('lead');
    await lead.post(`/api/spools/${s.id}/transitions`).send({ to: 'submitted' }).expect(200);
    const checked = await lead.post(`/api/spools/${s.id}/transitions`).send({ to: 'checked' });
    const edited = await lead.put(`/api/spools/${s.id}`).send({
      document: sampleDocument('Revised', { line: '2"-TS-0003-A1' }),
      baseVersion: checked.body.version,
    });
    expect(edited.status).toBe(200);
    expect(edited.body).toMatchObject({ status: 'draft', revision: 1, line: '2"-TS-0003-A1' });
    const list = await lead.get(`/api/spools/${s.id}/revisions`);
    expect(
      list.body.items.map((r: { revision: number; status: string; current: boolean }) => [
        r.revision,
        r.status,
        r.current,
      ]),
    ).toEqual([
      [0, 'checked', false],
      [1, 'draft', true],
    ]);
    const old = await (await t.signIn('fabricator')).get(`/api/spools/${s.id}/revisions/0`);
    expect(old.status).toBe(200);
    expect(old.body).toMatchObject({
      revision: 0,
      status: 'checked',
      line: '2"-TS-0001-A1',
      current: false,
    });
    expect(old.body.document.line).toBe('2"-TS-0001-A1');
    await lead.get(`/api/spools/${s.id}/revisions/7`).expect(404);
    const ev = await lead.get(`/api/spools/${s.id}/events`);
    expect(ev.body.items.at(-1)).toMatchObject({ from: 'checked', to: 'draft', revision: 1 });
  });
});

describe('password reset by e-mail', () => {
  it('mails a reset link; the token sets a new password and ends the old sessions at once', async () => {
    const before = await t.signIn('fabricator');
    await before.get('/api/me').expect(200);
    const anon = t.anon();
    const req = await anon
      .post('/api/auth/request-password-reset')
      .send({ email: demoEmail('fabricator'), redirectTo: '/reset-password' });
    expect(req.status).toBe(200);
    // The link reaches the addressee's mailbox (the catcher's .eml files), not the outbox.
    const text = await t.readMail(demoEmail('fabricator'), { subject: /reset/i });
    const token = /\/reset-password\?token=([^\s&]+)/.exec(text)?.[1];
    expect(token).toBeTruthy();
    await anon
      .post('/api/auth/reset-password')
      .send({ token, newPassword: 'a-brand-new-password' })
      .expect(200);
    await anon
      .post('/api/auth/sign-in/email')
      .send({ email: demoEmail('fabricator'), password: 'a-brand-new-password' })
      .expect(200);
    await t
      .anon()
      .post('/api/auth/sign-in/email')
      .send({ email: demoEmail('fabricator'), password: 'spoolwright-demo' })
      .expect(401);
    // The session from before the reset is revoked: no read, no write.
    expect((await before.get('/api/me')).status).toBe(401);
    expect(
      (await before.post('/api/spools').send({ document: sampleDocument('After reset') })).status,
    ).toBe(401);
    t.forget('fabricator');
    // Put the demo password back for the tests that follow.
    const again = t.anon();
    const sentAfter = Date.now();
    await again
      .post('/api/auth/request-password-reset')
      .send({ email: demoEmail('fabricator') })
      .expect(200);
    const back = /\/reset-password\?token=([^\s&]+)/.exec(
      await t.readMail(demoEmail('fabricator'), { subject: /reset/i, after: sentAfter }),
    )?.[1];
    await again
      .post('/api/auth/reset-password')
      .send({ token: back, newPassword: DEMO_PASSWORD })
      .expect(200);
  });
});

describe('check, catalog and share links', () => {
  it('checks a posted document like the headless checker', async () => {
    const r = await (await t.signIn('fabricator')).post('/api/check').send(sampleDocument('Loose'));
    expect(r.status).toBe(200);
    expect(r.body).toMatchObject({
      units: 'imperial',
      summary: expect.any(Object),
      caution: expect.any(String),
    });
    expect(r.body.elements).toHaveLength(3);
    const bad = await (await t.signIn('fabricator')).post('/api/check').send({ units: 'cubits' });
    expect(bad.status).toBe(422);
    expect(bad.body.error.details.map((d: { path: string }) => d.path)).toContain('units');
  });

  it('serves materials and dimensions to signed-in members', async () => {
    const agent = await t.signIn('checker');
    const m = await agent.get('/api/materials');
    expect(m.body.items.map((x: { id: string }) => x.id)).toContain('A106-B');
    const d = await agent.get('/api/dimensions');
    const four = d.body.sizes.find((s: { nps: string }) => s.nps === '4');
    expect(four.walls.find((w: { schedule: string }) => w.schedule === '40')).toMatchObject({
      wallIn: 0.237,
    }); // ASME B36.10M: NPS 4 Sch 40 = 0.237 in (from memory)
  });

  it('shares one revision read-only until revoked', async () => {
    const s = await createSpool('Shared');
    const lead = await t.signIn('lead');
    const share = await lead.post(`/api/spools/${s.id}/shares`).send({ expiresInDays: 7 });
    expect(share.status).toBe(201);
    expect(share.body).toMatchObject({
      revision: 0,
      active: true,
      state: 'active',
      url: expect.stringContaining(`/share/${share.body.token}`),
    });
    const view = await t.anon().get(`/api/share/${share.body.token}`);
    expect(view.status).toBe(200);
    expect(view.body.spool).toMatchObject({ name: 'Shared', revision: 0 });
    expect(view.body.check.elements).toHaveLength(3);
    // Later edits of the draft do not leak into the link.
    await lead
      .put(`/api/spools/${s.id}`)
      .send({ document: sampleDocument('Shared', { line: 'changed' }), baseVersion: 1 })
      .expect(200);
    expect((await t.anon().get(`/api/share/${share.body.token}`)).body.spool.line).toBe(
      '2"-TS-0001-A1',
    );
    expect((await lead.get(`/api/spools/${s.id}/shares`)).body.items).toHaveLength(1);
    await lead.delete(`/api/spools/${s.id}/shares/${share.body.id}`).expect(204);
    expect((await t.anon().get(`/api/share/${share.body.token}`)).status).toBe(410);
    expect((await t.anon().get('/api/share/not-a-token')).status).toBe(404);
  });
});

describe('line-list import', () => {
  const good = [
    'Name,Line,Units,Pressure,Temperature,Material,Corrosion Allowance',
    'LL-01 Fuel gas knock-out,2"-FG-5001-A1,imperial,275,250,A106-B,0.0625',
    'LL-02 Fuel gas to heater,2"-FG-5002-A1,,275,250,A106-B,0.0625',
    '"LL-03 Condensate, return",1"-CR-5003-S1,metric,1.2,90,A312-TP316L,0',
  ].join('\n');

  it('creates one spool per row with its design conditions', async () => {
    const r = await (await t.signIn('designer'))
      .post('/api/spools/import')
      .set('content-type', 'text/csv')
      .send(good);
    expect(r.status).toBe(201);
    expect(r.body.created).toBe(3);
    expect(r.body.items[2]).toMatchObject({
      name: 'LL-03 Condensate, return',
      line: '1"-CR-5003-S1',
      status: 'draft',
    });
    expect(r.body.items[2].document).toMatchObject({
      units: 'metric',
      conditions: { pressure: 1.2, temperature: 90, material: 'A312-TP316L' },
      elements: [],
    });
  });

  it('reports bad rows by line number and writes nothing', async () => {
    const lead = await t.signIn('lead');
    const before = (await lead.get('/api/spools')).body.total;
    const csv = [
      'name,line,pressure,temperature,material',
      'OK row,L1,100,100,A106-B',
      'Bad pressure,L2,lots,100,A106-B',
      ',L3,100,,A106-B',
    ].join('\n');
    const r = await lead
      .post('/api/spools/import')
      .attach('file', Buffer.from(csv), 'line-list.csv');
    expect(r.status).toBe(422);
    const got = r.body.error.details.map(
      (d: { line: number; column: string }) => `${d.line}:${d.column}`,
    );
    expect(got).toEqual(expect.arrayContaining(['3:pressure', '4:name', '4:temperature']));
    expect(got.some((x: string) => x.startsWith('2:'))).toBe(false);
    expect((await lead.get('/api/spools')).body.total).toBe(before);
    const unknown = await lead
      .post('/api/spools/import')
      .set('content-type', 'text/csv')
      .send('name,pressure,temperature,colour\nA,1,2,red');
    expect(unknown.body.error.details[0]).toMatchObject({ line: 1, column: 'colour' });
  });
});

describe('team materials library', () => {
  // Invented team material; values chosen for the test, not from any table.
  const csv = [
    'id,spec,grade,name,category,tensile_ksi,yield_ksi,temp_f,stress_ksi',
    'KX-CS-70,Team spec KX-1,70,Team carbon steel 70,carbon,70,38,100,23.3',
    'KX-CS-70,,,,,,,400,23.3',
    'KX-CS-70,,,,,,,600,20.0',
  ].join('\n');

  it('lets an admin upload materials with a source note; checks then use them', async () => {
    const admin = await t.signIn('admin');
    const doc = sampleDocument('Team material', {
      conditions: { pressure: 150, temperature: 300, material: 'KX-CS-70' },
    });
    const before = await admin.post('/api/check').send(doc);
    expect(before.body.summary.invalid).toBe(3);
    const up = await admin
      .post('/api/materials/import')
      .field('source', 'Owner spec KX-1 rev B, table 4')
      .attach('file', Buffer.from(csv), 'materials.csv');
    expect(up.status).toBe(201);
    expect(up.body.job).toMatchObject({
      id: expect.any(Number),
      kind: 'recheck',
      status: expect.stringMatching(/queued|running|done/),
    });
    expect(up.body.items[0]).toMatchObject({
      id: 'KX-CS-70',
      tensilePsi: 70_000,
      stress: [{ tempF: 100, value: 23_300 }, { tempF: 400 }, { tempF: 600, value: 20_000 }],
    });
    const after = await admin.post('/api/check').send(doc);
    expect(after.body.summary.invalid).toBe(0);
    const list = await (await t.signIn('fabricator')).get('/api/materials');
    expect(list.body.items[0]).toMatchObject({
      id: 'KX-CS-70',
      origin: 'team',
      sourceNote: 'Owner spec KX-1 rev B, table 4',
    });
    expect(list.body.items.find((m: { id: string }) => m.id === 'A106-B')).toMatchObject({
      origin: 'library',
    });
    const saved = await admin.post('/api/spools').send({ document: doc });
    expect(saved.body.summary.invalid).toBe(0);
    const del = await admin.delete('/api/materials/KX-CS-70').expect(200);
    expect(del.body).toMatchObject({ deleted: 'KX-CS-70', job: { kind: 'recheck' } });
    // Stored summaries follow the library (a background job); the save counter does not move.
    await t.idle();
    const jobs = await admin.get('/api/admin/jobs');
    expect(jobs.body.items[0]).toMatchObject({
      kind: 'recheck',
      status: 'done',
      reason: 'material KX-CS-70 deleted',
      total: expect.any(Number),
      done: expect.any(Number),
    });
    expect(jobs.body.items[0].done).toBe(jobs.body.items[0].total);
    expect((await admin.get(`/api/admin/jobs/${up.body.job.id}`)).body).toMatchObject({
      status: 'done',
      changed: expect.any(Number),
    });
    const reread = await admin.get(`/api/spools/${saved.body.id}`);
    expect(reread.body).toMatchObject({ version: 1, summary: { invalid: 3 } });
    expect((await admin.post('/api/check').send(doc)).body.summary.invalid).toBe(3);
  });

  it('reports bad material rows by line and needs a source note', async () => {
    const admin = await t.signIn('admin');
    const noSource = await admin
      .post('/api/materials/import')
      .set('content-type', 'text/csv')
      .send(csv);
    expect(noSource.status).toBe(422);
    expect(noSource.body.error.details[0].path).toBe('source');
    const bad = csv.replace('400,23.3', '400,lots');
    const r = await admin
      .post('/api/materials/import')
      .query({ source: 'test table' })
      .set('content-type', 'text/csv')
      .send(bad);
    expect(r.status).toBe(422);
    expect(r.body.error.details[0]).toMatchObject({ line: 3 });
    expect((await admin.get('/api/materials')).body.items[0].origin).toBe('library');
  });
});

describe('review comments', () => {
  it('pins comments to elements of a revision and resolves them', async () => {
    const s = await createSpool('Commented');
    const fabricator = await t.signIn('fabricator');
    const c = await fabricator
      .post(`/api/spools/${s.id}/comments`)
      .send({ body: 'Can B1 be shop-bent?', elementId: 'B1' });
    expect(c.status).toBe(201);
    expect(c.body).toMatchObject({
      revision: 0,
      elementId: 'B1',
      body: 'Can B1 be shop-bent?',
      user: { name: expect.any(String) },
      resolvedAt: null,
    });
    const bad = await fabricator
      .post(`/api/spools/${s.id}/comments`)
      .send({ body: 'x', elementId: 'NOPE' });
    expect(bad.status).toBe(422);
    expect(bad.body.error.details[0].path).toBe('elementId');
    const done = await (await t.signIn('designer'))
      .patch(`/api/spools/${s.id}/comments/${c.body.id}`)
      .send({ resolved: true });
    expect(done.body).toMatchObject({
      resolvedAt: expect.any(String),
      resolvedBy: { name: expect.any(String) },
    });
    const list = await (await t.signIn('checker')).get(`/api/spools/${s.id}/comments`);
    expect(list.body.items).toHaveLength(1);
  });

  it('seeds a checker comment on the submitted demo spool', async () => {
    const lead = await t.signIn('lead');
    const list = await lead.get('/api/spools').query({ status: 'submitted', search: 'SV-204' });
    const comments = await lead.get(`/api/spools/${list.body.items[0].id}/comments`);
    expect(comments.body.items[0]).toMatchObject({ elementId: 'SV-B1' });
  });
});

describe('team members', () => {
  it('lets admins add a member who can then sign in, and keeps one admin', async () => {
    const admin = await t.signIn('admin');
    const add = await admin.post('/api/team/members').send({
      email: 'new.checker@spoolwright.test',
      name: 'Noor Halvorsen',
      role: 'checker',
      password: 'checker-password-1',
    });
    expect(add.status).toBe(201);
    const agent = t.anon();
    await agent
      .post('/api/auth/sign-in/email')
      .send({ email: 'new.checker@spoolwright.test', password: 'checker-password-1' })
      .expect(200);
    expect((await agent.get('/api/me')).body.role).toBe('checker');
    await admin.patch(`/api/team/members/${add.body.userId}`).send({ role: 'lead' }).expect(200);
    // The new role applies to the member's next request.
    expect((await agent.get('/api/me')).body.role).toBe('lead');
    const me = (await admin.get('/api/me')).body;
    const last = await admin.patch(`/api/team/members/${me.user.id}`).send({ role: 'designer' });
    expect(last.status).toBe(409);
    const list = await (await t.signIn('fabricator')).get('/api/team/members');
    expect(list.body.items.length).toBeGreaterThanOrEqual(6);
  });
});
