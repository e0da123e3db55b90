import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createPackage, createTwoShops } from '../../testing/factories';
import { createTestApp, signIn, type TestApp } from '../../testing/test-app';

let t: TestApp;
let w: Awaited<ReturnType<typeof createTwoShops>>;
beforeAll(async () => {
  t = await createTestApp();
  w = await createTwoShops(t);
});
afterAll(async () => {
  await t.close();
});

const STAGE_1 = { name: 'Stage 1', description: 'ECM only', modules: ['ECM'], retailPriceMinor: 49_900, dealerPriceMinor: 39_900, roundsIncluded: 3 };

describe('/api/packages', () => {
  it('the owner adds, edits and retires a package; dealers see the wholesale price, customers never', async () => {
    const owner = await signIn(t.app, w.people.owner.email);
    const created = await owner.post('/api/packages').send(STAGE_1);
    expect(created.status).toBe(201);
    expect(created.body.data).toMatchObject({ ...STAGE_1, active: true });
    const id = created.body.data.id as string;
    const edited = await owner.put(`/api/packages/${id}`).send({ ...STAGE_1, retailPriceMinor: 52_900 });
    expect(edited.body.data.retailPriceMinor).toBe(52_900);

    const dealerList = await (await signIn(t.app, w.people.dealer.email)).get('/api/packages');
    expect(dealerList.body.data.find((p: { id: string }) => p.id === id)).toMatchObject({ dealerPriceMinor: 39_900 });
    const customer = await signIn(t.app, w.people.customer.email);
    const seen = (await customer.get('/api/packages')).body;
    expect(seen.meta.currency).toBe('USD');
    expect(seen.data.find((p: { id: string }) => p.id === id)).toMatchObject({ dealerPriceMinor: null });

    expect((await owner.patch(`/api/packages/${id}`).send({ active: false })).body.data.active).toBe(false);
    expect((await customer.get('/api/packages')).body.data.map((p: { id: string }) => p.id)).not.toContain(id);
    expect((await owner.get('/api/packages')).body.data.map((p: { id: string }) => p.id)).toContain(id);
  });

  it('refuses bad input with a 400', async () => {
    const owner = await signIn(t.app, w.people.owner.email);
    expect((await owner.post('/api/packages').send({ ...STAGE_1, name: '' })).status).toBe(400);
    expect((await owner.post('/api/packages').send({ ...STAGE_1, retailPriceMinor: -1 })).status).toBe(400);
    expect((await owner.post('/api/packages').send({ ...STAGE_1, modules: [] })).status).toBe(400);
  });

  it('lets only the owner write', async () => {
    const pkg = await createPackage(t, w.shop);
    for (const person of [w.people.tuner, w.people.dealer, w.people.customer]) {
      const agent = await signIn(t.app, person.email);
      expect((await agent.post('/api/packages').send(STAGE_1)).status).toBe(403);
      expect((await agent.patch(`/api/packages/${pkg.id}`).send({ active: false })).status).toBe(403);
    }
  });

  it("answers 404 for another shop's package", async () => {
    const pkg = await createPackage(t, w.shop);
    const other = await signIn(t.app, w.other.owner.email);
    expect((await other.put(`/api/packages/${pkg.id}`).send(STAGE_1)).status).toBe(404);
    expect((await other.patch(`/api/packages/${pkg.id}`).send({ active: false })).status).toBe(404);
    expect((await other.get('/api/packages')).body.data.map((p: { id: string }) => p.id)).not.toContain(pkg.id);
  });
});
