import Stripe from 'stripe';
import request from 'supertest';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { createCustomer, createJob, createMember, createPackage, createPlatformAdmin, createSubscription, createTwoShops } from '../../testing/factories';
import { createTestApp, signIn, TEST_WEBHOOK_SECRET, type TestApp } from '../../testing/test-app';
import { TEST_VEHICLE } from '../../testing/test-vehicle';

let t: TestApp;
let w: Awaited<ReturnType<typeof world>>;
let stripe: Stripe;

/**
 * A shop with a person in every role, a second direct customer, a customer of the dealer, a direct job and two
 * packages (the second at 699.00 to dealers); another shop on two paid Workshop seats with a tuner and a job
 * ready for the bench; a platform admin. The tests run in order on this one world, as money builds up.
 */
async function world() {
  const two = await createTwoShops(t);
  const { shop, dealer, other } = two;
  await createPackage(t, shop, { name: 'Stage 1', retailPriceMinor: 50_000, dealerPriceMinor: 40_000 });
  await createPackage(t, shop, { name: 'Stage 2', modules: ['ECM', 'TCM'], retailPriceMinor: 89_900, dealerPriceMinor: 69_900 });
  const direct = await createJob(t, shop, { customer: two.people.customer });
  await createSubscription(t, other, { planId: 'workshop', seats: 2, status: 'active' });
  const dealerContact = (await t.db.selectFrom('dealers').select('contact_email').where('id', '=', dealer.id).executeTakeFirstOrThrow()).contact_email;
  return {
    ...two,
    direct,
    dealerContact,
    secondCustomer: await createCustomer(t, shop),
    dealerCustomer: await createCustomer(t, shop, { dealer }),
    otherTuner: await createMember(t, other, 'tuner'),
    otherReady: await createJob(t, other, { state: 'ready' }),
    admin: await createPlatformAdmin(t),
  };
}

beforeAll(async () => {
  t = await createTestApp({}, { stripe: true });
  w = await world();
  stripe = new Stripe('sk_test_revloop', { host: '127.0.0.1', port: Number(new URL(t.stripe!.url).port), protocol: 'http', maxNetworkRetries: 0, telemetry: false });
});
afterAll(() => t.close());
beforeEach(() => {
  t.mailbox.clear();
});

const fake = () => t.stripe!.control;

const DAY = 86_400;

/** Submits the hosted payment page the way the browser form does. */
async function pay(url: string, action: 'pay' | 'decline' = 'pay') {
  const { origin, pathname } = new URL(url);
  const res = await request(origin).post(pathname).type('form').send({ card: '4242 4242 4242 4242', action });
  await fake().settle();
  return res;
}

const mailsTo = (to: string, subject: RegExp) => t.mailbox.list().filter((m) => m.to.includes(to) && subject.test(m.subject));

const directJob = () => w.direct;

function signed(body: string, options: { secret?: string; timestamp?: number } = {}) {
  return stripe.webhooks.generateTestHeaderString({ payload: body, secret: options.secret ?? TEST_WEBHOOK_SECRET, timestamp: options.timestamp ?? Math.floor(t.clock.now().getTime() / 1000) });
}

describe('webhook signature', () => {
  const body = JSON.stringify({ id: 'evt_sig_1', object: 'event', type: 'customer.created', created: 1, data: { object: { id: 'cus_x', object: 'customer' } } });
  const post = (payload: string, signature: string) => request(t.app).post('/api/stripe/webhook').set('content-type', 'application/json').set('stripe-signature', signature).send(payload);

  it('accepts a body signed with the secret, within five minutes', async () => {
    expect((await post(body, signed(body))).status).toBe(200);
  });

  it('refuses a tampered body, another secret and a stale timestamp', async () => {
    const tampered = body.replace('cus_x', 'cus_y');
    expect((await post(tampered, signed(body))).status).toBe(400);
    expect((await post(body, signed(body, { secret: 'whsec_someone_else' }))).status).toBe(400);
    // Stripe's default tolerance is 300 s [3P: Stripe webhook docs]: 301 s old is refused, 299 s is not.
    const now = Math.floor(t.clock.now().getTime() / 1000);
    expect((await post(body, signed(body, { timestamp: now - 301 }))).status).toBe(400);
    expect((await post(body.replace('evt_sig_1', 'evt_sig_2'), signed(body.replace('evt_sig_1', 'evt_sig_2'), { timestamp: now - 299 }))).status).toBe(200);
    const missing = await request(t.app).post('/api/stripe/webhook').set('content-type', 'application/json').send(body);
    expect(missing.status).toBe(400);
  });
});

