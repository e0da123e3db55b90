import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createPlatformAdmin, createTwoShops, type TestUser } from '../../testing/factories';
import { createTestApp, signIn, type TestApp } from '../../testing/test-app';

let t: TestApp;
let w: Awaited<ReturnType<typeof createTwoShops>>;
let admin: TestUser;
beforeAll(async () => {
  t = await createTestApp();
  w = await createTwoShops(t);
  admin = await createPlatformAdmin(t);
});
afterAll(async () => {
  await t.close();
});

type Row = { id: string; name: string; status: string; owner: { email: string } | null; memberCount: number };

describe('/api/admin/shops', () => {
  it('lists every shop with its owner and members, creates one, and suspends and reactivates it', async () => {
    const agent = await signIn(t.app, admin.email);
    const rows = (await agent.get('/api/admin/shops')).body.data as Row[];
    // [CALC] the world's first shop has an owner, a tuner, a dealer user and a customer; the other only its owner.
    expect(rows.find((r) => r.id === w.shop.id)).toMatchObject({ owner: { email: w.shop.owner.email }, memberCount: 4, status: 'active' });
    expect(rows.find((r) => r.id === w.other.id)).toMatchObject({ memberCount: 1 });

    const created = await agent.post('/api/admin/shops').send({ name: 'New Garage', ownerName: 'Nat Owner', ownerEmail: 'nat@new-garage.test' });
    expect(created.status).toBe(201);
    expect(created.body.data).toMatchObject({ name: 'New Garage', status: 'active' });
    const suspended = await agent.post(`/api/admin/shops/${created.body.data.id}/suspend`);
    expect(suspended.body.data).toMatchObject({ status: 'suspended' });
    expect((await agent.post(`/api/admin/shops/${created.body.data.id}/reactivate`)).body.data).toMatchObject({ status: 'active', suspendedAt: null });
  });

  it('refuses bad input with a 400 and an unknown shop with a 404', async () => {
    const agent = await signIn(t.app, admin.email);
    expect((await agent.post('/api/admin/shops').send({ name: 'X', ownerName: 'Nat', ownerEmail: 'nat' })).status).toBe(400);
    expect((await agent.post('/api/admin/shops/no-such-shop/suspend')).status).toBe(404);
  });

  it('is for platform admins only', async () => {
    for (const person of [w.people.owner, w.people.tuner, w.people.customer]) {
      const agent = await signIn(t.app, person.email);
      expect((await agent.get('/api/admin/shops')).status).toBe(403);
      expect((await agent.post(`/api/admin/shops/${w.other.id}/suspend`)).status).toBe(403);
    }
    expect((await request(t.app).get('/api/admin/shops')).status).toBe(401);
    const rows = (await (await signIn(t.app, admin.email)).get('/api/admin/shops')).body.data as Row[];
    expect(rows.find((r) => r.id === w.other.id)!.status).toBe('active');
  });
});
