import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createCustomer, createDealer, createJob, createMember, createShop, createSubscription, type TestDealer, type TestJob, type TestShop } from '../../testing/factories';
import { createTestApp, signIn, type TestApp } from '../../testing/test-app';

let t: TestApp;
let shop: TestShop;
let dealer: TestDealer;
let job: TestJob;
beforeAll(async () => {
  t = await createTestApp({}, { stripe: true });
  shop = await createShop(t, { ownerEmail: 'owner@bench.test' });
  await createSubscription(t, shop);
  dealer = await createDealer(t, shop);
  await createMember(t, shop, 'tuner', { email: 'tuner@bench.test' });
  await createMember(t, shop, 'dealer', { email: 'dealer@bench.test', dealer });
  const customer = await createCustomer(t, shop, { email: 'customer@bench.test' });
  job = await createJob(t, shop, { customer });
});
afterAll(() => t.close());

const paymentCount = async () => Number((await t.db.selectFrom('payments').select((eb) => eb.fn.countAll().as('n')).executeTakeFirstOrThrow()).n);
const ROLES = ['owner@bench.test', 'tuner@bench.test', 'dealer@bench.test', 'customer@bench.test'] as const;

/**
 * A suspended shop, and one whose subscription lapsed (billing read-only), moves no money: no new charge for a job,
 * no dealer top-up, no refund — for any role. The owner may still pay the platform, which restores the shop.
 */
describe.each([
  ['suspended by the platform', { status: 'suspended' as const }, null],
  ['read-only after a lapsed subscription', null, 'payment_overdue' as const],
])('a shop %s', (_label, shopPatch, readOnlyReason) => {
  beforeAll(async () => {
    const shopId = shop.id;
    await t.db.updateTable('shops').set({ status: 'active' }).where('id', '=', shopId).execute();
    await t.db.updateTable('shop_subscriptions').set({ read_only_reason: null }).where('shop_id', '=', shopId).execute();
    if (shopPatch) await t.db.updateTable('shops').set(shopPatch).where('id', '=', shopId).execute();
    if (readOnlyReason) {
      const updated = await t.db.updateTable('shop_subscriptions').set({ read_only_reason: readOnlyReason }).where('shop_id', '=', shopId).executeTakeFirst();
      expect(Number(updated.numUpdatedRows)).toBe(1);
    }
  });

  const directJob = () => job;
  const routes: Array<[string, (agent: Awaited<ReturnType<typeof signIn>>) => Promise<{ status: number; body: { error?: { code: string } } }>]> = [
    ['job checkout', (a) => a.post('/api/billing/checkout').send({ purpose: 'job', jobId: directJob().id })],
    ['dealer top-up', (a) => a.post('/api/billing/checkout').send({ purpose: 'topup', dealerId: dealer.id, amountMinor: 10_000 })],
    ['refund', async (a) => {
      const payment = await t.db.selectFrom('payments').select('id').where('shop_id', '=', shop.id).executeTakeFirst();
      return a.post(`/api/billing/payments/${payment?.id ?? 'no-payment'}/refunds`).send({ amountMinor: 100, reason: 'Testing a refund', requestId: 'req-read-only-1' });
    }],
  ];

  for (const email of ROLES) {
    for (const [route, call] of routes) {
      it(`${email.split('@')[0]}: ${route} is refused and starts no payment`, async () => {
        const agent = await signIn(t.app, email);
        const before = await paymentCount();
        const res = await call(agent);
        // Roles that may never do this get their usual 403/404; those who could in an active shop get shop_read_only.
        expect([403, 404]).toContain(res.status);
        if (email === 'owner@bench.test' || (email === 'customer@bench.test' && route === 'job checkout') || (email === 'dealer@bench.test' && route === 'dealer top-up')) {
          expect(res.body.error?.code).toBe('shop_read_only');
        }
        expect(await paymentCount()).toBe(before);
      });
    }
  }

  it('the payments view offers no pay or refund button', async () => {
    const customer = await signIn(t.app, 'customer@bench.test');
    expect((await customer.get(`/api/billing/jobs/${directJob().id}/payments`)).body.data).toMatchObject({ canPay: false, canRefund: false });
  });

  it('the owner may still pay the platform to restore the shop', async () => {
    const owner = await signIn(t.app, 'owner@bench.test');
    const res = await owner.post('/api/billing/checkout').send({ purpose: 'payment_method' });
    expect(res.status).toBe(200);
    expect(res.body.url).toEqual(expect.any(String));
  });
});
