import Stripe from 'stripe';
import { describe, expect, it } from 'vitest';
import { useHarness, WEBHOOK_SECRET } from './test-support';

const h = useHarness();

async function paymentSession(extra: Partial<Stripe.Checkout.SessionCreateParams> = {}) {
  const product = await h.stripe.products.create({ name: 'Stage 2 calibration' });
  const price = await h.stripe.prices.create({ product: product.id, unit_amount: 3000, currency: 'usd' });
  return h.stripe.checkout.sessions.create({
    mode: 'payment',
    line_items: [
      { price: price.id, quantity: 2 },
      { price_data: { currency: 'usd', unit_amount: 1500, product_data: { name: 'Datalog review' } }, quantity: 1 },
    ],
    customer_email: 'driver@owner.test',
    client_reference_id: 'job_42',
    metadata: { jobId: 'job_42' },
    payment_intent_data: { metadata: { jobId: 'job_42' } },
    success_url: 'http://127.0.0.1:5173/pay/done?session={CHECKOUT_SESSION_ID}',
    cancel_url: 'http://127.0.0.1:5173/pay/cancelled',
    ...extra,
  });
}

describe('stripe fake: checkout in payment mode', () => {
  it('pays through the hosted page and delivers a verifiable checkout.session.completed', async () => {
    const session = await paymentSession();
    expect(session).toMatchObject({ object: 'checkout.session', status: 'open', payment_status: 'unpaid', amount_total: 7500, currency: 'usd' });
    expect(session.id).toMatch(/^cs_test_/);
    expect(session.url).toBe(`${h.fake.url}/checkout/${session.id}`);

    const page = await h.http().get(`/checkout/${session.id}`);
    expect(page.status).toBe(200);
    expect(page.text).toContain('Local test payment page');
    expect(page.text).toContain('Stage 2 calibration');
    expect(page.text).toContain('75.00 USD');
    expect(page.text).toContain('value="4242 4242 4242 4242"');

    const paid = await h.submitCheckout(session.id);
    expect(paid.status).toBe(303);
    expect(paid.headers.location).toBe(`http://127.0.0.1:5173/pay/done?session=${session.id}`);

    const done = await h.stripe.checkout.sessions.retrieve(session.id, { expand: ['payment_intent', 'line_items'] });
    expect(done).toMatchObject({ status: 'complete', payment_status: 'paid', client_reference_id: 'job_42', customer_details: { email: 'driver@owner.test' } });
    const intent = done.payment_intent as Stripe.PaymentIntent;
    expect(intent).toMatchObject({ object: 'payment_intent', status: 'succeeded', amount: 7500, amount_received: 7500, metadata: { jobId: 'job_42' } });
    expect(done.line_items?.data.map((line) => [line.description, line.quantity, line.amount_total])).toEqual([
      ['Stage 2 calibration', 2, 6000],
      ['Datalog review', 1, 1500],
    ]);

    await h.fake.control.settle();
    const [completed] = h.receiver.ofType('checkout.session.completed');
    expect(completed).toBeDefined();
    if (!completed) return;
    const event = h.stripe.webhooks.constructEvent(completed.body, completed.signature, WEBHOOK_SECRET);
    expect(event.type).toBe('checkout.session.completed');
    expect((event.data.object as Stripe.Checkout.Session).id).toBe(session.id);
    expect(() => h.stripe.webhooks.constructEvent(completed.body, completed.signature, 'whsec_someone_else')).toThrow(
      Stripe.errors.StripeSignatureVerificationError,
    );
    expect(h.receiver.ofType('payment_intent.succeeded')).toHaveLength(1);

    const stored = await h.stripe.events.retrieve(event.id);
    expect(stored).toMatchObject({ id: event.id, type: 'checkout.session.completed', livemode: false });
    const listed = await h.stripe.events.list({ type: 'payment_intent.succeeded' });
    expect(listed.data).toHaveLength(1);
  });

  it('shows a decline, leaves the session open, and lets the buyer pay after', async () => {
    const session = await paymentSession();
    const declined = await h.submitCheckout(session.id, 'decline');
    expect(declined.status).toBe(402);
    expect(declined.text).toContain('Your card was declined.');
    expect(declined.text).toContain('href="http://127.0.0.1:5173/pay/cancelled"');
    const typed = await h.submitCheckout(session.id, 'pay', '4000 0000 0000 0002');
    expect(typed.status).toBe(402);

    const open = await h.stripe.checkout.sessions.retrieve(session.id);
    expect(open).toMatchObject({ status: 'open', payment_status: 'unpaid' });
    const failed = await h.stripe.paymentIntents.retrieve(open.payment_intent as string);
    expect(failed).toMatchObject({ status: 'requires_payment_method', last_payment_error: { code: 'card_declined', decline_code: 'generic_decline' } });

    expect((await h.submitCheckout(session.id)).status).toBe(303);
    const intent = await h.stripe.paymentIntents.retrieve(failed.id);
    expect(intent.status).toBe('succeeded');
    const charges = await h.stripe.charges.list({ payment_intent: intent.id });
    expect(charges.data.map((c) => c.status)).toEqual(['succeeded', 'failed', 'failed']);

    await h.fake.control.settle();
    expect(h.receiver.ofType('payment_intent.payment_failed')).toHaveLength(2);
    expect(h.receiver.ofType('checkout.session.completed')).toHaveLength(1);
  });

  it('refunds partially, then fully, and refuses to over-refund', async () => {
    const session = await paymentSession();
    await h.submitCheckout(session.id);
    const { payment_intent: intentId } = await h.stripe.checkout.sessions.retrieve(session.id);
    if (typeof intentId !== 'string') throw new Error('expected a payment intent id');

    const partial = await h.stripe.refunds.create({ payment_intent: intentId, amount: 2000, reason: 'requested_by_customer', metadata: { why: 'goodwill' } });
    expect(partial).toMatchObject({ object: 'refund', amount: 2000, status: 'succeeded', payment_intent: intentId, reason: 'requested_by_customer' });
    expect(partial.id).toMatch(/^re_/);

    const tooMuch = await h.stripe.refunds.create({ payment_intent: intentId, amount: 6000 }).catch((err: unknown) => err);
    expect(tooMuch).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect(tooMuch).toMatchObject({ statusCode: 400, param: 'amount' });

    const rest = await h.stripe.refunds.create({ payment_intent: intentId });
    expect(rest.amount).toBe(5500);
    const charge = await h.stripe.charges.retrieve(rest.charge as string);
    expect(charge).toMatchObject({ amount_refunded: 7500, refunded: true });
    await expect(h.stripe.refunds.create({ payment_intent: intentId, amount: 1 })).rejects.toMatchObject({ code: 'charge_already_refunded' });

    const refunds = await h.stripe.refunds.list({ payment_intent: intentId });
    expect(refunds.data.map((r) => r.amount)).toEqual([5500, 2000]);
    await h.fake.control.settle();
    const refundedEvents = h.receiver.ofType('charge.refunded').map((w) => w.event.data.object as Stripe.Charge);
    const [firstRefunded] = h.receiver.ofType('charge.refunded');
    expect(firstRefunded?.event.request).toMatchObject({ id: expect.stringMatching(/^req_/), idempotency_key: expect.any(String) });
    expect(refundedEvents.map((c) => [c.amount_refunded, c.refunded])).toEqual([
      [2000, false],
      [7500, true],
    ]);
  });

  it('validates the session parameters', async () => {
    const price = await h.stripe.prices.create({ product_data: { name: 'Plan' }, unit_amount: 100, currency: 'usd', recurring: { interval: 'month' } });
    await expect(h.stripe.checkout.sessions.create({ mode: 'payment', line_items: [{ price: price.id, quantity: 1 }] })).rejects.toMatchObject({
      statusCode: 400,
      param: 'line_items[0][price]',
    });
    const customer = await h.stripe.customers.create({ email: 'x@shop.test' });
    await expect(
      h.stripe.checkout.sessions.create({ mode: 'subscription', line_items: [{ price: price.id, quantity: 1 }], customer: customer.id, customer_email: 'y@shop.test' }),
    ).rejects.toMatchObject({ statusCode: 400 });
    await expect(h.stripe.checkout.sessions.create({ mode: 'payment', line_items: [{ price: 'price_nope', quantity: 1 }] })).rejects.toMatchObject({
      statusCode: 404,
      code: 'resource_missing',
    });
  });

  it('lists sessions by customer', async () => {
    const customer = await h.stripe.customers.create({ email: 'list@shop.test' });
    const mine = await paymentSession({ customer: customer.id, customer_email: undefined });
    await paymentSession();
    const list = await h.stripe.checkout.sessions.list({ customer: customer.id });
    expect(list.data.map((s) => s.id)).toEqual([mine.id]);
  });
});