describe('customer pays a job', () => {
  it('pays once through Checkout even when events repeat and arrive in reverse, with one receipt', async () => {
    const job = directJob();
    const customer = await signIn(t.app, w.people.customer.email);
    const before = (await customer.get(`/api/billing/jobs/${job.id}/payments`)).body.data;
    expect(before).toMatchObject({ canPay: true, canRefund: false, paidMinor: 0 });
    expect(before.dueMinor).toBe(before.priceMinor);

    const started = await customer.post('/api/billing/checkout').send({ purpose: 'job', jobId: job.id });
    expect(started.status).toBe(200);
    // A second click reuses the open session instead of opening a second charge.
    expect((await customer.post('/api/billing/checkout').send({ purpose: 'job', jobId: job.id })).body.url).toBe(started.body.url);

    fake().holdDeliveries();
    expect((await pay(started.body.url)).status).toBe(303);
    fake().releaseDeliveries('reverse');
    await fake().settle();
    const completed = fake().deliveries().find((d) => d.type === 'checkout.session.completed');
    expect(completed?.ok).toBe(true);
    fake().resendEvent(completed!.eventId);
    fake().resendEvent(completed!.eventId);
    await fake().settle();
    expect(fake().deliveries().filter((d) => d.eventId === completed!.eventId)).toHaveLength(3);

    const after = (await customer.get(`/api/billing/jobs/${job.id}/payments`)).body.data;
    expect(after).toMatchObject({ paidMinor: before.priceMinor, dueMinor: 0 });
    expect(after.payments.filter((p: { status: string }) => p.status === 'paid')).toHaveLength(1);
    expect(mailsTo(w.people.customer.email, /^Receipt/)).toHaveLength(1);
    const timeline = await t.db.selectFrom('audit_events').select('details').where('subject_id', '=', job.id).where('action', '=', 'payment.received').execute();
    expect(timeline).toHaveLength(1);
    expect(JSON.parse(timeline[0]!.details).text).toMatch(/^Payment received: \$/);
    expect((await customer.post('/api/billing/checkout').send({ purpose: 'job', jobId: job.id })).status).toBe(409);
  });

  it('refunds part and then the rest with a reason; a repeated request refunds once', async () => {
    const job = directJob();
    const owner = await signIn(t.app, w.shop.owner.email);
    const view = (await owner.get(`/api/billing/jobs/${job.id}/payments`)).body.data;
    const paid = view.payments.find((p: { status: string }) => p.status === 'paid');
    const refund = { amountMinor: 10000, reason: 'Second round not needed', requestId: 'req-refund-0001' };
    const first = await owner.post(`/api/billing/payments/${paid.id}/refunds`).send(refund);
    expect(first.status).toBe(200);
    const again = await owner.post(`/api/billing/payments/${paid.id}/refunds`).send(refund);
    expect(again.status).toBe(200);
    expect(again.body.data.refundedMinor).toBe(10000);
    const intent = (await t.db.selectFrom('payments').select('stripe_payment_intent_id').where('id', '=', paid.id).executeTakeFirstOrThrow()).stripe_payment_intent_id!;
    expect((await stripe.refunds.list({ payment_intent: intent })).data.map((r) => r.amount)).toEqual([10000]);

    const tooMuch = await owner.post(`/api/billing/payments/${paid.id}/refunds`).send({ ...refund, amountMinor: paid.amountMinor, requestId: 'req-refund-0002' });
    expect(tooMuch.status).toBe(400);
    const rest = await owner.post(`/api/billing/payments/${paid.id}/refunds`).send({ ...refund, amountMinor: paid.amountMinor - 10000, requestId: 'req-refund-0003' });
    expect(rest.body.data).toMatchObject({ refundedMinor: paid.amountMinor, dueMinor: paid.amountMinor });
    expect(mailsTo(w.people.customer.email, /^Refund/)).toHaveLength(2);

    const tuner = await signIn(t.app, w.people.tuner.email);
    expect((await tuner.post(`/api/billing/payments/${paid.id}/refunds`).send({ ...refund, requestId: 'req-refund-0004' })).status).toBe(403);
  });
  it('holds a new job until it is paid when the shop asks for it, then releases it', async () => {
    const owner = await signIn(t.app, w.shop.owner.email);
    expect((await owner.patch('/api/shop').send({ settings: { holdUntilPaid: true } })).status).toBe(200);
    const customer = await signIn(t.app, w.secondCustomer.email);
    const me = (await customer.get('/api/me')).body;
    const packageId = (await customer.get('/api/packages')).body.data[0].id as string;
    const opened = await customer.post('/api/jobs').send({ customer: { kind: 'existing', customerUserId: me.user.id }, vehicle: { kind: 'new', vehicle: TEST_VEHICLE }, packageId, goals: 'Hold me', cautionsAccepted: true });
    expect(opened.body.data).toMatchObject({ state: 'on_hold', heldFrom: 'intake' });
    const started = await customer.post('/api/billing/checkout').send({ purpose: 'job', jobId: opened.body.data.id });
    await pay(started.body.url);
    expect((await customer.get(`/api/jobs/${opened.body.data.id}`)).body.data).toMatchObject({ state: 'intake', heldFrom: null });
    await owner.patch('/api/shop').send({ settings: { holdUntilPaid: false } });
  });
});

