import fs from 'node:fs';
import net from 'node:net';
import nodemailer from 'nodemailer';
import os from 'node:os';
import path from 'node:path';
import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import request from 'supertest';
import { createTestApp, DEMO_PASSWORD, demoEmail, sampleDocument, type TestApp } from './helpers';
import { outbox, shareLinks, teamMembers, teams } from '../../server/db/schema';
import { createUserWithPassword } from '../../server/db/seed';
import { RESET_ANSWER_MS } from '../../server/auth/sign-in-limits';
import { createMailer } from '../../server/mail/mailer';
import { silentLogger } from '../../server/logger';
import { createApp } from '../../server/app';
import { createAuth } from '../../server/auth/auth';
import { readMail } from '../e2e/harness';

const RESET_LINK = /\/reset-password\?token=([^\s&]+)/;

let t: TestApp;
/** An admin of a second team, signed in. */
let otherAdmin: request.Agent;

beforeAll(async () => {
  t = await createTestApp();
  await t.database.db.insert(teams).values({ id: 'team-second', name: 'Second Team' });
  const id = await createUserWithPassword(t.database.db, {
    email: 'second.admin@spoolwright.test',
    name: 'Sec Ond',
    password: 'second-admin-password',
  });
  await t.database.db
    .insert(teamMembers)
    .values({ teamId: 'team-second', userId: id, role: 'admin' });
  otherAdmin = t.anon();
  await otherAdmin
    .post('/api/auth/sign-in/email')
    .send({ email: 'second.admin@spoolwright.test', password: 'second-admin-password' })
    .expect(200);
});
afterAll(async () => {
  await t?.close();
});

async function createSpool(name: string, doc: Record<string, unknown> = sampleDocument(name)) {
  const r = await (await t.signIn('lead')).post('/api/spools').send({ document: doc });
  expect(r.status).toBe(201);
  return r.body as { id: string };
}

/** Reset the password of `email` through the mailed link (read from the addressee's mailbox). */
async function resetPassword(email: string, newPassword: string) {
  const sentAfter = Date.now();
  await t.anon().post('/api/auth/request-password-reset').send({ email }).expect(200);
  const text = await t.readMail(email, { subject: /reset/i, after: sentAfter });
  const token = RESET_LINK.exec(text)?.[1];
  expect(token).toBeTruthy();
  await t.anon().post('/api/auth/reset-password').send({ token, newPassword }).expect(200);
  return token!;
}

