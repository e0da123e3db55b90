import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTwoShops } from '../../testing/factories';
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

const DEALER = { name: 'North Garage', contactName: 'Sam North', contactEmail: 'sam@north.test', phone: '+1 555 0100' };

describe('/api/dealers', () => {
  it('the owner adds a dealer, which the list shows with its people counted', async () => {
    const owner = await signIn(t.app, w.people.owner.email);
    const created = await owner.post('/api/dealers').send(DEALER);
    expect(created.status).toBe(201);
    expect(created.body.data).toMatchObject(DEALER);
    const list = (await owner.get('/api/dealers')).body.data as Array<{ id: string; userCount: number; customerCount: number }>;
    expect(list.map((d) => d.id).sort()).toEqual([w.dealer.id, created.body.data.id].sort());
    // [CALC] the world gave its dealer one dealer user and no customers; the new dealer has no one yet.
    expect(list.find((d) => d.id === w.dealer.id)).toMatchObject({ userCount: 1, customerCount: 0 });
    expect(list.find((d) => d.id === created.body.data.id)).toMatchObject({ userCount: 0, customerCount: 0 });
  });

  it('refuses bad input with a 400', async () => {
    const owner = await signIn(t.app, w.people.owner.email);
    expect((await owner.post('/api/dealers').send({ ...DEALER, contactEmail: 'not-an-address' })).status).toBe(400);
    expect((await owner.post('/api/dealers').send({ ...DEALER, name: 'N' })).status).toBe(400);
  });

  it('lets only the owner add one, and a dealer user list only its own', async () => {
    for (const person of [w.people.tuner, w.people.dealer, w.people.customer]) {
      expect((await (await signIn(t.app, person.email)).post('/api/dealers').send(DEALER)).status).toBe(403);
    }
    const dealer = await signIn(t.app, w.people.dealer.email);
    expect((await dealer.get('/api/dealers')).body.data.map((d: { id: string }) => d.id)).toEqual([w.dealer.id]);
  });

  it("answers 404 for another shop's dealer and lists none of them", async () => {
    const other = await signIn(t.app, w.other.owner.email);
    expect((await other.get(`/api/dealers/${w.dealer.id}`)).status).toBe(404);
    expect((await other.get('/api/dealers')).body.data).toEqual([]);
  });
});