describe('dealer wholesale', () => {
  it('tops up through Checkout, debits at job opening, refuses a short balance, and lists the statement', async () => {
    const dealerId = w.dealer.id;
    const dealer = await signIn(t.app, w.people.dealer.email);
    const start = (await dealer.get(`/api/dealers/${dealerId}/ledger`)).body.data;
    expect(start.canTopUp).toBe(true);

    const topUp = await dealer.post('/api/billing/checkout').send({ purpose: 'topup', dealerId, amountMinor: 50000 });
    await pay(topUp.body.url);
    const topped = (await dealer.get(`/api/dealers/${dealerId}/ledger`)).body.data;
    expect(topped.balanceMinor).toBe(start.balanceMinor + 50000);
    expect(mailsTo(w.people.dealer.email, /^Receipt/)).toHaveLength(1);

    const customers = (await dealer.get('/api/customers')).body.data as Array<{ id: string }>;
    const packages = (await dealer.get('/api/packages')).body.data as Array<{ id: string }>;
    const pkg = await t.db.selectFrom('packages').selectAll().where('id', '=', packages[0]!.id).executeTakeFirstOrThrow();
    const intake = { customer: { kind: 'existing', customerUserId: customers[0]!.id }, vehicle: { kind: 'new', vehicle: TEST_VEHICLE }, packageId: pkg.id, goals: 'Stage one', cautionsAccepted: true };
    const opened = await dealer.post('/api/jobs').send(intake);
    expect(opened.status).toBe(201);
    const ledger = (await dealer.get(`/api/dealers/${dealerId}/ledger`)).body.data;
    expect(ledger.entries.at(-1)).toMatchObject({ kind: 'job_debit', amountMinor: -pkg.dealer_price_minor, jobId: opened.body.data.id });
    // [CALC] running balance: previous balance minus the dealer price
    expect(ledger.balanceMinor).toBe(topped.balanceMinor - pkg.dealer_price_minor);

    // Drain the balance with an adjustment, then the next job is refused and nothing of it is kept.
    const { appendLedgerEntry } = await import('@revloop/db');
    await appendLedgerEntry(t.db, { shopId: w.shop.id, dealerId, kind: 'adjustment', amountMinor: -(ledger.balanceMinor - 100), currency: 'USD', memo: 'Test drain', at: t.clock.now().toISOString() });
    const jobsBefore = (await t.db.selectFrom('jobs').select((eb) => eb.fn.countAll<number>().as('n')).executeTakeFirstOrThrow()).n;
    const refused = await dealer.post('/api/jobs').send(intake);
    expect(refused.status).toBe(402);
    expect(refused.body.error).toMatchObject({ code: 'insufficient_balance', message: expect.stringMatching(/balance is \$1\.00.*Top up/) });
    expect((await t.db.selectFrom('jobs').select((eb) => eb.fn.countAll<number>().as('n')).executeTakeFirstOrThrow()).n).toBe(jobsBefore);

    const csv = await dealer.get(`/api/dealers/${dealerId}/ledger?format=csv`);
    expect(csv.headers['content-type']).toMatch(/text\/csv/);
    expect(csv.text.split('\r\n')[0]).toBe('Date,Entry,Job,Description,Amount (USD),Balance (USD)');
  });

  it('mails the dealer once when a debit takes the balance below the next job', async () => {
    const dealerId = w.dealer.id;
    const owner = await signIn(t.app, w.shop.owner.email);
    const topUp = await owner.post('/api/billing/checkout').send({ purpose: 'topup', dealerId, amountMinor: 120000 });
    await pay(topUp.body.url);
    const dealer = await signIn(t.app, w.people.dealer.email);
    const customers = (await dealer.get('/api/customers')).body.data as Array<{ id: string }>;
    const pkg = await t.db.selectFrom('packages').selectAll().where('shop_id', '=', w.shop.id).where('dealer_price_minor', '=', 69900).executeTakeFirstOrThrow();
    const intake = { customer: { kind: 'existing', customerUserId: customers[0]!.id }, vehicle: { kind: 'new', vehicle: TEST_VEHICLE }, packageId: pkg.id, goals: 'Both units', cautionsAccepted: true };
    // [CALC] 1.00 + 1,200.00 = 1,201.00; after 699.00 → 502.00 < 699.00: one mail
    expect((await dealer.post('/api/jobs').send(intake)).status).toBe(201);
    expect(mailsTo(w.people.dealer.email, /^Low balance/)).toHaveLength(1);
    expect(mailsTo(w.dealerContact, /^Low balance/)).toHaveLength(1);
  });
});

