import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { desc } from 'drizzle-orm';
import { createTestApp, sampleDocument, type TestApp } from './helpers';
import { outbox } from '../../server/db/schema';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ publicUrl: 'http://spools.example.test:8080' });
});
afterAll(async () => {
  await t?.close();
});

async function submittedSpool(name: string) {
  const designer = await t.signIn('designer');
  const c = await designer.post('/api/spools').send({ document: sampleDocument(name) });
  expect(c.status).toBe(201);
  await designer.post(`/api/spools/${c.body.id}/transitions`).send({ to: 'submitted' }).expect(200);
  return c.body.id as string;
}

const lastMailTo = async (fragment: string) => {
  const rows = await t.database.db.select().from(outbox).orderBy(desc(outbox.id)).limit(20);
  return rows.find((r) => r.to.includes(fragment));
};

describe('review rules', () => {
  it('refuses "mark checked" while a comment of this revision is open, naming it', async () => {
    const id = await submittedSpool('Open comment blocks check');
    const checker = await t.signIn('checker');
    const c = await checker
      .post(`/api/spools/${id}/comments`)
      .send({ body: 'Bend radius too tight for the shop', elementId: 'B1' });
    expect(c.status).toBe(201);
    const refused = await checker.post(`/api/spools/${id}/transitions`).send({ to: 'checked' });
    expect(refused.status).toBe(409);
    expect(refused.body.error.code).toBe('open_comments');
    expect(refused.body.error.message).toContain('B1');
    expect(refused.body.error.message).toContain('Bend radius too tight');
    expect(refused.body.error.details.comments).toEqual([
      expect.objectContaining({ id: c.body.id, elementId: 'B1' }),
    ]);
    // still submitted
    expect((await checker.get(`/api/spools/${id}`)).body.status).toBe('submitted');
    await checker
      .patch(`/api/spools/${id}/comments/${c.body.id}`)
      .send({ resolved: true })
      .expect(200);
    const ok = await checker.post(`/api/spools/${id}/transitions`).send({ to: 'checked' });
    expect(ok.status).toBe(200);
    expect(ok.body.status).toBe('checked');
  });

  it('ignores open comments of earlier revisions', async () => {
    const id = await submittedSpool('Old revision comment');
    const lead = await t.signIn('lead');
    await lead.post(`/api/spools/${id}/transitions`).send({ to: 'checked' }).expect(200);
    await lead.post(`/api/spools/${id}/comments`).send({ body: 'On revision 0' }).expect(201);
    // editing a checked spool opens revision 1 in draft
    const cur = (await lead.get(`/api/spools/${id}`)).body;
    const saved = await lead
      .put(`/api/spools/${id}`)
      .send({ document: { ...cur.document, line: 'changed' }, baseVersion: cur.version });
    expect(saved.body.revision).toBe(1);
    await lead.post(`/api/spools/${id}/transitions`).send({ to: 'submitted' }).expect(200);
    const r = await lead.post(`/api/spools/${id}/transitions`).send({ to: 'checked' });
    expect(r.status, r.text).toBe(200);
  });

  it('keeps the return note as a comment of the revision', async () => {
    const id = await submittedSpool('Returned with a note');
    const checker = await t.signIn('checker');
    await checker
      .post(`/api/spools/${id}/transitions`)
      .send({ to: 'draft', note: 'Please review B1 against the shop radius' })
      .expect(200);
    const list = await checker.get(`/api/spools/${id}/comments`);
    expect(list.body.items).toEqual([
      expect.objectContaining({
        body: 'Please review B1 against the shop radius',
        elementId: null,
        revision: 0,
        resolvedAt: null,
      }),
    ]);
    const events = await checker.get(`/api/spools/${id}/events`);
    expect(events.body.items.at(-1)).toMatchObject({
      from: 'submitted',
      to: 'draft',
      note: 'Please review B1 against the shop radius',
    });
  });

  it('mails the next role a link to the spool at PUBLIC_URL', async () => {
    const id = await submittedSpool('Mailed on submit');
    const mail = await lastMailTo('checker@');
    expect(mail?.subject).toContain('Mailed on submit');
    expect(mail?.text).toContain(`http://spools.example.test:8080/spools/${id}`);
    await (await t.signIn('checker'))
      .post(`/api/spools/${id}/transitions`)
      .send({ to: 'draft', note: 'see S2' })
      .expect(200);
    const back = await lastMailTo('designer@');
    expect(back?.subject).toBe('Spool Mailed on submit returned to draft');
    expect(back?.text).toContain('Note: see S2');
    expect(back?.text).toContain(`http://spools.example.test:8080/spools/${id}`);
  });
});

describe('GET /api/waiting', () => {
  it('lists what each role acts on next', async () => {
    const returned = await submittedSpool('Waiting: returned');
    const submitted = await submittedSpool('Waiting: submitted');
    const checker = await t.signIn('checker');
    await checker
      .post(`/api/spools/${returned}/comments`)
      .send({ body: 'Wall at B1?', elementId: 'B1' })
      .expect(201);
    await checker
      .post(`/api/spools/${returned}/transitions`)
      .send({ to: 'draft', note: 'two things' })
      .expect(200);

    const designer = await t.signIn('designer');
    const d = await designer.get('/api/waiting');
    expect(d.status).toBe(200);
    expect(d.body).toMatchObject({ role: 'designer', state: 'draft' });
    const mine = d.body.items.find((i: { spool: { id: string } }) => i.spool.id === returned);
    expect(mine).toMatchObject({ openComments: 2, note: 'two things' });
    expect(mine.comments.map((c: { body: string }) => c.body)).toEqual([
      'Wall at B1?',
      'two things',
    ]);
    // a draft nobody returned is not waiting on the designer
    expect(
      d.body.items.every((i: { spool: { status: string } }) => i.spool.status === 'draft'),
    ).toBe(true);
    const fresh = await designer
      .post('/api/spools')
      .send({ document: sampleDocument('Waiting: fresh draft') });
    const d2 = await designer.get('/api/waiting');
    expect(d2.body.items.some((i: { spool: { id: string } }) => i.spool.id === fresh.body.id)).toBe(
      false,
    );
    expect(d2.body.total).toBe(d2.body.items.length);

    const c = await checker.get('/api/waiting');
    expect(c.body.state).toBe('submitted');
    expect(c.body.items.some((i: { spool: { id: string } }) => i.spool.id === submitted)).toBe(
      true,
    );
    expect(c.body.items.some((i: { spool: { id: string } }) => i.spool.id === returned)).toBe(
      false,
    );
    expect(c.body.items[0].comments).toBeUndefined();

    await checker.post(`/api/spools/${submitted}/transitions`).send({ to: 'checked' }).expect(200);
    const l = await (await t.signIn('lead')).get('/api/waiting');
    expect(l.body.state).toBe('checked');
    expect(l.body.items.some((i: { spool: { id: string } }) => i.spool.id === submitted)).toBe(
      true,
    );
    const a = await (await t.signIn('admin')).get('/api/waiting');
    expect(a.body.state).toBe('checked');

    await (await t.signIn('lead'))
      .post(`/api/spools/${submitted}/transitions`)
      .send({ to: 'released' })
      .expect(200);
    const f = await (await t.signIn('fabricator')).get('/api/waiting');
    expect(f.body.state).toBe('released');
    expect(f.body.items.some((i: { spool: { id: string } }) => i.spool.id === submitted)).toBe(
      true,
    );
  });

  it('needs a session', async () => {
    const r = await t.anon().get('/api/waiting');
    expect(r.status).toBe(401);
  });
});
