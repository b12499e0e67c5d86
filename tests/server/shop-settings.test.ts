import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, sampleDocument, type TestApp } from './helpers';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t?.close();
});

describe('shop settings in the stored document', () => {
  it('keeps test temperature and bending tangent through save and load; refuses a negative tangent naming the field', async () => {
    const designer = await t.signIn('designer');
    const created = await designer.post('/api/spools').send({
      document: sampleDocument('Shop settings', {
        shop: { testTemperature: 60, bendTangent: 6 },
      }),
    });
    expect(created.status).toBe(201);
    const got = await designer.get(`/api/spools/${created.body.id as string}`);
    expect(got.body.document.shop).toEqual({ testTemperature: 60, bendTangent: 6 });
    const bad = await designer
      .post('/api/spools')
      .send({ document: sampleDocument('Bad shop', { shop: { bendTangent: -1 } }) });
    expect(bad.status).toBeGreaterThanOrEqual(400);
    expect(JSON.stringify(bad.body.error)).toContain('shop.bendTangent');
  });
});
