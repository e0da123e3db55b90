import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createCustomer, createDealer, createMember, createPlatformAdmin, createShop, createSubscription } from '../../testing/factories';
import { createTestApp, linkFromMail, signIn, TEST_PASSWORD, type TestApp } from '../../testing/test-app';

let t: TestApp;
let w: Awaited<ReturnType<typeof world>>;

/** Two shops: one with a person in every role, and one on two paid Workshop seats with an owner, a tuner and a customer. */
async function world() {
  const shop = await createShop(t, { name: 'Bench Works' });
  const dealer = await createDealer(t, shop);
  const other = await createShop(t, { name: 'Other Dyno' });
  await createSubscription(t, other, { planId: 'workshop', seats: 2 });
  return {
    shop,
    dealer,
    owner: shop.owner,
    tuner: await createMember(t, shop, 'tuner'),
    tuner2: await createMember(t, shop, 'tuner'),
    dealerUser: await createMember(t, shop, 'dealer', { dealer }),
    customer: await createCustomer(t, shop),
    other,
    otherOwner: other.owner,
    otherTuner: await createMember(t, other, 'tuner'),
    otherCustomer: await createCustomer(t, other),
    admin: await createPlatformAdmin(t),
  };
}

beforeEach(async () => {
  t = await createTestApp();
  w = await world();
});
afterEach(async () => {
  await t.close();
});

describe('invitations', () => {
  it('an owner invites a tuner who accepts through the mailed link and is signed in', async () => {
    const owner = await signIn(t.app, w.owner.email);
    const sent = await owner.post('/api/invitations').send({ email: 'new.tuner@bench.test', role: 'tuner' });
    expect(sent.status).toBe(201);
    const pending = await owner.get('/api/invitations');
    expect(pending.body.data.map((i: { email: string }) => i.email)).toContain('new.tuner@bench.test');

    const link = linkFromMail(t.mailbox, 'new.tuner@bench.test');
    const token = link.split('/invitations/')[1]!;
    const lookup = await request(t.app).get(`/api/invitations/lookup/${token}`);
    expect(lookup.body.data).toMatchObject({ email: 'new.tuner@bench.test', role: 'tuner', shopName: 'Bench Works' });

    const tuner = request.agent(t.app);
    const accepted = await tuner.post('/api/invitations/accept').send({ token, name: 'Nia Tuner', password: 'tuner-password-1' });
    expect(accepted.status).toBe(200);
    expect(accepted.body).toMatchObject({ role: 'tuner', user: { email: 'new.tuner@bench.test', name: 'Nia Tuner' } });
    expect((await tuner.get('/api/me')).body.role).toBe('tuner');

    const reuse = await request(t.app).post('/api/invitations/accept').send({ token, name: 'X', password: 'another-password' });
    expect(reuse.status).toBe(404);
    await signIn(t.app, 'new.tuner@bench.test', 'tuner-password-1');
  });

  it('expires invitations after seven days and lets the owner revoke one', async () => {
    const owner = await signIn(t.app, w.owner.email);
    await owner.post('/api/invitations').send({ email: 'late@bench.test', role: 'customer' });
    const token = linkFromMail(t.mailbox, 'late@bench.test').split('/invitations/')[1]!;
    t.clock.advance(7 * 86_400_000 + 1);
    expect((await request(t.app).get(`/api/invitations/lookup/${token}`)).status).toBe(404);

    const again = await (await signIn(t.app, w.owner.email)).post('/api/invitations').send({ email: 'revoked@bench.test', role: 'customer' });
    const owner2 = await signIn(t.app, w.owner.email);
    expect((await owner2.delete(`/api/invitations/${again.body.data.id}`)).status).toBe(204);
    const revokedToken = linkFromMail(t.mailbox, 'revoked@bench.test').split('/invitations/')[1]!;
    expect((await request(t.app).get(`/api/invitations/lookup/${revokedToken}`)).status).toBe(404);
  });

  it('needs a dealer for a dealer user, and refuses a dealer of another shop', async () => {
    const owner = await signIn(t.app, w.otherOwner.email);
    const noDealer = await owner.post('/api/invitations').send({ email: 'd@other.test', role: 'dealer' });
    expect(noDealer.status).toBe(400);
    const foreignDealer = await owner.post('/api/invitations').send({ email: 'd@other.test', role: 'dealer', dealerId: w.dealer.id });
    expect(foreignDealer.status).toBe(400);
  });

  it('keeps owners and tuners within the plan’s paid seats', async () => {
    // The other shop pays for 2 Workshop seats and has an owner and a tuner.
    const owner = await signIn(t.app, w.otherOwner.email);
    const refused = await owner.post('/api/invitations').send({ email: 'third@other.test', role: 'tuner' });
    expect(refused.status).toBe(402);
    expect(refused.body.error.message).toMatch(/seats of the Workshop plan are taken/);
    // Customers take no seat.
    expect((await owner.post('/api/invitations').send({ email: 'driver@other.test', role: 'customer' })).status).toBe(201);
    // Raising a tuner seat through a customer is impossible: customers are not Team members (team-staff.api.test.ts).
  });

  it('lets only owners invite', async () => {
    for (const email of [w.tuner.email, w.dealerUser.email, w.customer.email]) {
      const agent = await signIn(t.app, email);
      expect((await agent.post('/api/invitations').send({ email: 'x@bench.test', role: 'tuner' })).status).toBe(403);
    }
  });
});

