import type Stripe from 'stripe';
import { describe, expect, it } from 'vitest';
import { createMonthlyPrice, startHarness, useHarness } from './test-support';

const DAY = 86_400;
/** A fixed wall clock on the 31st, so only advanceTime moves fake time and month ends get clamped. */
const JAN_31_2030 = Date.UTC(2030, 0, 31, 12);
const at = (month: number, day: number) => Date.UTC(2030, month, day, 12) / 1000;

const h = useHarness({ now: () => JAN_31_2030 });

async function subscribe(options: { trialDays?: number; quantity?: number } = {}) {
  const price = await createMonthlyPrice(h.stripe);
  const session = await h.stripe.checkout.sessions.create({
    mode: 'subscription',
    line_items: [{ price: price.id, quantity: options.quantity ?? 1 }],
    customer_email: 'owner@shop.test',
    client_reference_id: 'shop_7',
    success_url: 'http://127.0.0.1:5173/billing?session={CHECKOUT_SESSION_ID}',
    subscription_data: { metadata: { shopId: 'shop_7' }, ...(options.trialDays ? { trial_period_days: options.trialDays } : {}) },
  });
  expect((await h.submitCheckout(session.id)).status).toBe(303);
  const done = await h.stripe.checkout.sessions.retrieve(session.id);
  if (typeof done.subscription !== 'string' || typeof done.customer !== 'string') throw new Error('checkout did not create a subscription');
  return { price, session: done, subscriptionId: done.subscription, customerId: done.customer };
}

async function eventTypes(): Promise<string[]> {
  await h.fake.control.settle();
  return h.receiver.received.map((w) => w.event.type);
}

function periodEnd(subscription: Stripe.Subscription): number {
  return subscription.items.data[0]?.current_period_end ?? 0;
}