describe('stripe fake: setup mode, customer creation, lists', () => {
  it('saves a card for an existing customer', async () => {
    const customer = await h.stripe.customers.create({ email: 'card@shop.test' });
    const session = await h.stripe.checkout.sessions.create({ mode: 'setup', customer: customer.id, currency: 'usd', success_url: 'http://127.0.0.1:5173/ok' });
    expect(session).toMatchObject({ mode: 'setup', payment_status: 'no_payment_required', amount_total: null });
    expect((await h.submitCheckout(session.id)).headers.location).toBe('http://127.0.0.1:5173/ok');
    const done = await h.stripe.checkout.sessions.retrieve(session.id, { expand: ['setup_intent'] });
    expect(done.setup_intent).toMatchObject({ object: 'setup_intent', status: 'succeeded', customer: customer.id });
    const updated = await h.stripe.customers.retrieve(customer.id);
    expect(updated).toMatchObject({ invoice_settings: { default_payment_method: expect.stringMatching(/^pm_/) } });
  });

  it('creates a customer in payment mode when asked to', async () => {
    const session = await paymentSession({ customer_creation: 'always' });
    await h.submitCheckout(session.id);
    const done = await h.stripe.checkout.sessions.retrieve(session.id, { expand: ['customer'] });
    expect(done.customer).toMatchObject({ object: 'customer', email: 'driver@owner.test' });
  });

  it('lists payment intents by customer', async () => {
    const customer = await h.stripe.customers.create({ email: 'pi@shop.test' });
    const session = await paymentSession({ customer: customer.id, customer_email: undefined });
    await h.submitCheckout(session.id);
    await paymentSession().then((other) => h.submitCheckout(other.id));
    const intents = await h.stripe.paymentIntents.list({ customer: customer.id });
    expect(intents.data.map((pi) => [pi.customer, pi.status])).toEqual([[customer.id, 'succeeded']]);
  });
});