describe('members', () => {
  it('lists members for the owner and tuners, not for dealers or customers', async () => {
    const owner = await signIn(t.app, w.owner.email);
    const list = await owner.get('/api/members');
    expect(list.status).toBe(200);
    expect(list.body.meta.total).toBe(list.body.data.length);
    const emails = list.body.data.map((m: { email: string }) => m.email);
    expect(emails).toContain(w.dealerUser.email);
    expect(emails).not.toContain(w.otherOwner.email);
    expect((await (await signIn(t.app, w.tuner.email)).get('/api/members')).status).toBe(200);
    expect((await (await signIn(t.app, w.dealerUser.email)).get('/api/members')).status).toBe(403);
    expect((await (await signIn(t.app, w.customer.email)).get('/api/members')).status).toBe(403);
  });

  it('changes a role and deactivation ends the member’s sessions at once', async () => {
    const owner = await signIn(t.app, w.owner.email);
    const tuner = await signIn(t.app, w.tuner2.email);
    const members = (await owner.get('/api/members')).body.data as Array<{ id: string; email: string }>;
    const target = members.find((m) => m.email === w.tuner2.email)!;
    const off = await owner.post(`/api/members/${target.id}/deactivate`);
    expect(off.status).toBe(200);
    expect(off.body.data.status).toBe('deactivated');
    expect((await tuner.get('/api/me')).status).toBe(401);
    expect((await request(t.app).post('/api/auth/sign-in').send({ email: w.tuner2.email, password: TEST_PASSWORD })).status).toBe(403);
    expect((await owner.post(`/api/members/${target.id}/reactivate`)).body.data.status).toBe('active');
    const promoted = await owner.patch(`/api/members/${target.id}`).send({ role: 'owner' });
    expect(promoted.body.data.role).toBe('owner');
  });

  it('keeps the last owner and refuses changing oneself', async () => {
    const owner = await signIn(t.app, w.otherOwner.email);
    const me = (await owner.get('/api/members')).body.data.find((m: { email: string }) => m.email === w.otherOwner.email);
    expect((await owner.post(`/api/members/${me.id}/deactivate`)).status).toBe(400);
  });
});