describe('stripe fake: subscriptions', () => {
  it('starts a trial from checkout, warns before it ends, then bills the first period', async () => {
    const start = h.fake.control.now();
    const { session, subscriptionId, customerId } = await subscribe({ trialDays: 14 });
    expect(session).toMatchObject({ status: 'complete', payment_status: 'no_payment_required', amount_total: 0 });
    const trialing = await h.stripe.subscriptions.retrieve(subscriptionId);
    expect(trialing).toMatchObject({ status: 'trialing', customer: customerId, metadata: { shopId: 'shop_7' }, trial_start: start, trial_end: start + 14 * DAY });
    expect(periodEnd(trialing)).toBe(start + 14 * DAY);
    expect(await eventTypes()).toEqual(
      expect.arrayContaining(['customer.subscription.created', 'invoice.paid', 'checkout.session.completed']),
    );
    const trialInvoice = await h.stripe.invoices.retrieve(trialing.latest_invoice as string);
    expect(trialInvoice).toMatchObject({ status: 'paid', amount_due: 0, billing_reason: 'subscription_create' });

    h.receiver.received.length = 0;
    h.fake.control.advanceTime(12 * DAY);
    expect(await eventTypes()).toEqual(['customer.subscription.trial_will_end']);

    h.fake.control.advanceTime(2 * DAY + 60);
    const types = await eventTypes();
    expect(types).toEqual(expect.arrayContaining(['customer.subscription.updated', 'invoice.created', 'invoice.finalized', 'invoice.paid', 'payment_intent.succeeded']));
    const active = await h.stripe.subscriptions.retrieve(subscriptionId);
    expect(active.status).toBe('active');
    const paid = h.receiver.ofType('invoice.paid')[0]?.event.data.object as Stripe.Invoice;
    expect(paid).toMatchObject({ status: 'paid', amount_paid: 4900, billing_reason: 'subscription_cycle', customer: customerId });
    expect(paid.parent?.subscription_details?.subscription).toBe(subscriptionId);
    expect(paid.id).toBe(active.latest_invoice);

    const invoices = await h.stripe.invoices.list({ subscription: subscriptionId });
    expect(invoices.data.map((i) => [i.billing_reason, i.amount_paid, i.status])).toEqual([
      ['subscription_cycle', 4900, 'paid'],
      ['subscription_create', 0, 'paid'],
    ]);
    const byCustomer = await h.stripe.subscriptions.list({ customer: customerId });
    expect(byCustomer.data.map((s) => s.id)).toEqual([subscriptionId]);
  });

  it('charges at once without a trial and renews each month', async () => {
    const { session, subscriptionId } = await subscribe({ quantity: 2 });
    expect(session).toMatchObject({ payment_status: 'paid', amount_total: 9800 });
    const first = await h.stripe.subscriptions.retrieve(subscriptionId);
    expect(first.status).toBe('active');
    expect(periodEnd(first)).toBe(at(1, 28));
    h.fake.control.advanceTime(periodEnd(first) - h.fake.control.now() + 1);
    const renewed = await h.stripe.subscriptions.retrieve(subscriptionId);
    expect(renewed.items.data[0]).toMatchObject({ current_period_start: at(1, 28), current_period_end: at(2, 31) });
    const invoices = await h.stripe.invoices.list({ subscription: subscriptionId });
    expect(invoices.data.map((i) => i.amount_paid)).toEqual([9800, 9800]);
  });

  it('fails a renewal, goes past_due, and returns to active when the invoice is paid', async () => {
    const { subscriptionId, customerId } = await subscribe({ trialDays: 7 });
    h.fake.control.failNextPayment(subscriptionId);
    h.receiver.received.length = 0;
    h.fake.control.advanceTime(7 * DAY + 1);

    const types = await eventTypes();
    expect(types).toEqual(expect.arrayContaining(['invoice.payment_failed', 'payment_intent.payment_failed']));
    const pastDue = await h.stripe.subscriptions.retrieve(subscriptionId);
    expect(pastDue.status).toBe('past_due');
    const invoice = await h.stripe.invoices.retrieve(pastDue.latest_invoice as string);
    expect(invoice).toMatchObject({ status: 'open', attempt_count: 1, amount_remaining: 4900 });
    expect(invoice.next_payment_attempt).toBeGreaterThan(h.fake.control.now());
    const updates = h.receiver.ofType('customer.subscription.updated').map((w) => w.event.data);
    expect(updates.at(-1)).toMatchObject({ object: { status: 'past_due' }, previous_attributes: { status: 'active' } });

    h.receiver.received.length = 0;
    const paid = await h.stripe.invoices.pay(invoice.id);
    expect(paid).toMatchObject({ status: 'paid', amount_paid: 4900, attempt_count: 2 });
    expect((await h.stripe.subscriptions.retrieve(subscriptionId)).status).toBe('active');
    expect(await eventTypes()).toEqual(expect.arrayContaining(['invoice.paid', 'customer.subscription.updated']));
    const customerInvoices = await h.stripe.invoices.list({ customer: customerId, status: 'paid' });
    expect(customerInvoices.data).toHaveLength(2);
  });

  it('answers a declined invoice payment with a 402 card error', async () => {
    const { subscriptionId, customerId } = await subscribe({ trialDays: 7 });
    h.fake.control.failNextPayment(customerId);
    h.fake.control.advanceTime(7 * DAY + 1);
    const invoiceId = (await h.stripe.subscriptions.retrieve(subscriptionId)).latest_invoice as string;
    h.fake.control.failNextPayment(customerId);
    await expect(h.stripe.invoices.pay(invoiceId)).rejects.toMatchObject({ type: 'StripeCardError', statusCode: 402, code: 'card_declined' });
  });

  it('retries automatically and restores active when a retry succeeds', async () => {
    const { subscriptionId } = await subscribe({ trialDays: 7 });
    h.fake.control.failNextPayment(subscriptionId);
    h.fake.control.advanceTime(7 * DAY + 1);
    expect((await h.stripe.subscriptions.retrieve(subscriptionId)).status).toBe('past_due');
    h.fake.control.advanceTime(3 * DAY);
    expect((await h.stripe.subscriptions.retrieve(subscriptionId)).status).toBe('active');
  });

  it('cancels the subscription when every retry fails', async () => {
    const { subscriptionId } = await subscribe({ trialDays: 7 });
    // failNextPayment covers one attempt, so it is set again before each scheduled retry.
    h.fake.control.failNextPayment(subscriptionId);
    h.fake.control.advanceTime(7 * DAY + 1);
    for (const days of [3, 5, 7]) {
      h.fake.control.failNextPayment(subscriptionId);
      h.fake.control.advanceTime(days * DAY);
    }
    const ended = await h.stripe.subscriptions.retrieve(subscriptionId);
    expect(ended).toMatchObject({ status: 'canceled', cancellation_details: { reason: 'payment_failed' } });
    expect(await eventTypes()).toContain('customer.subscription.deleted');
    expect(h.receiver.ofType('invoice.payment_failed')).toHaveLength(4);
    expect((await h.stripe.subscriptions.list({ customer: ended.customer as string })).data).toHaveLength(0);
    expect((await h.stripe.subscriptions.list({ customer: ended.customer as string, status: 'all' })).data).toHaveLength(1);
  });

  it('updates quantity and price, with the next invoice at the new amount', async () => {
    const { subscriptionId, price } = await subscribe();
    const current = await h.stripe.subscriptions.retrieve(subscriptionId);
    const item = current.items.data[0];
    if (!item) throw new Error('no item');
    const bigger = await h.stripe.prices.create({ product: price.product as string, unit_amount: 9900, currency: 'usd', recurring: { interval: 'month' } });
    const updated = await h.stripe.subscriptions.update(subscriptionId, {
      items: [{ id: item.id, price: bigger.id, quantity: 3 }],
      proration_behavior: 'none',
      metadata: { plan: 'max' },
    });
    expect(updated.items.data.map((i) => [i.price.id, i.quantity])).toEqual([[bigger.id, 3]]);
    expect(updated.metadata).toEqual({ shopId: 'shop_7', plan: 'max' });
    await h.fake.control.settle();
    const change = h.receiver.ofType('customer.subscription.updated').at(-1)?.event.data;
    expect(change?.previous_attributes).toHaveProperty('items');

    h.fake.control.advanceTime(periodEnd(updated) - h.fake.control.now() + 1);
    const invoices = await h.stripe.invoices.list({ subscription: subscriptionId, limit: 1 });
    expect(invoices.data[0]).toMatchObject({ amount_paid: 29700, billing_reason: 'subscription_cycle' });

    await expect(h.stripe.subscriptions.update(subscriptionId, { items: [{ id: 'si_nope', quantity: 1 }] })).rejects.toMatchObject({ statusCode: 404 });
  });

  it('cancels at period end, or at once', async () => {
    const { subscriptionId } = await subscribe();
    const scheduled = await h.stripe.subscriptions.update(subscriptionId, { cancel_at_period_end: true });
    expect(scheduled).toMatchObject({ status: 'active', cancel_at_period_end: true, cancel_at: periodEnd(scheduled) });
    h.fake.control.advanceTime(periodEnd(scheduled) - h.fake.control.now());
    expect((await h.stripe.subscriptions.retrieve(subscriptionId)).status).toBe('canceled');
    expect(await eventTypes()).toContain('customer.subscription.deleted');
    expect((await h.stripe.invoices.list({ subscription: subscriptionId })).data).toHaveLength(1);

    const other = await subscribe();
    const canceled = await h.stripe.subscriptions.cancel(other.subscriptionId);
    expect(canceled).toMatchObject({ status: 'canceled', cancellation_details: { reason: 'cancellation_requested' } });
    expect(canceled.ended_at).toBe(h.fake.control.now());
    await expect(h.stripe.subscriptions.cancel(other.subscriptionId)).rejects.toMatchObject({ statusCode: 400 });
  });

  it('refuses a declined card at checkout without creating a subscription', async () => {
    const price = await createMonthlyPrice(h.stripe);
    const session = await h.stripe.checkout.sessions.create({ mode: 'subscription', line_items: [{ price: price.id, quantity: 1 }], customer_email: 'x@shop.test' });
    expect((await h.submitCheckout(session.id, 'decline')).status).toBe(402);
    expect((await h.stripe.checkout.sessions.retrieve(session.id)).status).toBe('open');
    expect((await h.stripe.subscriptions.list({ status: 'all' })).data).toHaveLength(0);
  });
});

