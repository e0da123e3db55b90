import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createMember, createTwoShops } from '../../testing/factories';
import { createTestApp, signIn, type TestApp } from '../../testing/test-app';

let t: TestApp;
let w: Awaited<ReturnType<typeof createTwoShops>>;
beforeEach(async () => {
  t = await createTestApp();
  w = await createTwoShops(t);
});
afterEach(async () => {
  await t.close();
});

describe('Team is staff only', () => {
  it('lists owners, tuners and dealer users, never customers, for the owner and tuners', async () => {
    for (const person of [w.people.owner, w.people.tuner]) {
      const members = (await (await signIn(t.app, person.email)).get('/api/members')).body.data as Array<{ role: string; email: string }>;
      expect(new Set(members.map((m) => m.role))).toEqual(new Set(['owner', 'tuner', 'dealer']));
      expect(members.map((m) => m.email)).not.toContain(w.people.customer.email);
    }
  });

  it('refuses to make a customer staff, or staff a customer, on the server', async () => {
    const second = await createMember(t, w.shop, 'tuner');
    const owner = await signIn(t.app, w.people.owner.email);
    const customer = await t.db.selectFrom('memberships').select('id').where('user_id', '=', w.people.customer.id).executeTakeFirstOrThrow();
    for (const role of ['tuner', 'owner', 'dealer']) {
      const res = await owner.patch(`/api/members/${customer.id}`).send({ role, dealerId: w.dealer.id });
      expect(res.status).toBe(404);
    }
    expect((await owner.post(`/api/members/${customer.id}/deactivate`)).status).toBe(404);

    const tuner = ((await owner.get('/api/members')).body.data as Array<{ id: string; email: string }>).find((m) => m.email === second.email)!;
    const demote = await owner.patch(`/api/members/${tuner.id}`).send({ role: 'customer' });
    expect(demote.status).toBe(400);
    expect(demote.body.error.message).toMatch(/cannot be made a customer/);
    const after = await t.db.selectFrom('memberships').select('role').where('id', '=', tuner.id).executeTakeFirstOrThrow();
    expect(after.role).toBe('tuner');
    // Staff roles still change among themselves.
    expect((await owner.patch(`/api/members/${tuner.id}`).send({ role: 'dealer', dealerId: w.dealer.id })).status).toBe(200);
  });
});
