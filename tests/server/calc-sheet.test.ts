import { execFileSync } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type request from 'supertest';
import { createTestApp, type TestApp } from './helpers';
import { CAUTION } from '../../shared/model/caution';
import { DEMO_TEAM, DEMO_USERS } from '../../server/db/seed';
import { buildLongSpool } from '../../server/db/demo-spools';
import { CALC_SHEET_MAX_ELEMENTS } from '../../server/routes/calc-sheet';

/** Read a binary body (supertest only buffers text and JSON by itself). */
function binary(res: request.Response, cb: (err: Error | null, body: Buffer) => void) {
  const stream = res as unknown as NodeJS.ReadableStream;
  const chunks: Buffer[] = [];
  stream.on('data', (c: Buffer) => chunks.push(c));
  stream.on('end', () => cb(null, Buffer.concat(chunks)));
}

const getPdf = (agent: request.Agent, path: string) => agent.get(path).buffer(true).parse(binary);

/** The PDF's text by poppler's pdftotext, with runs of white space folded to one space. */
function pdfText(pdf: Buffer): string {
  return execFileSync('pdftotext', ['-', '-'], { input: pdf })
    .toString('utf8')
    .replace(/\s+/g, ' ');
}
function pdfPages(pdf: Buffer): number {
  const info = execFileSync('pdfinfo', ['-'], { input: pdf }).toString('utf8');
  return Number(/Pages:\s+(\d+)/.exec(info)?.[1]);
}

const nameOf = (role: string) => DEMO_USERS.find((u) => u.role === role)!.name;
const CW_NAME = 'CW-101-01 Cooling water header drop';

let t: TestApp;
let checker: request.Agent;
let cw: { id: string; version: number; document: { elements: { id: string }[] } };

beforeAll(async () => {
  t = await createTestApp();
  checker = await t.signIn('checker');
  const list = await checker.get('/api/spools').query({ search: 'CW-101-01' }).expect(200);
  const id = list.body.items[0].id as string;
  cw = (await checker.get(`/api/spools/${id}`).expect(200)).body;
});
afterAll(async () => {
  await t?.close();
});

