import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { createTestApp, DEMO_PASSWORD, demoEmail, sampleDocument, type TestApp } from './helpers';

describe('sign-in limits', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp({
      rateLimit: true,
      signInLimits: {
        perAccount: { max: 5, windowMs: 60_000 },
        perAddress: { max: 12, windowMs: 60_000 },
      },
    });
  });
  afterAll(async () => {
    await t?.close();
  });

  it('allows 5 failed sign-ins per account, then answers 429 for that account only', async () => {
    const codes: number[] = [];
    for (let i = 0; i < 7; i++) {
      const r = await t
        .anon()
        .post('/api/auth/sign-in/email')
        .send({ email: demoEmail('designer'), password: 'wrong-password' });
      codes.push(r.status);
    }
    expect(codes.slice(0, 5)).toEqual([401, 401, 401, 401, 401]);
    expect(codes.slice(5)).toEqual([429, 429]);
    const locked = await t
      .anon()
      .post('/api/auth/sign-in/email')
      .send({ email: demoEmail('designer'), password: DEMO_PASSWORD });
    expect(locked.status).toBe(429);
    expect(locked.body.error).toMatchObject({
      code: 'rate_limited',
      details: { retryAfter: expect.any(Number) },
    });
    expect(locked.headers['retry-after']).toBeDefined();
    // Colleagues at the same address still sign in, and successes do not use up their account's allowance.
    for (let i = 0; i < 2; i++)
      await t
        .anon()
        .post('/api/auth/sign-in/email')
        .send({ email: demoEmail('checker'), password: DEMO_PASSWORD })
        .expect(200);
  });

  it('limits attempts per address more loosely, keyed on the socket, not a client-supplied x-forwarded-for', async () => {
    // 10 attempts so far from this address; the address allows 12 per minute.
    await t
      .anon()
      .post('/api/auth/sign-in/email')
      .send({ email: demoEmail('fabricator'), password: 'wrong-password' })
      .expect(401);
    await t
      .anon()
      .post('/api/auth/sign-in/email')
      .send({ email: demoEmail('lead'), password: DEMO_PASSWORD })
      .expect(200);
    const r = await t
      .anon()
      .post('/api/auth/sign-in/email')
      .set('x-forwarded-for', '10.1.2.3')
      .send({ email: demoEmail('lead'), password: DEMO_PASSWORD });
    expect(r.status).toBe(429);
    expect(r.body.error.message).toMatch(/address/);
  });
});

describe('server faults', () => {
  it('answers 500 with a generic message and no internals when the database is gone', async () => {
    const t = await createTestApp();
    const agent = await t.signIn('lead');
    await t.database.close();
    const r = await agent.get('/api/spools/some-id');
    expect(r.status).toBe(500);
    expect(r.body).toEqual({
      error: { code: 'internal', message: 'Something went wrong on the server' },
    });
  });
});

describe('origin checks', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp({ originCheck: true, trustedOrigins: ['http://127.0.0.1:5174'] });
  });
  afterAll(async () => {
    await t?.close();
  });

  it('refuses a cookie-carrying auth request and an API write from a foreign origin', async () => {
    const agent = t.anon();
    await agent
      .post('/api/auth/sign-in/email')
      .set('origin', 'http://127.0.0.1:5174')
      .send({ email: demoEmail('lead'), password: DEMO_PASSWORD })
      .expect(200);
    const created = await agent
      .post('/api/spools')
      .set('origin', 'http://127.0.0.1:5174')
      .send({ document: sampleDocument('Origin') });
    expect(created.status).toBe(201);
    const foreign = await agent
      .put(`/api/spools/${created.body.id}`)
      .set('origin', 'http://evil.example')
      .send({ document: sampleDocument('Origin'), baseVersion: 1 });
    expect(foreign.status).toBe(403);
    // better-auth logs the refused origin through our (silent) logger.
    const errSpy = vi.spyOn(console, 'error').mockImplementation(() => {});
    const out = await agent
      .post('/api/auth/sign-out')
      .set('origin', 'http://evil.example')
      .send({});
    errSpy.mockRestore();
    expect(out.status).toBe(403);
    expect((await agent.get('/api/me')).status).toBe(200);
  });
});