describe('platform subscription', () => {
  it('subscribes through Checkout, goes read-only after a failed renewal outlasts the grace period, and a new card restores it', async () => {
    const owner = await signIn(t.app, w.other.owner.email);
    const before = (await owner.get('/api/billing/subscription')).body.data;
    expect(before).toMatchObject({ planId: 'workshop', seats: 2, status: 'active', managedByProvider: false });
    expect((await owner.post('/api/billing/checkout').send({ purpose: 'subscription', planId: 'solo', seats: 1 })).status).toBe(400);

    const checkout = await owner.post('/api/billing/checkout').send({ purpose: 'subscription', planId: 'fleet', seats: 5 });
    expect(checkout.status).toBe(200);
    await pay(checkout.body.url);
    const active = (await owner.get('/api/billing/subscription')).body.data;
    // [CALC] Fleet 39.00 × 5 = 195.00 a month
    expect(active).toMatchObject({ planId: 'fleet', seats: 5, status: 'active', managedByProvider: true, monthlyAmountMinor: 19500 });
    expect(active.invoices[0]).toMatchObject({ status: 'paid', amountPaidMinor: 19500 });

    const row = await t.db.selectFrom('shop_subscriptions').selectAll().where('shop_id', '=', w.other.id).executeTakeFirstOrThrow();
    fake().failNextPayment(row.stripe_subscription_id!);
    fake().advanceTime(32 * DAY);
    await fake().settle();
    const pastDue = (await owner.get('/api/billing/subscription')).body.data;
    expect(pastDue).toMatchObject({ status: 'past_due', readOnlyReason: null });
    expect(mailsTo(w.other.owner.email, /^Payment failed/)).toHaveLength(1);
    expect((await owner.get('/api/me')).body.shop.readOnly).toBe(false);

    // Retries 3 and 5 days later fail too: 8 days past due is beyond the 7-day grace period.
    for (const days of [3, 5]) {
      fake().failNextPayment(row.stripe_subscription_id!);
      fake().advanceTime(days * DAY);
      await fake().settle();
    }
    const locked = (await owner.get('/api/billing/subscription')).body.data;
    expect(locked).toMatchObject({ status: 'past_due', readOnlyReason: 'payment_overdue' });
    expect((await owner.get('/api/me')).body.shop.readOnly).toBe(true);
    const tuner = await signIn(t.app, w.otherTuner.email);
    expect((await tuner.post(`/api/jobs/${w.otherReady.id}/take`)).body.error?.code).toBe('shop_read_only');
    expect(mailsTo(w.other.owner.email, /is read-only/)).toHaveLength(1);
    expect(mailsTo(w.other.owner.email, /^Payment failed/)).toHaveLength(1);

    const card = await owner.post('/api/billing/checkout').send({ purpose: 'payment_method' });
    expect(card.status).toBe(200);
    await pay(card.body.url);
    await fake().settle();
    const restored = (await owner.get('/api/billing/subscription')).body.data;
    expect(restored).toMatchObject({ status: 'active', readOnlyReason: null });
    expect((await owner.get('/api/me')).body.shop.readOnly).toBe(false);
    expect(mailsTo(w.other.owner.email, /is open again/)).toHaveLength(1);

    const changed = await owner.post('/api/billing/subscription/plan').send({ planId: 'fleet', seats: 7 });
    expect(changed.body.data).toMatchObject({ seats: 7, monthlyAmountMinor: 27300 });
  });

  it('starts a 14-day trial for a shop created without one, and locks it when the trial ends', async () => {
    const admin = await signIn(t.app, w.admin.email);
    const created = await admin.post('/api/admin/shops').send({ name: 'Trial Garage', ownerName: 'Ty Test', ownerEmail: 'ty@trial.test' });
    expect(created.status).toBe(201);
    const revenue = (await admin.get('/api/admin/revenue')).body.data;
    const trial = revenue.shops.find((s: { shopName: string }) => s.shopName === 'Trial Garage');
    expect(trial).toMatchObject({ status: 'trialing', mrrMinor: 0 });
    // [CALC] created now + 14 × 24 h
    expect(Date.parse(trial.trialEndsAt) - t.clock.now().getTime()).toBeGreaterThan(14 * DAY * 1000 - 60_000);
    t.clock.advance(15 * DAY * 1000);
    const later = (await (await signIn(t.app, w.admin.email)).get('/api/admin/revenue')).body.data;
    expect(later.shops.find((s: { shopName: string }) => s.shopName === 'Trial Garage').readOnlyReason).toBe('trial_ended');
    expect(later.series).toHaveLength(12);
    expect(later.mrrMinor).toBe(later.shops.reduce((sum: number, s: { mrrMinor: number }) => sum + s.mrrMinor, 0));
    t.clock.advance(-15 * DAY * 1000);
  });
});

