import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createCustomer, createJob, createPackage, createShop, type TestJob, type TestShop } from '../../testing/factories';
import { createTestApp, signIn, type TestApp } from '../../testing/test-app';

// The Customers list's "money paid" reads customer_summaries, kept by the payment writers in their transaction: a
// Checkout payment landing (once, however often its event arrives) and each refund. Every check compares the summary
// and the list with the sum of the customer's payment and refund rows, computed here.

let t: TestApp;
let shop: TestShop;
let job: TestJob;

beforeAll(async () => {
  t = await createTestApp({}, { stripe: true });
  shop = await createShop(t);
  const customer = await createCustomer(t, shop, { name: 'Sam Paid' });
  job = await createJob(t, shop, { customer, package: await createPackage(t, shop, { name: 'Stage 1', retailPriceMinor: 50_000, dealerPriceMinor: 40_000 }) });
});
afterAll(() => t.close());

/** The summary row, and the customer's net paid summed from the payment and refund rows themselves. */
async function summaryAndRows() {
  const summary = await t.db.selectFrom('customer_summaries').selectAll().where('shop_id', '=', shop.id).where('customer_user_id', '=', job.customer.id).executeTakeFirst();
  const payments = await t.db.selectFrom('payments').select(['id', 'amount_minor']).where('job_id', '=', job.id).where('status', '=', 'paid').execute();
  const refunds = await t.db.selectFrom('payment_refunds').select('amount_minor').where('payment_id', 'in', [...payments.map((p) => p.id), '']).execute();
  const paid = payments.reduce((sum, p) => sum + p.amount_minor, 0);
  const refunded = refunds.reduce((sum, r) => sum + r.amount_minor, 0);
  return { summary, paid, refunded };
}

async function listedPaid(): Promise<number> {
  const owner = await signIn(t.app, shop.owner.email);
  const rows = (await owner.get('/api/customers?sort=paid&dir=desc&pageSize=100')).body.data as Array<{ id: string; paidMinor: number }>;
  return rows.find((r) => r.id === job.customer.id)!.paidMinor;
}

describe('customer summaries', () => {
  it('a Checkout payment adds to the summary once, even when its event is delivered three times', async () => {
    expect((await summaryAndRows()).summary).toBeUndefined();
    const customer = await signIn(t.app, job.customer.email);
    const started = await customer.post('/api/billing/checkout').send({ purpose: 'job', jobId: job.id });
    expect(started.status).toBe(200);
    const { origin, pathname } = new URL(started.body.url);
    await request(origin).post(pathname).type('form').send({ card: '4242 4242 4242 4242', action: 'pay' });
    const fake = t.stripe!.control;
    await fake.settle();
    const completed = fake.deliveries().find((d) => d.type === 'checkout.session.completed')!;
    fake.resendEvent(completed.eventId);
    fake.resendEvent(completed.eventId);
    await fake.settle();

    const { summary, paid, refunded } = await summaryAndRows();
    expect(paid).toBe(50_000);
    expect(summary).toMatchObject({ paid_minor: paid, refunded_minor: refunded });
    expect(await listedPaid()).toBe(paid - refunded);
  });

  it('each refund comes off the summary in the same change; a repeated request comes off once', async () => {
    const owner = await signIn(t.app, shop.owner.email);
    const payment = await t.db.selectFrom('payments').select('id').where('job_id', '=', job.id).where('status', '=', 'paid').executeTakeFirstOrThrow();
    const refund = { amountMinor: 12_000, reason: 'Second round not needed', requestId: 'req-summary-0001' };
    expect((await owner.post(`/api/billing/payments/${payment.id}/refunds`).send(refund)).status).toBe(200);
    expect((await owner.post(`/api/billing/payments/${payment.id}/refunds`).send(refund)).status).toBe(200);
    let { summary, paid, refunded } = await summaryAndRows();
    expect(refunded).toBe(12_000);
    expect(summary).toMatchObject({ paid_minor: paid, refunded_minor: refunded });
    expect(await listedPaid()).toBe(38_000);

    expect((await owner.post(`/api/billing/payments/${payment.id}/refunds`).send({ ...refund, amountMinor: 38_000, requestId: 'req-summary-0002' })).status).toBe(200);
    ({ summary, paid, refunded } = await summaryAndRows());
    expect(summary).toMatchObject({ paid_minor: 50_000, refunded_minor: 50_000 });
    expect(await listedPaid()).toBe(paid - refunded);
    expect(await listedPaid()).toBe(0);
  });

  it('a refused refund (nothing is left to refund) leaves the summary as it was', async () => {
    const owner = await signIn(t.app, shop.owner.email);
    const payment = await t.db.selectFrom('payments').select('id').where('job_id', '=', job.id).where('status', '=', 'paid').executeTakeFirstOrThrow();
    const before = (await summaryAndRows()).summary;
    expect((await owner.post(`/api/billing/payments/${payment.id}/refunds`).send({ amountMinor: 1, reason: 'Too much', requestId: 'req-summary-0003' })).status).toBe(409);
    expect((await summaryAndRows()).summary).toEqual(before);
  });
});