describe('stripe fake: dunning set to mark unpaid', () => {
  it('marks the subscription unpaid after the last retry fails', async () => {
    const other = await startHarness({ now: () => JAN_31_2030, afterFailedRetries: 'mark_unpaid' });
    try {
      const price = await createMonthlyPrice(other.stripe);
      const session = await other.stripe.checkout.sessions.create({
        mode: 'subscription',
        line_items: [{ price: price.id, quantity: 1 }],
        customer_email: 'late@shop.test',
        subscription_data: { trial_period_days: 1 },
      });
      await other.submitCheckout(session.id);
      const subscriptionId = (await other.stripe.checkout.sessions.retrieve(session.id)).subscription as string;
      for (const days of [1, 3, 5, 7]) {
        other.fake.control.failNextPayment(subscriptionId);
        other.fake.control.advanceTime(days * DAY + 1);
      }
      expect((await other.stripe.subscriptions.retrieve(subscriptionId)).status).toBe('unpaid');
    } finally {
      await other.close();
    }
  });
});

describe('stripe fake: control over HTTP', () => {
  it('advances time, fails payments and resets through /_control', async () => {
    const { subscriptionId } = await subscribe({ trialDays: 3 });
    expect((await h.http().post('/_control/fail-next-payment').send({ id: subscriptionId })).status).toBe(200);
    const before = (await h.http().get('/_control/now')).body as { now: number };
    const advanced = await h.http().post('/_control/advance-time').send({ seconds: 3 * DAY + 1 });
    expect(advanced.body).toEqual({ now: before.now + 3 * DAY + 1 });
    expect((await h.stripe.subscriptions.retrieve(subscriptionId)).status).toBe('past_due');

    await h.http().post('/_control/deliveries/settle');
    const deliveries = (await h.http().get('/_control/deliveries')).body as { data: { type: string; ok: boolean }[] };
    expect(deliveries.data.some((d) => d.type === 'invoice.payment_failed' && d.ok)).toBe(true);

    const missing = await h.http().post('/_control/fail-next-payment').send({ id: 'cus_nope' });
    expect(missing.status).toBe(404);
    await h.http().post('/_control/reset');
    await expect(h.stripe.subscriptions.retrieve(subscriptionId)).rejects.toMatchObject({ statusCode: 404 });
  });
});