describe('who may use the billing routes', () => {
  it('follows the role and answers 404 across shops', async () => {
    const dealerId = w.dealer.id;
    const job = directJob();
    const expectations: Array<[string, string, number]> = [
      [w.shop.owner.email, '/api/billing/subscription', 200],
      [w.people.tuner.email, '/api/billing/subscription', 403],
      [w.people.dealer.email, '/api/billing/subscription', 403],
      [w.people.customer.email, '/api/billing/subscription', 403],
      [w.admin.email, '/api/billing/subscription', 403],
      [w.shop.owner.email, `/api/dealers/${dealerId}/ledger`, 200],
      [w.people.dealer.email, `/api/dealers/${dealerId}/ledger`, 200],
      [w.people.tuner.email, `/api/dealers/${dealerId}/ledger`, 404],
      [w.people.customer.email, `/api/dealers/${dealerId}/ledger`, 404],
      [w.other.owner.email, `/api/dealers/${dealerId}/ledger`, 404],
      [w.admin.email, '/api/admin/revenue', 200],
      [w.shop.owner.email, '/api/admin/revenue', 403],
      [w.people.customer.email, `/api/billing/jobs/${job.id}/payments`, 200],
      [w.secondCustomer.email, `/api/billing/jobs/${job.id}/payments`, 404],
      [w.dealerCustomer.email, `/api/billing/jobs/${job.id}/payments`, 404],
      [w.other.owner.email, `/api/billing/jobs/${job.id}/payments`, 404],
      [w.shop.owner.email, `/api/billing/jobs/${job.id}/payments`, 200],
    ];
    for (const [email, path, status] of expectations) {
      const agent = await signIn(t.app, email);
      expect([email, path, (await agent.get(path)).status]).toEqual([email, path, status]);
    }
    const customer = await signIn(t.app, w.people.customer.email);
    expect((await customer.post('/api/billing/checkout').send({ purpose: 'topup', dealerId, amountMinor: 5000 })).status).toBe(404);
    expect((await customer.post('/api/billing/checkout').send({ purpose: 'subscription', planId: 'fleet', seats: 5 })).status).toBe(403);
    const otherOwner = await signIn(t.app, w.other.owner.email);
    expect((await otherOwner.post('/api/billing/checkout').send({ purpose: 'job', jobId: job.id })).status).toBe(404);
    expect((await request(t.app).get('/api/billing/subscription')).status).toBe(401);
  });
});