describe('GET /api/spools/:id/calc-sheet.pdf', () => {
  it('is a PDF with the spool, every element id, the trail, the released history, the caution and page numbers', async () => {
    const r = await getPdf(checker, `/api/spools/${cw.id}/calc-sheet.pdf`).expect(200);
    expect(r.headers['content-type']).toBe('application/pdf');
    expect(r.headers['content-disposition']).toMatch(
      /^attachment; filename="CW-101-01-Cooling-water-header-drop-rev0-calc-sheet\.pdf"$/,
    );
    const pdf = r.body as Buffer;
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    const text = pdfText(pdf);
    expect(text).toContain(CW_NAME);
    expect(text).toContain(DEMO_TEAM.name);
    expect(text).toContain('4"-CW-1012-A1');
    for (const el of cw.document.elements)
      expect(text).toContain(`${el.id.startsWith('CW-B') ? 'Bend' : 'Straight'} ${el.id}`);
    // The equation trail as the engine writes it (B31.3 Eq. (3a) for straights, (3c)/(3d) for bends).
    expect(text).toContain('t = P·D / (2·(S·E·W + P·Y))');
    expect(text).toContain('I = (4·(R1/D) − 1) / (4·(R1/D) − 2)');
    expect(text).toContain('tm = t + c');
    // History of revision 0 from the transition events: submitted, checked, released, who.
    expect(text).toContain(`submitted for check ${nameOf('designer')} Ready for check`);
    expect(text).toContain(`checked ${nameOf('checker')} Walls and bend radii verified`);
    expect(text).toContain(`released for fabrication ${nameOf('lead')} Approved for fabrication`);
    // Caution on every page, and "Page i of N" on each.
    const pages = pdfPages(pdf);
    expect(pages).toBeGreaterThan(cw.document.elements.length);
    expect(text.split(CAUTION).length - 1).toBe(pages);
    for (let i = 1; i <= pages; i++) expect(text).toContain(`Page ${i} of ${pages}`);
    expect(text).not.toContain(`Page ${pages + 1} of`);
  });

  it('keeps earlier revisions: ?revision=0 after an edit opened revision 1; unknown revision 404, bad one 422', async () => {
    const designer = await t.signIn('designer');
    const doc = { ...cw.document, name: `${CW_NAME} (rev 1)` };
    const saved = await designer
      .put(`/api/spools/${cw.id}`)
      .send({ document: doc, baseVersion: cw.version })
      .expect(200);
    expect(saved.body.revision).toBe(1);

    const current = pdfText(
      (await getPdf(checker, `/api/spools/${cw.id}/calc-sheet.pdf`).expect(200)).body as Buffer,
    );
    expect(current).toContain(`${CW_NAME} (rev 1) · rev. 1 · draft`);
    // Revision 1 has one event: the edit that opened it (released → draft).
    expect(current).toContain(`edited: reopened as a new revision ${nameOf('designer')}`);
    expect(current).not.toContain('released for fabrication');

    const old = await getPdf(checker, `/api/spools/${cw.id}/calc-sheet.pdf?revision=0`).expect(200);
    expect(old.headers['content-disposition']).toContain('rev0');
    const oldText = pdfText(old.body as Buffer);
    expect(oldText).toContain(`${CW_NAME} · rev. 0 · released`);
    expect(oldText).toContain(`released for fabrication ${nameOf('lead')}`);

    const missing = await checker.get(`/api/spools/${cw.id}/calc-sheet.pdf?revision=7`).expect(404);
    expect(missing.body.error.code).toBe('not_found');
    const bad = await checker.get(`/api/spools/${cw.id}/calc-sheet.pdf?revision=one`).expect(422);
    expect(bad.body.error.details[0].path).toBe('query.revision');
    await checker.get('/api/spools/no-such-spool/calc-sheet.pdf').expect(404);
    const anon = await t.anon().get(`/api/spools/${cw.id}/calc-sheet.pdf`).expect(401);
    expect(anon.body.error.code).toBe('unauthenticated');
  });
});

describe('calc sheet limits', () => {
  it('refuses a PDF of a spool beyond the element limit with 413 naming the limit', async () => {
    const designer = await t.signIn('designer');
    const doc = buildLongSpool(CALC_SHEET_MAX_ELEMENTS + 1, 'Too long for a sheet');
    const created = await designer.post('/api/spools').send({ document: doc }).expect(201);
    const r = await designer.get(`/api/spools/${created.body.id}/calc-sheet.pdf`).expect(413);
    expect(r.body.error).toMatchObject({
      code: 'payload_too_large',
      details: { elements: CALC_SHEET_MAX_ELEMENTS + 1, limit: CALC_SHEET_MAX_ELEMENTS },
    });
  });
});

describe('GET /api/share/:token/calc-sheet.pdf', () => {
  it('gives anyone the shared revision without team data, and 410 once revoked', async () => {
    const lead = await t.signIn('lead');
    const share = await lead.post(`/api/spools/${cw.id}/shares`).send({ revision: 0 }).expect(201);
    const token = share.body.token as string;
    const r = await getPdf(t.anon(), `/api/share/${token}/calc-sheet.pdf`).expect(200);
    expect(r.headers['content-type']).toBe('application/pdf');
    const text = pdfText(r.body as Buffer);
    expect(text).toContain(`${CW_NAME} · rev. 0 · released`);
    expect(text).toContain('shared read-only link');
    for (const el of cw.document.elements) expect(text).toContain(el.id);
    expect(text).toContain(CAUTION);
    expect(text).not.toContain(DEMO_TEAM.name);
    for (const u of DEMO_USERS) expect(text).not.toContain(u.name);
    expect(text).toContain('A shared copy does not include the history');

    await lead.delete(`/api/spools/${cw.id}/shares/${share.body.id}`).expect(204);
    const gone = await t.anon().get(`/api/share/${token}/calc-sheet.pdf`).expect(410);
    expect(gone.body.error.code).toBe('gone');
    await t.anon().get('/api/share/not-a-token/calc-sheet.pdf').expect(404);
  });
});