describe('stripe fake: webhook delivery', () => {
  it('retries a failing endpoint with backoff and logs each attempt', async () => {
    h.receiver.failNext(2, 'checkout.session.completed');
    const session = await paymentSession();
    await h.submitCheckout(session.id);
    await h.fake.control.settle();
    const attempts = h.fake.control.deliveries().filter((d) => d.type === 'checkout.session.completed');
    expect(attempts.map((d) => [d.attempt, d.status, d.ok])).toEqual([
      [1, 500, false],
      [2, 500, false],
      [3, 200, true],
    ]);
    expect(h.receiver.ofType('checkout.session.completed')).toHaveLength(1);
  });

  it('gives up after the last retry', async () => {
    h.receiver.failNext(100);
    const session = await paymentSession();
    await h.submitCheckout(session.id);
    await h.fake.control.settle();
    h.receiver.failNext(0);
    const completed = h.fake.control.deliveries().filter((d) => d.type === 'checkout.session.completed');
    expect(completed.map((d) => d.attempt)).toEqual([1, 2, 3]);
    expect(completed.every((d) => !d.ok)).toBe(true);
  });

  it('re-sends an event with the same id, and releases held events in reverse', async () => {
    h.fake.control.holdDeliveries();
    const session = await paymentSession();
    await h.submitCheckout(session.id);
    await h.fake.control.settle();
    expect(h.receiver.received).toHaveLength(0);
    h.fake.control.releaseDeliveries('reverse');
    await h.fake.control.settle();
    const types = h.receiver.received.map((w) => w.event.type);
    expect(types[0]).toBe('checkout.session.completed');
    expect(types.at(-1)).toBe('charge.succeeded');

    const completedId = h.receiver.received[0]?.event.id ?? '';
    h.fake.control.resendEvent(completedId);
    await h.fake.control.settle();
    expect(h.receiver.received.filter((w) => w.event.id === completedId)).toHaveLength(2);
  });
});
