import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, signIn, type TestApp } from '../../testing/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({}, { stripe: true });
});
afterAll(() => t.close());

const paymentCount = async () => Number((await t.db.selectFrom('payments').select((eb) => eb.fn.countAll().as('n')).executeTakeFirstOrThrow()).n);
const ROLES = ['owner@kestrel.test', 'tuner@kestrel.test', 'dealer@kestrel.test', 'customer@kestrel.test'] as const;

/**
 * A suspended shop, and one whose subscription lapsed (billing read-only), moves no money: no new charge for a job,
 * no dealer top-up, no refund — for any role. The owner may still pay the platform, which restores the shop.
 */
describe.each([
  ['suspended by the platform', { status: 'suspended' as const }, null],
  ['read-only after a lapsed subscription', null, 'payment_overdue' as const],
])('a shop %s', (_label, shopPatch, readOnlyReason) => {
  beforeAll(async () => {
    const shopId = t.ids.kestrel.shopId;
    await t.db.updateTable('shops').set({ status: 'active' }).where('id', '=', shopId).execute();
    await t.db.updateTable('shop_subscriptions').set({ read_only_reason: null }).where('shop_id', '=', shopId).execute();
    if (shopPatch) await t.db.updateTable('shops').set(shopPatch).where('id', '=', shopId).execute();
    if (readOnlyReason) {
      const updated = await t.db.updateTable('shop_subscriptions').set({ read_only_reason: readOnlyReason }).where('shop_id', '=', shopId).executeTakeFirst();
      expect(Number(updated.numUpdatedRows)).toBe(1);
    }
  });

  const directJob = () => t.ids.jobs.find((j) => j.shopId === t.ids.kestrel.shopId && j.dealerId === null && j.state !== 'cancelled' && j.customerUserId === t.ids.kestrel.customerIds[0])!;
  const routes: Array<[string, (agent: Awaited<ReturnType<typeof signIn>>) => Promise<{ status: number; body: { error?: { code: string } } }>]> = [
    ['job checkout', (a) => a.post('/api/billing/checkout').send({ purpose: 'job', jobId: directJob().id })],
    ['dealer top-up', (a) => a.post('/api/billing/checkout').send({ purpose: 'topup', dealerId: t.ids.kestrel.dealerId!, amountMinor: 10_000 })],
    ['refund', async (a) => {
      const payment = await t.db.selectFrom('payments').select('id').where('shop_id', '=', t.ids.kestrel.shopId).executeTakeFirst();
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
        if (email === 'owner@kestrel.test' || (email === 'customer@kestrel.test' && route === 'job checkout') || (email === 'dealer@kestrel.test' && route === 'dealer top-up')) {
          expect(res.body.error?.code).toBe('shop_read_only');
        }
        expect(await paymentCount()).toBe(before);
      });
    }
  }

  it('the payments view offers no pay or refund button', async () => {
    const customer = await signIn(t.app, 'customer@kestrel.test');
    expect((await customer.get(`/api/billing/jobs/${directJob().id}/payments`)).body.data).toMatchObject({ canPay: false, canRefund: false });
  });

  it('the owner may still pay the platform to restore the shop', async () => {
    const owner = await signIn(t.app, 'owner@kestrel.test');
    const res = await owner.post('/api/billing/checkout').send({ purpose: 'payment_method' });
    expect(res.status).toBe(200);
    expect(res.body.url).toEqual(expect.any(String));
  });
});