describe('mail: the development catcher and the outbox', () => {
  it('delivers over SMTP into DATA_DIR/mail as .eml files with the whole link', async () => {
    const sentAfter = Date.now();
    await t
      .anon()
      .post('/api/auth/request-password-reset')
      .send({ email: demoEmail('lead') })
      .expect(200);
    const text = await t.readMail(demoEmail('lead'), { subject: /reset/i, after: sentAfter });
    expect(text).toContain(`${t.config.publicUrl}/reset-password?token=`);
    const files = fs
      .readdirSync(path.join(t.config.dataDir, 'mail'))
      .filter((f) => f.endsWith('.eml'));
    expect(files.length).toBeGreaterThan(0);
    const raw = fs.readFileSync(path.join(t.config.dataDir, 'mail', files.sort().at(-1)!), 'utf8');
    expect(raw).toMatch(/^Subject: Reset your Spoolwright password$/m);
    expect(raw).toMatch(/^To: lead@spoolwright\.test$/m);
  });

  it('shows an admin only mail to their own team', async () => {
    const s = await createSpool('Outbox scope');
    await (await t.signIn('lead'))
      .post(`/api/spools/${s.id}/transitions`)
      .send({ to: 'submitted' })
      .expect(200);
    await t
      .anon()
      .post('/api/auth/request-password-reset')
      .send({ email: demoEmail('checker') })
      .expect(200);
    await t.readMail(demoEmail('checker'), { subject: /reset/i });
    const own = await (await t.signIn('admin')).get('/api/admin/outbox');
    expect(own.status).toBe(200);
    expect(
      own.body.items.some((m: { subject: string }) => m.subject === 'Spool Outbox scope submitted'),
    ).toBe(true);
    expect(
      own.body.items.some(
        (m: { to: string; subject: string }) =>
          m.to === demoEmail('checker') && /reset/i.test(m.subject),
      ),
    ).toBe(true);
    const other = await otherAdmin.get('/api/admin/outbox');
    expect(other.status).toBe(200);
    expect(other.body.items).toEqual([]);
    expect(JSON.stringify(other.body)).not.toContain('@spoolwright.test');
  });

  it('files mail to the second team under that team alone', async () => {
    const sentAfter = Date.now();
    await t
      .anon()
      .post('/api/auth/request-password-reset')
      .send({ email: 'second.admin@spoolwright.test' })
      .expect(200);
    await t.readMail('second.admin@spoolwright.test', { after: sentAfter });
    const other = await otherAdmin.get('/api/admin/outbox');
    expect(other.body.items.map((m: { to: string }) => m.to)).toEqual([
      'second.admin@spoolwright.test',
    ]);
    const own = await (await t.signIn('admin')).get('/api/admin/outbox?limit=500');
    expect(own.body.items.some((m: { to: string }) => m.to.includes('second.admin'))).toBe(false);
  });

  it('never shows a one-use token in any outbox answer', async () => {
    const sentAfter = Date.now();
    await t
      .anon()
      .post('/api/auth/request-password-reset')
      .send({ email: demoEmail('designer') })
      .expect(200);
    const token = RESET_LINK.exec(
      await t.readMail(demoEmail('designer'), { subject: /reset/i, after: sentAfter }),
    )?.[1];
    expect(token).toBeTruthy();
    for (const agent of [await t.signIn('admin'), otherAdmin]) {
      const body = JSON.stringify((await agent.get('/api/admin/outbox?limit=500')).body);
      expect(body).not.toContain(token);
      expect(body).not.toMatch(/token=(?!\[redacted\])/);
    }
    const mine = (
      await (await t.signIn('admin')).get('/api/admin/outbox?limit=500')
    ).body.items.find(
      (m: { to: string; subject: string }) =>
        m.to === demoEmail('designer') && /reset/i.test(m.subject),
    );
    expect(mine.text).toContain('/reset-password?token=[redacted]');
    // The stored row has no copy of the token either.
    const rows = await t.database.db.select().from(outbox);
    expect(rows.length).toBeGreaterThan(0);
    expect(JSON.stringify(rows)).not.toContain(token);
    // The token still works for its addressee.
    await t
      .anon()
      .post('/api/auth/reset-password')
      .send({ token, newPassword: DEMO_PASSWORD })
      .expect(200);
    t.forget('designer');
  });

  it('has no outbox when mail goes to an SMTP server (404)', async () => {
    const prod = await createTestApp({ smtpUrl: 'smtp://127.0.0.1:9' });
    try {
      expect(prod.mailer.kind).toBe('smtp');
      const r = await (await prod.signIn('admin')).get('/api/admin/outbox');
      expect(r.status).toBe(404);
      expect(r.body.error.code).toBe('not_found');
    } finally {
      await prod.close();
    }
  });
});

