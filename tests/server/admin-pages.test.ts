import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from './helpers';
import { session, teamInvitations } from '../../server/db/schema';
import { hashToken } from '../../server/auth/invitations';
import { eq } from 'drizzle-orm';

let t: TestApp;
let dataDir: string;

beforeAll(async () => {
  dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'spoolwright-admin-test-'));
  t = await createTestApp({ dataDir });
});
afterAll(async () => {
  await t?.close();
  fs.rmSync(dataDir, { recursive: true, force: true });
});

/** The newest mail to `to` with a one-use link, from the addressee's mailbox (the catcher's .eml files). */
async function latestMailText(to: string, link: RegExp): Promise<string> {
  const text = await t.readMail(to, { timeoutMs: 10_000 });
  if (!link.test(text)) throw new Error(`the newest mail to ${to} has no ${link}`);
  return text;
}

const inviteToken = (text: string) => /accept-invite\?token=([A-Za-z0-9_-]+)/.exec(text)?.[1] ?? '';

describe('invitations', () => {
  it('mails a one-use, expiring link; the person sets a password and signs in with the role', async () => {
    const admin = await t.signIn('admin');
    const sent = await admin
      .post('/api/team/invitations')
      .send({ name: 'Ilse Varga', email: 'Ilse.Varga@spoolwright.test', role: 'checker' });
    expect(sent.status).toBe(201);
    expect(sent.body).toMatchObject({
      email: 'ilse.varga@spoolwright.test',
      role: 'checker',
      state: 'pending',
    });
    expect(JSON.stringify(sent.body)).not.toMatch(/token/i);
    const days = (Date.parse(sent.body.expiresAt) - Date.parse(sent.body.createdAt)) / 86_400_000;
    expect(days).toBe(7);

    const text = await latestMailText('ilse.varga@spoolwright.test', /accept-invite\?token=/);
    expect(text).toContain(`${t.config.publicUrl}/accept-invite?token=`);
    const token = inviteToken(text);
    expect(token.length).toBeGreaterThanOrEqual(40);
    // Only the hash is stored.
    const [row] = await t.database.db
      .select()
      .from(teamInvitations)
      .where(eq(teamInvitations.id, sent.body.id));
    expect(row!.tokenHash).toBe(hashToken(token));
    expect(row!.tokenHash).not.toContain(token);

    const anon = t.anon();
    const look = await anon.post('/api/invitations/lookup').send({ token });
    expect(look.status).toBe(200);
    expect(look.body).toMatchObject({
      email: 'ilse.varga@spoolwright.test',
      name: 'Ilse Varga',
      role: 'checker',
      team: { name: expect.any(String) },
    });

    const short = await anon.post('/api/invitations/accept').send({ token, password: 'short' });
    expect(short.status).toBe(422);
    expect(short.body.error.details[0].path).toBe('password');

    await anon
      .post('/api/invitations/accept')
      .send({ token, password: 'ilse-chosen-password' })
      .expect(201);
    await anon
      .post('/api/auth/sign-in/email')
      .send({ email: 'ilse.varga@spoolwright.test', password: 'ilse-chosen-password' })
      .expect(200);
    expect((await anon.get('/api/me')).body.role).toBe('checker');

    // One use.
    const again = await t
      .anon()
      .post('/api/invitations/accept')
      .send({ token, password: 'another-password-1' });
    expect(again.status).toBe(410);
    expect(again.body.error.message).toMatch(/already been used/);
    const list = await admin.get('/api/team/invitations');
    expect(list.body.items.find((i: { id: string }) => i.id === sent.body.id).state).toBe(
      'accepted',
    );
    // A member cannot be invited again.
    const dup = await admin
      .post('/api/team/invitations')
      .send({ name: 'Ilse', email: 'ilse.varga@spoolwright.test', role: 'designer' });
    expect(dup.status).toBe(409);
    expect(dup.body.error.details[0].path).toBe('email');
  });

  it('lets a removed member be invited back with a new password; their old sessions end', async () => {
    const admin = await t.signIn('admin');
    await admin
      .post('/api/team/invitations')
      .send({ name: 'Rune Falk', email: 'rune.falk@spoolwright.test', role: 'fabricator' })
      .expect(201);
    const first = inviteToken(
      await latestMailText('rune.falk@spoolwright.test', /accept-invite\?token=/),
    );
    await t
      .anon()
      .post('/api/invitations/accept')
      .send({ token: first, password: 'rune-first-password' })
      .expect(201);
    const old = t.anon();
    await old
      .post('/api/auth/sign-in/email')
      .send({ email: 'rune.falk@spoolwright.test', password: 'rune-first-password' })
      .expect(200);
    const id = (await old.get('/api/me')).body.user.id as string;
    await admin.delete(`/api/team/members/${id}`).expect(204);

    await admin
      .post('/api/team/invitations')
      .send({ name: 'Rune Falk', email: 'rune.falk@spoolwright.test', role: 'lead' })
      .expect(201);
    const second = inviteToken(
      await latestMailText('rune.falk@spoolwright.test', /accept-invite\?token=(?!\S*${first})/),
    );
    expect(second).not.toBe(first);
    await t
      .anon()
      .post('/api/invitations/accept')
      .send({ token: second, password: 'rune-second-password' })
      .expect(201);
    // Sessions are deleted (a signed cookie cache may carry one for up to five minutes).
    expect(await t.database.db.select().from(session).where(eq(session.userId, id))).toEqual([]);
    await t
      .anon()
      .post('/api/auth/sign-in/email')
      .send({ email: 'rune.falk@spoolwright.test', password: 'rune-first-password' })
      .expect(401);
    const back = t.anon();
    await back
      .post('/api/auth/sign-in/email')
      .send({ email: 'rune.falk@spoolwright.test', password: 'rune-second-password' })
      .expect(200);
    expect((await back.get('/api/me')).body).toMatchObject({ user: { id }, role: 'lead' });
  });

  it('refuses expired, withdrawn and unknown links, and names bad fields', async () => {
    const admin = await t.signIn('admin');
    const bad = await admin
      .post('/api/team/invitations')
      .send({ name: '', email: 'not-an-address', role: 'boss' });
    expect(bad.status).toBe(422);
    expect(bad.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual([
      'email',
      'name',
      'role',
    ]);

    const first = await admin
      .post('/api/team/invitations')
      .send({ name: 'Oskar Lind', email: 'oskar.lind@spoolwright.test', role: 'designer' });
    const firstToken = inviteToken(
      await latestMailText('oskar.lind@spoolwright.test', /accept-invite\?token=/),
    );
    // Sending again withdraws the first link.
    await admin
      .post('/api/team/invitations')
      .send({ name: 'Oskar Lind', email: 'oskar.lind@spoolwright.test', role: 'designer' })
      .expect(201);
    const withdrawn = await t.anon().post('/api/invitations/lookup').send({ token: firstToken });
    expect(withdrawn.status).toBe(410);
    expect(withdrawn.body.error.details.state).toBe('revoked');
    expect(
      (await admin.get('/api/team/invitations')).body.items.find(
        (i: { id: string }) => i.id === first.body.id,
      ).state,
    ).toBe('revoked');

    const second = (await admin.get('/api/team/invitations')).body.items.find(
      (i: { email: string; state: string }) =>
        i.email === 'oskar.lind@spoolwright.test' && i.state === 'pending',
    );
    const secondToken = inviteToken(
      await latestMailText('oskar.lind@spoolwright.test', /accept-invite\?token=/),
    );
    await t.database.db
      .update(teamInvitations)
      .set({ expiresAt: new Date(Date.now() - 1000) })
      .where(eq(teamInvitations.id, second.id));
    const expired = await t
      .anon()
      .post('/api/invitations/accept')
      .send({ token: secondToken, password: 'oskar-password-1' });
    expect(expired.status).toBe(410);
    expect(expired.body.error.message).toMatch(/expired/);

    const unknown = await t
      .anon()
      .post('/api/invitations/lookup')
      .send({ token: 'x'.repeat(43) });
    expect(unknown.status).toBe(404);

    const third = await admin
      .post('/api/team/invitations')
      .send({ name: 'Oskar Lind', email: 'oskar.lind@spoolwright.test', role: 'designer' });
    await admin.delete(`/api/team/invitations/${third.body.id}`).expect(200);
    const twice = await admin.delete(`/api/team/invitations/${third.body.id}`);
    expect(twice.status).toBe(409);
  });
});

describe('last admin', () => {
  it('cannot be demoted or removed, and the answer says why', async () => {
    const admin = await t.signIn('admin');
    const me = (await admin.get('/api/me')).body;
    const demote = await admin.patch(`/api/team/members/${me.user.id}`).send({ role: 'lead' });
    expect(demote.status).toBe(409);
    expect(demote.body.error.message).toMatch(/at least one admin/);
    const remove = await admin.delete(`/api/team/members/${me.user.id}`);
    expect(remove.status).toBe(409);
    expect(remove.body.error.message).toMatch(/only admin/);
  });
});

describe('team material form and CSV preview', () => {
  const form = {
    id: 'KX-FORM-1',
    spec: 'Owner spec KX',
    grade: 'F1',
    category: 'carbon',
    productForms: ['seamless'],
    tensileKsi: 60,
    yieldKsi: 35,
    // Invented values for the test, not from any table.
    points: [
      { tempF: 400, stressKsi: 19.5 },
      { tempF: 100, stressKsi: 20 },
    ],
    sourceNote: 'Owner spec KX rev C, table 2',
    fromMemory: true,
  };

  it('adds one material from the form, flagged from memory, and says how many spools were re-checked', async () => {
    const admin = await t.signIn('admin');
    const r = await admin.post('/api/materials').send(form);
    expect(r.status).toBe(201);
    // The re-check of the team's spools runs as a background job; the answer names it.
    expect(r.body.recheckJob).toEqual({ id: String(r.body.job.id) });
    await t.idle();
    const job = await admin.get(`/api/admin/jobs/${r.body.job.id}`);
    expect(job.body).toMatchObject({ status: 'done' });
    expect(job.body.done).toBeGreaterThan(0);
    expect(r.body.item).toMatchObject({
      id: 'KX-FORM-1',
      origin: 'team',
      sourceNote: 'Owner spec KX rev C, table 2',
      tensilePsi: 60000,
    });
    expect(r.body.item.stress).toEqual([
      { tempF: 100, value: 20000, fromMemory: true },
      { tempF: 400, value: 19500, fromMemory: true },
    ]);
    const list = await admin.get('/api/materials');
    expect(list.body.items.find((m: { id: string }) => m.id === 'KX-FORM-1')).toMatchObject({
      origin: 'team',
    });
    expect((await admin.post('/api/materials').send(form)).status).toBe(409);
    const del = await admin.delete('/api/materials/KX-FORM-1');
    expect(del.status).toBe(200);
    expect(del.body).toMatchObject({ deleted: 'KX-FORM-1', job: { kind: 'recheck' } });
    await t.idle();
  });

  it('names each bad form field, the source note included', async () => {
    const admin = await t.signIn('admin');
    const r = await admin.post('/api/materials').send({
      ...form,
      id: 'bad id!',
      sourceNote: '',
      yieldKsi: 70,
      points: [
        { tempF: 100, stressKsi: -1 },
        { tempF: 100, stressKsi: 20 },
      ],
    });
    expect(r.status).toBe(422);
    const paths = r.body.error.details.map((d: { path: string }) => d.path);
    expect(paths).toEqual(expect.arrayContaining(['id', 'sourceNote', 'points[0].stressKsi']));
  });

  it('previews a materials CSV by line and column and writes nothing', async () => {
    const admin = await t.signIn('admin');
    const csv =
      'id,spec,grade,tensile_ksi,yield_ksi,temp_f,stress_ksi,from_memory\nKX-CSV-1,Spec,1,60,35,100,20,yes\nKX-CSV-1,Spec,1,60,35,200,abc,yes\nKX-CSV-2,Spec,2,60,35,100,20,maybe\n';
    const r = await admin
      .post('/api/materials/import/preview?source=Owner%20spec%20KX')
      .set('content-type', 'text/csv')
      .send(csv);
    expect(r.status).toBe(200);
    expect(r.body.ok).toBe(false);
    expect(r.body.issues).toEqual(
      expect.arrayContaining([
        expect.objectContaining({ line: 3, column: 'stress_ksi' }),
        expect.objectContaining({ line: 4, column: 'from_memory' }),
      ]),
    );
    const list = await admin.get('/api/materials');
    expect(list.body.items.some((m: { id: string }) => m.id.startsWith('KX-CSV'))).toBe(false);

    const good = await admin
      .post('/api/materials/import/preview')
      .field('source', 'Owner spec KX')
      .attach(
        'file',
        Buffer.from(
          'id,spec,grade,tensile_ksi,yield_ksi,temp_f,stress_ksi\nA106-B,ASTM A106,B,60,35,100,20\n',
        ),
        'm.csv',
      );
    expect(good.body).toMatchObject({
      ok: true,
      issues: [],
      items: [{ id: 'A106-B', rows: 1, replaces: 'library', fromMemory: false }],
    });
    const noSource = await admin
      .post('/api/materials/import/preview')
      .set('content-type', 'text/csv')
      .send('id,spec,grade,tensile_ksi,yield_ksi,temp_f,stress_ksi\nX,S,1,60,35,100,20\n');
    expect(noSource.body.issues[0]).toMatchObject({ path: 'source' });
  });
});

describe('line-list preview', () => {
  it('shows the spools it would create and every bad cell by line and column; writes nothing', async () => {
    const designer = await t.signIn('designer');
    const before = (await designer.get('/api/spools?pageSize=1')).body.total;
    const csv =
      'name,line,pressure,temperature,material\nLL-1,2"-P-1,150,100,A106-B\nLL-2,2"-P-2,abc,100,A106-B\n,2"-P-3,150,100,A106-B\n';
    const r = await designer
      .post('/api/spools/import/preview')
      .set('content-type', 'text/csv')
      .send(csv);
    expect(r.status).toBe(200);
    expect(r.body.ok).toBe(false);
    expect(r.body.items).toEqual([
      expect.objectContaining({
        line: 2,
        name: 'LL-1',
        pipeLine: '2"-P-1',
        conditions: expect.objectContaining({ pressure: 150 }),
      }),
    ]);
    expect(r.body.issues).toEqual(
      expect.arrayContaining([
        expect.objectContaining({ line: 3, column: 'pressure' }),
        expect.objectContaining({ line: 4, column: 'name' }),
      ]),
    );
    expect((await designer.get('/api/spools?pageSize=1')).body.total).toBe(before);
    const ok = await designer
      .post('/api/spools/import/preview')
      .set('content-type', 'text/csv')
      .send('name,pressure,temperature\nLL-9,150,100\n');
    expect(ok.body).toMatchObject({ ok: true, issues: [], items: [{ line: 2, name: 'LL-9' }] });
  });
});