describe('platform admin', () => {
  it('lists shops for the platform admin only', async () => {
    const admin = await signIn(t.app, w.admin.email);
    const res = await admin.get('/api/admin/shops');
    expect(res.status).toBe(200);
    expect(res.body.data.map((s: { name: string }) => s.name).sort()).toEqual(['Bench Works', 'Other Dyno']);
    expect(res.body.data.find((s: { name: string }) => s.name === 'Bench Works')).toMatchObject({
      owner: { email: w.owner.email },
      status: 'active',
    });
    for (const email of [w.owner.email, w.tuner.email, w.dealerUser.email, w.customer.email]) {
      expect((await (await signIn(t.app, email)).get('/api/admin/shops')).status).toBe(403);
    }
    expect((await request(t.app).get('/api/admin/shops')).status).toBe(401);
  });

  it('creates a shop and invites its owner', async () => {
    const admin = await signIn(t.app, w.admin.email);
    const res = await admin.post('/api/admin/shops').send({ name: 'Summit Tuning', ownerName: 'Kim Ode', ownerEmail: 'kim@summit.test' });
    expect(res.status).toBe(201);
    const token = linkFromMail(t.mailbox, 'kim@summit.test').split('/invitations/')[1]!;
    const accepted = await request(t.app).post('/api/invitations/accept').send({ token, name: 'Kim Ode', password: 'summit-owner-pw' });
    expect(accepted.body).toMatchObject({ role: 'owner', shop: { name: 'Summit Tuning' } });
  });

  it('suspends a shop: its members read but cannot write, with a read-only flag; reactivation restores it', async () => {
    const admin = await signIn(t.app, w.admin.email);
    const owner = await signIn(t.app, w.owner.email);
    expect((await admin.post(`/api/admin/shops/${w.shop.id}/suspend`)).body.data.status).toBe('suspended');
    const me = await owner.get('/api/me');
    expect(me.body.shop).toMatchObject({ status: 'suspended', readOnly: true });
    expect((await owner.get('/api/members')).status).toBe(200);
    const write = await owner.post('/api/invitations').send({ email: 'x@bench.test', role: 'tuner' });
    expect(write.status).toBe(403);
    expect(write.body.error.code).toBe('shop_read_only');
    await signIn(t.app, w.tuner.email);
    await admin.post(`/api/admin/shops/${w.shop.id}/reactivate`);
    expect((await owner.post('/api/invitations').send({ email: 'x@bench.test', role: 'tuner' })).status).toBe(201);
  });
});

describe('another shop’s ids answer 404', () => {
  it('on every foundation route that takes an id', async () => {
    const harborOwner = await signIn(t.app, w.otherOwner.email);
    const kestrelOwner = await signIn(t.app, w.owner.email);
    const kMembers = (await kestrelOwner.get('/api/members')).body.data as Array<{ id: string; email: string }>;
    const kTuner = kMembers.find((m) => m.email === w.tuner.email)!;
    const inv = await kestrelOwner.post('/api/invitations').send({ email: 'k@bench.test', role: 'customer' });

    const probes = [
      harborOwner.patch(`/api/members/${kTuner.id}`).send({ role: 'customer' }),
      harborOwner.post(`/api/members/${kTuner.id}/deactivate`),
      harborOwner.post(`/api/members/${kTuner.id}/reactivate`),
      harborOwner.delete(`/api/invitations/${inv.body.data.id}`),
      harborOwner.get(`/api/dealers/${w.dealer.id}`),
    ];
    for (const res of await Promise.all(probes)) {
      expect(res.status).toBe(404);
      expect(res.body.error.code).toBe('not_found');
    }
    expect((await kestrelOwner.get('/api/members')).body.data.find((m: { id: string }) => m.id === kTuner.id).status).toBe('active');
  });

  it('a dealer reads its own dealer account only', async () => {
    const dealer = await signIn(t.app, w.dealerUser.email);
    const own = await dealer.get(`/api/dealers/${w.dealer.id}`);
    expect(own.status).toBe(200);
    expect((await dealer.get('/api/dealers')).body.data).toHaveLength(1);
    const owner = await signIn(t.app, w.owner.email);
    const other = await owner.post('/api/dealers').send({ name: 'Second Garage', contactName: 'Lee', contactEmail: 'lee@second.test' });
    expect((await dealer.get(`/api/dealers/${other.body.data.id}`)).status).toBe(404);
  });
});
