import { randomBytes, randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type request from 'supertest';
import { createTestApp, sampleDocument, type TestApp } from './helpers';
import { teamInvitations, teamMembers } from '../../server/db/schema';
import { hashToken } from '../../server/auth/invitations';
import { createUserWithPassword, DEMO_TEAM } from '../../server/db/seed';
import { ROLES, type Role } from '../../shared/model/permissions';

// The roles table of the product design, written out here on purpose (not read from
// shared/model/permissions.ts) so that a wrong permission table fails this test.
const D: Role = 'designer';
const C: Role = 'checker';
const F: Role = 'fabricator';
const L: Role = 'lead';
const A: Role = 'admin';
const EVERY_MEMBER = [D, C, F, L, A];

type Who = Role | 'anonymous';
interface Call {
  method: 'get' | 'post' | 'put' | 'patch' | 'delete';
  path: string;
  body?: object;
  /** Sent as text/csv instead of JSON. */
  csv?: string;
}
interface RouteCase {
  name: string;
  /** Who may do it; everyone else gets 403 (signed out: 401). */
  allowed: readonly Role[];
  /** Open to everybody, signed in or not. */
  isPublic?: boolean;
  /** Build a fresh target for one request (state-dependent routes). */
  setup: () => Promise<Call>;
}

let t: TestApp;
let admin: request.Agent;
let fixed: { spoolId: string; shareId: string; shareToken: string; fabricatorId: string };

async function newSpool(state: 'draft' | 'submitted' | 'checked' = 'draft') {
  const r = await admin
    .post('/api/spools')
    .send({ document: sampleDocument(`Matrix ${randomUUID().slice(0, 8)}`) });
  expect(r.status).toBe(201);
  const id = r.body.id as string;
  if (state !== 'draft')
    await admin.post(`/api/spools/${id}/transitions`).send({ to: 'submitted' }).expect(200);
  if (state === 'checked')
    await admin.post(`/api/spools/${id}/transitions`).send({ to: 'checked' }).expect(200);
  const now = await admin.get(`/api/spools/${id}`);
  return { id, version: now.body.version as number };
}

const ROUTES: RouteCase[] = [
  {
    name: 'GET /api/health',
    allowed: EVERY_MEMBER,
    isPublic: true,
    setup: async () => ({ method: 'get', path: '/api/health' }),
  },
  {
    name: 'GET /api/me',
    allowed: EVERY_MEMBER,
    setup: async () => ({ method: 'get', path: '/api/me' }),
  },
  {
    name: 'GET /api/spools',
    allowed: EVERY_MEMBER,
    setup: async () => ({ method: 'get', path: '/api/spools' }),
  },
  {
    name: 'POST /api/spools (create)',
    allowed: [D, L, A],
    setup: async () => ({
      method: 'post',
      path: '/api/spools',
      body: { document: sampleDocument('Created by matrix') },
    }),
  },
  {
    name: 'POST /api/spools/import (line-list CSV)',
    allowed: [D, L, A],
    setup: async () => ({
      method: 'post',
      path: '/api/spools/import',
      csv: 'name,pressure,temperature,material\nMatrix import,150,100,A106-B',
    }),
  },
  {
    name: 'GET /api/spools/:id (view)',
    allowed: EVERY_MEMBER,
    setup: async () => ({ method: 'get', path: `/api/spools/${fixed.spoolId}` }),
  },
  {
    name: 'PUT /api/spools/:id (edit)',
    allowed: [D, L, A],
    setup: async () => {
      const s = await newSpool();
      return {
        method: 'put',
        path: `/api/spools/${s.id}`,
        body: { document: sampleDocument('Edited by matrix'), baseVersion: s.version },
      };
    },
  },
  {
    name: 'DELETE /api/spools/:id',
    allowed: [L, A],
    setup: async () => ({ method: 'delete', path: `/api/spools/${(await newSpool()).id}` }),
  },
  {
    name: 'POST transitions → submitted (submit for check)',
    allowed: [D, L, A],
    setup: async () => ({
      method: 'post',
      path: `/api/spools/${(await newSpool()).id}/transitions`,
      body: { to: 'submitted' },
    }),
  },
  {
    name: 'POST transitions → checked (mark checked)',
    allowed: [C, L, A],
    setup: async () => ({
      method: 'post',
      path: `/api/spools/${(await newSpool('submitted')).id}/transitions`,
      body: { to: 'checked' },
    }),
  },
  {
    name: 'POST transitions → draft (return with comments)',
    allowed: [C, L, A],
    setup: async () => ({
      method: 'post',
      path: `/api/spools/${(await newSpool('submitted')).id}/transitions`,
      body: { to: 'draft', note: 'see B1' },
    }),
  },
  {
    name: 'POST transitions → released (approve for fabrication)',
    allowed: [L, A],
    setup: async () => ({
      method: 'post',
      path: `/api/spools/${(await newSpool('checked')).id}/transitions`,
      body: { to: 'released' },
    }),
  },
  {
    name: 'GET /api/spools/:id/revisions',
    allowed: EVERY_MEMBER,
    setup: async () => ({ method: 'get', path: `/api/spools/${fixed.spoolId}/revisions` }),
  },
  {
    name: 'GET /api/spools/:id/revisions/:rev',
    allowed: EVERY_MEMBER,
    setup: async () => ({ method: 'get', path: `/api/spools/${fixed.spoolId}/revisions/0` }),
  },
  {
    name: 'GET /api/spools/:id/events',
    allowed: EVERY_MEMBER,
    setup: async () => ({ method: 'get', path: `/api/spools/${fixed.spoolId}/events` }),
  },
  {
    name: 'GET /api/spools/:id/calc-sheet.pdf',
    allowed: EVERY_MEMBER,
    setup: async () => ({
      method: 'get',
      path: `/api/spools/${fixed.spoolId}/calc-sheet.pdf?revision=0`,
    }),
  },
  {
    name: 'GET /api/waiting (waiting on me)',
    allowed: EVERY_MEMBER,
    setup: async () => ({ method: 'get', path: '/api/waiting' }),
  },
  {
    name: 'GET /api/spools/:id/comments',
    allowed: EVERY_MEMBER,
    setup: async () => ({ method: 'get', path: `/api/spools/${fixed.spoolId}/comments` }),
  },
  {
    name: 'POST /api/spools/:id/comments (comment on elements)',
    allowed: EVERY_MEMBER,
    setup: async () => ({
      method: 'post',
      path: `/api/spools/${fixed.spoolId}/comments`,
      body: { body: 'Matrix comment', elementId: 'B1' },
    }),
  },
  {
    name: 'PATCH /api/spools/:id/comments/:commentId (resolve)',
    allowed: EVERY_MEMBER,
    setup: async () => {
      const c = await admin
        .post(`/api/spools/${fixed.spoolId}/comments`)
        .send({ body: 'To resolve' });
      return {
        method: 'patch',
        path: `/api/spools/${fixed.spoolId}/comments/${c.body.id}`,
        body: { resolved: true },
      };
    },
  },
  {
    name: 'POST /api/check',
    allowed: EVERY_MEMBER,
    setup: async () => ({
      method: 'post',
      path: '/api/check',
      body: sampleDocument('Checked only'),
    }),
  },
  {
    name: 'GET /api/materials',
    allowed: EVERY_MEMBER,
    setup: async () => ({ method: 'get', path: '/api/materials' }),
  },
  {
    name: 'POST /api/materials/import (materials library)',
    allowed: [A],
    setup: async () => ({
      method: 'post',
      path: '/api/materials/import?source=matrix%20test',
      csv: 'id,spec,grade,tensile_ksi,yield_ksi,temp_f,stress_ksi\nMX-1,Matrix,1,60,35,100,20',
    }),
  },
  {
    name: 'DELETE /api/materials/:id',
    allowed: [A],
    setup: async () => {
      const id = `MX-${randomUUID().slice(0, 6)}`;
      await admin
        .post(`/api/materials/import?source=matrix`)
        .set('content-type', 'text/csv')
        .send(`id,spec,grade,tensile_ksi,yield_ksi,temp_f,stress_ksi\n${id},Matrix,1,60,35,100,20`)
        .expect(201);
      return { method: 'delete', path: `/api/materials/${id}` };
    },
  },
  {
    name: 'GET /api/dimensions',
    allowed: EVERY_MEMBER,
    setup: async () => ({ method: 'get', path: '/api/dimensions' }),
  },
  {
    name: 'GET /api/spools/:id/shares',
    allowed: [L, A],
    setup: async () => ({ method: 'get', path: `/api/spools/${fixed.spoolId}/shares` }),
  },
  {
    name: 'POST /api/spools/:id/shares (create share link)',
    allowed: [L, A],
    setup: async () => ({ method: 'post', path: `/api/spools/${fixed.spoolId}/shares`, body: {} }),
  },
  {
    name: 'DELETE /api/spools/:id/shares/:shareId (revoke)',
    allowed: [L, A],
    setup: async () => {
      const s = await admin.post(`/api/spools/${fixed.spoolId}/shares`).send({});
      return { method: 'delete', path: `/api/spools/${fixed.spoolId}/shares/${s.body.id}` };
    },
  },
  {
    name: 'GET /api/share/:token (public view)',
    allowed: EVERY_MEMBER,
    isPublic: true,
    setup: async () => ({ method: 'get', path: `/api/share/${fixed.shareToken}` }),
  },
  {
    name: 'GET /api/share/:token/calc-sheet.pdf (public)',
    allowed: EVERY_MEMBER,
    isPublic: true,
    setup: async () => ({ method: 'get', path: `/api/share/${fixed.shareToken}/calc-sheet.pdf` }),
  },
  {
    name: 'GET /api/team/members',
    allowed: EVERY_MEMBER,
    setup: async () => ({ method: 'get', path: '/api/team/members' }),
  },
  {
    name: 'POST /api/team/members (manage members)',
    allowed: [A],
    setup: async () => ({
      method: 'post',
      path: '/api/team/members',
      body: {
        email: `m-${randomUUID().slice(0, 8)}@spoolwright.test`,
        name: 'Matrix Member',
        role: 'fabricator',
        password: 'matrix-password',
      },
    }),
  },
  {
    name: 'PATCH /api/team/members/:userId (change role)',
    allowed: [A],
    setup: async () => ({
      method: 'patch',
      path: `/api/team/members/${fixed.fabricatorId}`,
      body: { role: 'fabricator' },
    }),
  },
  {
    name: 'DELETE /api/team/members/:userId',
    allowed: [A],
    setup: async () => {
      const id = await createUserWithPassword(t.database.db, {
        email: `d-${randomUUID().slice(0, 8)}@spoolwright.test`,
        name: 'Leaving Member',
        password: 'leaving-password',
      });
      await t.database.db
        .insert(teamMembers)
        .values({ teamId: DEMO_TEAM.id, userId: id, role: 'designer' });
      return { method: 'delete', path: `/api/team/members/${id}` };
    },
  },
  {
    name: 'GET /api/admin/outbox',
    allowed: [A],
    setup: async () => ({ method: 'get', path: '/api/admin/outbox' }),
  },
  {
    name: 'GET /api/team/invitations',
    allowed: [A],
    setup: async () => ({ method: 'get', path: '/api/team/invitations' }),
  },
  {
    name: 'POST /api/team/invitations (invite a member)',
    allowed: [A],
    setup: async () => ({
      method: 'post',
      path: '/api/team/invitations',
      body: {
        email: `i-${randomUUID().slice(0, 8)}@spoolwright.test`,
        name: 'Matrix Invitee',
        role: 'designer',
      },
    }),
  },
  {
    name: 'DELETE /api/team/invitations/:id (withdraw)',
    allowed: [A],
    setup: async () => {
      const inv = await admin.post('/api/team/invitations').send({
        email: `w-${randomUUID().slice(0, 8)}@spoolwright.test`,
        name: 'Withdrawn',
        role: 'checker',
      });
      return { method: 'delete', path: `/api/team/invitations/${inv.body.id}` };
    },
  },
  {
    name: 'POST /api/invitations/lookup (public, with the token)',
    allowed: EVERY_MEMBER,
    isPublic: true,
    setup: async () => ({
      method: 'post',
      path: '/api/invitations/lookup',
      body: { token: await pendingInvitationToken() },
    }),
  },
  {
    name: 'POST /api/invitations/accept (public, with the token)',
    allowed: EVERY_MEMBER,
    isPublic: true,
    setup: async () => ({
      method: 'post',
      path: '/api/invitations/accept',
      body: { token: await pendingInvitationToken(), password: 'matrix-chosen-password' },
    }),
  },
  {
    name: 'POST /api/materials (team material form)',
    allowed: [A],
    setup: async () => ({
      method: 'post',
      path: '/api/materials',
      body: {
        id: `MF-${randomUUID().slice(0, 6)}`,
        spec: 'Matrix',
        grade: '1',
        productForms: ['seamless'],
        tensileKsi: 60,
        yieldKsi: 35,
        points: [{ tempF: 100, stressKsi: 20 }],
        sourceNote: 'matrix test',
      },
    }),
  },
  {
    name: 'POST /api/materials/import/preview (dry run)',
    allowed: [A],
    setup: async () => ({
      method: 'post',
      path: '/api/materials/import/preview?source=matrix%20test',
      csv: 'id,spec,grade,tensile_ksi,yield_ksi,temp_f,stress_ksi\nMX-P,Matrix,1,60,35,100,20',
    }),
  },
  {
    name: 'POST /api/spools/import/preview (line-list dry run)',
    allowed: [D, L, A],
    setup: async () => ({
      method: 'post',
      path: '/api/spools/import/preview',
      csv: 'name,pressure,temperature\nMatrix preview,150,100',
    }),
  },
  {
    name: 'GET /api/admin/jobs',
    allowed: [A],
    setup: async () => ({ method: 'get', path: '/api/admin/jobs' }),
  },
  {
    name: 'GET /api/admin/jobs/:jobId',
    allowed: [A],
    setup: async () => {
      const up = await admin
        .post('/api/materials/import?source=matrix%20job')
        .set('content-type', 'text/csv')
        .send('id,spec,grade,tensile_ksi,yield_ksi,temp_f,stress_ksi\nMX-JOB,Matrix,1,60,35,100,20')
        .expect(201);
      return { method: 'get', path: `/api/admin/jobs/${up.body.job.id}` };
    },
  },
];

/** A pending invitation written straight to the database, so the test knows its token. */
async function pendingInvitationToken(): Promise<string> {
  const token = randomBytes(32).toString('base64url');
  await t.database.db.insert(teamInvitations).values({
    id: randomUUID(),
    teamId: DEMO_TEAM.id,
    email: `p-${randomUUID().slice(0, 8)}@spoolwright.test`,
    name: 'Matrix Invitee',
    role: 'fabricator',
    tokenHash: hashToken(token),
    expiresAt: new Date(Date.now() + 3600_000),
  });
  return token;
}

beforeAll(async () => {
  t = await createTestApp();
  admin = await t.signIn('admin');
  const s = await newSpool();
  const share = await admin.post(`/api/spools/${s.id}/shares`).send({});
  const members = await admin.get('/api/team/members');
  const fab = members.body.items.find((m: { role: string }) => m.role === 'fabricator');
  fixed = {
    spoolId: s.id,
    shareId: share.body.id,
    shareToken: share.body.token,
    fabricatorId: fab.userId,
  };
});
afterAll(async () => {
  await t?.close();
});

const WHO: Who[] = [...ROLES, 'anonymous'];

describe.each(ROUTES)('$name', (route) => {
  it.each(WHO)('as %s', async (who) => {
    const call = await route.setup();
    const agent = who === 'anonymous' ? t.anon() : await t.signIn(who);
    let req = agent[call.method](call.path);
    if (call.body) req = req.send(call.body);
    if (call.csv) req = req.set('content-type', 'text/csv').send(call.csv);
    const r = await req;
    const allowed = route.isPublic || (who !== 'anonymous' && route.allowed.includes(who));
    if (allowed) {
      expect(
        r.status,
        `${route.name} as ${who}: ${(r.text ?? '').slice(0, 200)}`,
      ).toBeGreaterThanOrEqual(200);
      expect(r.status, `${route.name} as ${who}: ${(r.text ?? '').slice(0, 200)}`).toBeLessThan(
        300,
      );
    } else {
      expect(r.status, `${route.name} as ${who}: ${(r.text ?? '').slice(0, 200)}`).toBe(
        who === 'anonymous' ? 401 : 403,
      );
      expect(r.body.error.code).toBe(who === 'anonymous' ? 'unauthenticated' : 'forbidden');
    }
  });
});