describe('sessions end at once', () => {
  it('refuses a signed-out cookie, even a copy kept elsewhere, for reads and writes', async () => {
    const agent = t.anon();
    const login = await agent
      .post('/api/auth/sign-in/email')
      .send({ email: demoEmail('checker'), password: DEMO_PASSWORD });
    expect(login.status).toBe(200);
    const cookie = login.headers['set-cookie'] as unknown as string[];
    const copy = cookie.map((c) => c.split(';')[0]).join('; ');
    await agent.get('/api/me').expect(200);
    await request(t.app).get('/api/me').set('cookie', copy).expect(200);
    await agent.post('/api/auth/sign-out').send({}).expect(200);
    expect((await agent.get('/api/me')).status).toBe(401);
    expect((await request(t.app).get('/api/me').set('cookie', copy)).status).toBe(401);
    expect(
      (
        await request(t.app)
          .post('/api/spools')
          .set('cookie', copy)
          .send({ document: sampleDocument('After sign-out') })
      ).status,
    ).toBe(401);
  });

  it('revokes every session of the user on a password reset', async () => {
    const a = t.anon();
    const b = t.anon();
    for (const x of [a, b])
      await x
        .post('/api/auth/sign-in/email')
        .send({ email: demoEmail('checker'), password: DEMO_PASSWORD })
        .expect(200);
    await a.get('/api/me').expect(200);
    await b.get('/api/spools').expect(200);
    await resetPassword(demoEmail('checker'), 'checker-new-password');
    expect((await a.get('/api/me')).status).toBe(401);
    expect(
      (await b.post('/api/spools').send({ document: sampleDocument('After reset') })).status,
    ).toBe(401);
    await resetPassword(demoEmail('checker'), DEMO_PASSWORD);
    t.forget('checker');
  });
});

describe('password reset requests', () => {
  it('answer the same, in about the same time, for known and unknown addresses', async () => {
    const known: number[] = [];
    const unknown: number[] = [];
    let knownBody: unknown;
    let unknownBody: unknown;
    for (let i = 0; i < 4; i++) {
      for (const [email, times] of [
        [demoEmail('fabricator'), known],
        [`nobody-${i}@spoolwright.test`, unknown],
      ] as const) {
        const t0 = performance.now();
        const r = await t.anon().post('/api/auth/request-password-reset').send({ email });
        times.push(performance.now() - t0);
        expect(r.status).toBe(200);
        if (email.startsWith('nobody')) unknownBody = r.body;
        else knownBody = r.body;
      }
    }
    expect(unknownBody).toEqual(knownBody);
    const median = (xs: number[]) => [...xs].sort((x, y) => x - y)[Math.floor(xs.length / 2)]!;
    // Every answer waits for the same constant path; the mail goes out in the background.
    expect(Math.min(...known, ...unknown)).toBeGreaterThanOrEqual(RESET_ANSWER_MS - 5);
    expect(Math.abs(median(known) - median(unknown))).toBeLessThan(60);
  });
});

