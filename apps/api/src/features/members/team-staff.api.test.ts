import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createDemoTestApp } from '../../testing/demo-fixture';
import { signIn } from '../../testing/test-app';

let t: Awaited<ReturnType<typeof createDemoTestApp>>;
beforeEach(async () => {
  t = await createDemoTestApp();
});
afterEach(async () => {
  await t.close();
});

describe('Team is staff only', () => {
  it('lists owners, tuners and dealer users, never customers, for the owner and tuners', async () => {
    for (const email of ['owner@kestrel.test', 'tuner@kestrel.test']) {
      const members = (await (await signIn(t.app, email)).get('/api/members')).body.data as Array<{ role: string; email: string }>;
      expect(new Set(members.map((m) => m.role))).toEqual(new Set(['owner', 'tuner', 'dealer']));
      expect(members.map((m) => m.email)).not.toContain('customer@kestrel.test');
    }
  });

  it('refuses to make a customer staff, or staff a customer, on the server', async () => {
    const owner = await signIn(t.app, 'owner@kestrel.test');
    const customer = await t.db
      .selectFrom('memberships')
      .innerJoin('users', 'users.id', 'memberships.user_id')
      .select('memberships.id')
      .where('users.email', '=', 'customer@kestrel.test')
      .executeTakeFirstOrThrow();
    for (const role of ['tuner', 'owner', 'dealer']) {
      const res = await owner.patch(`/api/members/${customer.id}`).send({ role, dealerId: t.ids.kestrel.dealerId });
      expect(res.status).toBe(404);
    }
    expect((await owner.post(`/api/members/${customer.id}/deactivate`)).status).toBe(404);

    const tuner = ((await owner.get('/api/members')).body.data as Array<{ id: string; email: string }>).find((m) => m.email === 'tuner2@kestrel.test')!;
    const demote = await owner.patch(`/api/members/${tuner.id}`).send({ role: 'customer' });
    expect(demote.status).toBe(400);
    expect(demote.body.error.message).toMatch(/cannot be made a customer/);
    const after = await t.db.selectFrom('memberships').select('role').where('id', '=', tuner.id).executeTakeFirstOrThrow();
    expect(after.role).toBe('tuner');
    // Staff roles still change among themselves.
    expect((await owner.patch(`/api/members/${tuner.id}`).send({ role: 'dealer', dealerId: t.ids.kestrel.dealerId })).status).toBe(200);
  });
});