describe('share links', () => {
  it('stores only a hash of the token and shows the token once, at creation', async () => {
    const s = await createSpool('Hashed link');
    const lead = await t.signIn('lead');
    const made = await lead.post(`/api/spools/${s.id}/shares`).send({});
    expect(made.status).toBe(201);
    const token = made.body.token as string;
    expect(token.length).toBeGreaterThanOrEqual(32);
    expect(made.body.url).toBe(`${t.config.publicUrl}/share/${token}`);
    const [row] = await t.database.db
      .select()
      .from(shareLinks)
      .where(eq(shareLinks.id, made.body.id));
    expect(row!.tokenHash).toBe(createHash('sha256').update(token).digest('hex'));
    expect(JSON.stringify(row)).not.toContain(token);
    const list = await lead.get(`/api/spools/${s.id}/shares`);
    expect(list.body.items).toHaveLength(1);
    expect(list.body.items[0]).toMatchObject({
      id: made.body.id,
      state: 'active',
      revision: 0,
      createdBy: { name: expect.any(String) },
      expiresAt: expect.any(String),
    });
    expect(JSON.stringify(list.body)).not.toContain(token);
    expect(list.body.items[0].token).toBeUndefined();
    expect(list.body.items[0].url).toBeUndefined();
    expect((await t.anon().get(`/api/share/${token}`)).status).toBe(200);
    // The row id is not a way in.
    expect((await t.anon().get(`/api/share/${made.body.id}`)).status).toBe(404);
    expect((await t.anon().get(`/api/share/${row!.tokenHash}`)).status).toBe(404);
  });

  it('stop working when their spool is deleted', async () => {
    const s = await createSpool('Deleted with links');
    const lead = await t.signIn('lead');
    const tokens = [
      (await lead.post(`/api/spools/${s.id}/shares`).send({})).body.token,
      (await lead.post(`/api/spools/${s.id}/shares`).send({})).body.token,
    ];
    for (const tok of tokens) expect((await t.anon().get(`/api/share/${tok}`)).status).toBe(200);
    await lead.delete(`/api/spools/${s.id}`).expect(204);
    for (const tok of tokens) {
      const r = await t.anon().get(`/api/share/${tok}`);
      expect(r.status).toBe(410);
      expect(r.body.error.code).toBe('gone');
    }
    const rows = await t.database.db.select().from(shareLinks).where(eq(shareLinks.spoolId, s.id));
    expect(rows.every((r) => r.revokedAt !== null)).toBe(true);
  });

  it('show the check without the team material source notes', async () => {
    const admin = await t.signIn('admin');
    // Invented team material; values chosen for the test, not from any table.
    const csv = [
      'id,spec,grade,tensile_ksi,yield_ksi,temp_f,stress_ksi',
      'QZ-9,Team spec QZ,9,70,38,100,23.3',
      'QZ-9,,,,,600,20.0',
    ].join('\n');
    const note = 'Owner internal spec QZ-9 rev C, table 7 (confidential)';
    await admin
      .post('/api/materials/import')
      .field('source', note)
      .attach('file', Buffer.from(csv), 'materials.csv')
      .expect(201);
    const s = await createSpool(
      'Team material share',
      sampleDocument('Team material share', {
        conditions: { pressure: 150, temperature: 300, material: 'QZ-9' },
      }),
    );
    const own = await admin
      .post('/api/check')
      .send(
        sampleDocument('x', { conditions: { pressure: 150, temperature: 300, material: 'QZ-9' } }),
      );
    expect(JSON.stringify(own.body)).toContain('rev C, table 7');
    const token = (await (await t.signIn('lead')).post(`/api/spools/${s.id}/shares`).send({})).body
      .token;
    const view = await t.anon().get(`/api/share/${token}`);
    expect(view.status).toBe(200);
    expect(view.body.check.summary.invalid).toBe(0);
    expect(view.body.check.elements).toHaveLength(3);
    const text = JSON.stringify(view.body);
    expect(text).not.toContain('rev C, table 7');
    expect(text).not.toContain('confidential');
    await admin.delete('/api/materials/QZ-9').expect(200);
  });
});

describe('team members', () => {
  it('can add a removed member again, who then signs in with the new password', async () => {
    const admin = await t.signIn('admin');
    const add = await admin.post('/api/team/members').send({
      email: 'returning@spoolwright.test',
      name: 'Ren Turner',
      role: 'designer',
      password: 'first-password-1',
    });
    expect(add.status).toBe(201);
    const member = t.anon();
    await member
      .post('/api/auth/sign-in/email')
      .send({ email: 'returning@spoolwright.test', password: 'first-password-1' })
      .expect(200);
    await member.get('/api/spools').expect(200);
    await admin.delete(`/api/team/members/${add.body.userId}`).expect(204);
    // Removal signs the member out at once.
    expect((await member.get('/api/spools')).status).toBe(401);
    const again = await admin.post('/api/team/members').send({
      email: 'Returning@spoolwright.test',
      name: 'Ren Turner-Ash',
      role: 'checker',
      password: 'second-password-2',
    });
    expect(again.status).toBe(201);
    expect(again.body).toMatchObject({
      userId: add.body.userId,
      role: 'checker',
      name: 'Ren Turner-Ash',
    });
    await t
      .anon()
      .post('/api/auth/sign-in/email')
      .send({ email: 'returning@spoolwright.test', password: 'first-password-1' })
      .expect(401);
    const back = t.anon();
    await back
      .post('/api/auth/sign-in/email')
      .send({ email: 'returning@spoolwright.test', password: 'second-password-2' })
      .expect(200);
    expect((await back.get('/api/me')).body).toMatchObject({
      role: 'checker',
      team: { id: 'team-larkspur' },
    });
    // A member of another team is still refused.
    const taken = await admin.post('/api/team/members').send({
      email: 'second.admin@spoolwright.test',
      name: 'X',
      role: 'designer',
      password: 'whatever-password',
    });
    expect(taken.status).toBe(409);
  });
});

describe('CSV uploads', () => {
  it('refuse a file that is not UTF-8, naming it', async () => {
    const designer = await t.signIn('designer');
    const latin1 = Buffer.from('name,pressure,temperature\nDégazeur D-1,100,100\n', 'latin1');
    const r = await designer.post('/api/spools/import').attach('file', latin1, 'ligne-export.csv');
    expect(r.status).toBe(422);
    expect(r.body.error.message).toMatch(/ligne-export\.csv is not UTF-8.*line 2/);
    expect(r.body.error.details[0].path).toBe('file');
    const utf16 = Buffer.concat([
      Buffer.from([0xff, 0xfe]),
      Buffer.from('name,pressure,temperature\nA,1,2\n', 'utf16le'),
    ]);
    const u = await (await t.signIn('admin'))
      .post('/api/materials/import')
      .field('source', 'x')
      .attach('file', utf16, 'materials-utf16.csv');
    expect(u.status).toBe(422);
    expect(u.body.error.message).toMatch(/materials-utf16\.csv is UTF-16/);
    const bom = Buffer.concat([
      Buffer.from([0xef, 0xbb, 0xbf]),
      Buffer.from('name,pressure,temperature\nBOM spool,100,100\n'),
    ]);
    expect((await designer.post('/api/spools/import').attach('file', bom, 'bom.csv')).status).toBe(
      201,
    );
  });
});

describe('Content-Security-Policy', () => {
  it('is sent on API answers and on the app shell', async () => {
    const dist = fs.mkdtempSync(path.join(os.tmpdir(), 'spoolwright-dist-'));
    fs.writeFileSync(path.join(dist, 'index.html'), '<!doctype html><title>x</title>');
    const auth = createAuth({
      db: t.database.db,
      config: t.config,
      mailer: t.mailer,
      logger: silentLogger,
    });
    const withClient = createApp({
      db: t.database.db,
      auth,
      mailer: t.mailer,
      config: t.config,
      logger: silentLogger,
      staticDir: dist,
    });
    try {
      for (const r of [
        await request(t.app).get('/api/health'),
        await request(withClient).get('/spools').set('accept', 'text/html'),
      ]) {
        expect(r.status).toBe(200);
        const csp = String(r.headers['content-security-policy']);
        const directives = new Map(
          csp
            .split(';')
            .map((d) => d.trim().split(/\s+/))
            .map(([k, ...v]) => [k!, v]),
        );
        expect(directives.get('default-src')).toEqual(["'self'"]);
        expect(directives.get('script-src')).toEqual(["'self'"]);
        expect(directives.get('object-src')).toEqual(["'none'"]);
        expect(directives.get('frame-ancestors')).toEqual(["'none'"]);
        expect(directives.get('font-src')).toContain("'self'");
        expect(directives.get('worker-src')).toContain("'self'");
        expect(directives.get('connect-src')).toEqual(["'self'"]);
        expect(csp).not.toContain('unsafe-eval');
      }
    } finally {
      fs.rmSync(dist, { recursive: true, force: true });
    }
  });
});

describe('the mailer', () => {
  it('accepts mail only with its credentials and stops the catcher on close', async () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'spoolwright-mailer-'));
    const mailer = await createMailer({
      db: t.database.db,
      from: 'Spoolwright <no-reply@spoolwright.test>',
      logger: silentLogger,
      mailDir: path.join(dir, 'mail'),
    });
    try {
      const { host, port } = mailer.catcherAddress!;
      // Another local program without the credentials cannot post into the outbox.
      const intruder = nodemailer.createTransport({ host, port, secure: false, ignoreTLS: true });
      await expect(
        intruder.sendMail({
          from: 'x@evil.test',
          to: demoEmail('admin'),
          subject: 'hi',
          text: 'x',
        }),
      ).rejects.toThrow();
      await mailer.send({
        to: demoEmail('admin'),
        subject: 'Über ünïcode — a long subject line that nodemailer folds and encodes',
        text: 'Grüße\nSecond line',
      });
      const text = await readMail(dir, demoEmail('admin'));
      expect(text).toBe('Grüße\nSecond line\n');
      await mailer.close();
      const refused = await new Promise<boolean>((resolve) => {
        const sock = net.connect(port, host);
        sock.once('connect', () => {
          sock.destroy();
          resolve(false);
        });
        sock.once('error', () => resolve(true));
      });
      expect(refused).toBe(true);
      await expect(
        mailer.send({ to: demoEmail('admin'), subject: 'late', text: 'x' }),
      ).rejects.toThrow(/closed/);
    } finally {
      await mailer.close();
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });
});

describe('migration 0004 (mail and share tokens) on an existing database', () => {
  it(
    'keeps existing share links working by their token and hides old outbox tokens',
    { timeout: 120_000 },
    async () => {
      const { PGlite } = await import('@electric-sql/pglite');
      const { drizzle } = await import('drizzle-orm/pglite');
      const { migrate } = await import('drizzle-orm/pglite/migrator');
      const { MIGRATIONS_DIR } = await import('../../server/db/client');
      // The migrations before 0004, as a database made before this change has them.
      const old = fs.mkdtempSync(path.join(os.tmpdir(), 'spoolwright-mig-'));
      fs.mkdirSync(path.join(old, 'meta'));
      const journal = JSON.parse(
        fs.readFileSync(path.join(MIGRATIONS_DIR, 'meta/_journal.json'), 'utf8'),
      ) as { entries: { tag: string }[] };
      const before = journal.entries.slice(
        0,
        journal.entries.findIndex((e) => e.tag.startsWith('0004')),
      );
      for (const e of before)
        fs.copyFileSync(path.join(MIGRATIONS_DIR, `${e.tag}.sql`), path.join(old, `${e.tag}.sql`));
      fs.writeFileSync(
        path.join(old, 'meta/_journal.json'),
        JSON.stringify({ ...journal, entries: before }),
      );
      const client = await PGlite.create();
      try {
        const db = drizzle({ client });
        await migrate(db, { migrationsFolder: old });
        await client.exec(`
        insert into teams (id, name) values ('t1', 'T');
        insert into "user" (id, name, email) values ('u1', 'U', 'u@x.test');
        insert into spools (id, team_id, name, document) values ('s1', 't1', 'S', '{}');
        insert into share_links (id, team_id, spool_id, revision, status, name, document, expires_at)
          values ('old-token-0123456789abcdefghijklmnop', 't1', 's1', 0, 'draft', 'S', '{}', now() + interval '1 day');
        insert into outbox ("to", "from", subject, text, raw)
          values ('u@x.test', 'f', 'Reset', 'Open http://h/api/auth/reset-password/SECRETTOKEN1?callbackURL=/r or http://h/accept-invite?token=SECRET2&x=1', 'raw');`);
        await migrate(db, { migrationsFolder: MIGRATIONS_DIR });
        const share = (
          await client.query<{ id: string; token_hash: string }>(
            'select id, token_hash from share_links',
          )
        ).rows[0]!;
        expect(share.token_hash).toBe(
          createHash('sha256').update('old-token-0123456789abcdefghijklmnop').digest('hex'),
        );
        expect(share.id).not.toContain('old-token');
        const mail = (
          await client.query<{ text: string; team_id: string | null }>(
            'select text, team_id from outbox',
          )
        ).rows[0]!;
        expect(mail.team_id).toBeNull();
        expect(mail.text).not.toMatch(/SECRET/);
        expect(mail.text).toContain('/reset-password/[redacted]?callbackURL=/r');
        expect(mail.text).toContain('accept-invite?token=[redacted]&x=1');
      } finally {
        await client.close();
        fs.rmSync(old, { recursive: true, force: true });
      }
    },
  );
});
