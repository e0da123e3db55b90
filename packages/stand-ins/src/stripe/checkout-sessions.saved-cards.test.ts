import type Stripe from 'stripe';
import { describe, expect, it } from 'vitest';
import { saveCardThroughCheckout, useHarness, WEBHOOK_SECRET } from './test-support';

const h = useHarness();

describe('stand-in: Checkout in setup mode', () => {
  it('saves a card: a succeeded SetupIntent, a PaymentMethod attached to the customer, and checkout.session.completed', async () => {
    const { customer, session, submitted } = await saveCardThroughCheckout(h);
    expect(session).toMatchObject({ mode: 'setup', status: 'open', payment_status: 'no_payment_required', amount_total: null });
    expect(submitted.status).toBe(303);

    const done = await h.stripe.checkout.sessions.retrieve(session.id, { expand: ['setup_intent'] });
    expect(done).toMatchObject({ status: 'complete', payment_status: 'no_payment_required', payment_intent: null });
    const setupIntent = done.setup_intent as Stripe.SetupIntent;
    expect(setupIntent).toMatchObject({ object: 'setup_intent', status: 'succeeded', usage: 'off_session', customer: customer.id, metadata: { booking: 'bk_7' } });

    const paymentMethod = await h.stripe.paymentMethods.retrieve(setupIntent.payment_method as string);
    expect(paymentMethod).toMatchObject({ object: 'payment_method', type: 'card', customer: customer.id, card: { brand: 'visa', last4: '4242' } });
    const listed = await h.stripe.customers.listPaymentMethods(customer.id);
    expect(listed.data.map((pm) => pm.id)).toEqual([paymentMethod.id]);
    expect((await h.stripe.paymentMethods.list({ customer: customer.id, type: 'card' })).data).toHaveLength(1);

    await h.fake.control.settle();
    const [completed] = h.receiver.ofType('checkout.session.completed');
    const event = h.stripe.webhooks.constructEvent(completed!.body, completed!.signature, WEBHOOK_SECRET);
    expect(event.data.object).toMatchObject({ id: session.id, mode: 'setup', setup_intent: setupIntent.id, customer: customer.id });
    expect(h.receiver.ofType('setup_intent.succeeded')).toHaveLength(1);
  });

  it('saves nothing when the card is declined', async () => {
    const { customer, submitted } = await saveCardThroughCheckout(h, '4000 0000 0000 0002');
    expect(submitted.status).toBe(402);
    expect((await h.stripe.customers.listPaymentMethods(customer.id)).data).toEqual([]);
  });

  it('refuses line items in setup mode', async () => {
    const err = await h.stripe.checkout.sessions
      .create({ mode: 'setup', line_items: [{ price_data: { currency: 'usd', unit_amount: 100, product_data: { name: 'x' } }, quantity: 1 }] })
      .catch((e: unknown) => e);
    expect(err).toMatchObject({ type: 'StripeInvalidRequestError', param: 'line_items' });
  });
});

describe('stand-in: off-session charge of a saved card', () => {
  it('charges the saved card with off_session and confirm, and delivers payment_intent.succeeded', async () => {
    const { customer, card } = await saveCardThroughCheckout(h);
    const intent = await h.stripe.paymentIntents.create({
      amount: 4_500,
      currency: 'usd',
      customer: customer.id,
      payment_method: card!.id,
      off_session: true,
      confirm: true,
      description: 'Late return, 3 days',
    });
    expect(intent).toMatchObject({ status: 'succeeded', amount_received: 4_500, payment_method: card!.id, customer: customer.id });
    await h.fake.control.settle();
    expect(h.receiver.ofType('payment_intent.succeeded').map((w) => w.event.data.object)).toMatchObject([{ id: intent.id, amount_received: 4_500 }]);
  });

  it('answers a declined off-session charge with a 402 card error naming the intent', async () => {
    const { customer, card } = await saveCardThroughCheckout(h);
    h.fake.control.failNextPayment(customer.id);
    const err = await h.stripe.paymentIntents
      .create({ amount: 4_500, currency: 'usd', customer: customer.id, payment_method: card!.id, off_session: true, confirm: true })
      .catch((e: unknown) => e as Stripe.errors.StripeError);
    expect(err).toMatchObject({ type: 'StripeCardError', statusCode: 402, code: 'card_declined' });
    const intentId = ((err as Stripe.errors.StripeError).raw as { payment_intent?: { id: string } }).payment_intent?.id as string;
    expect(await h.stripe.paymentIntents.retrieve(intentId)).toMatchObject({ status: 'requires_payment_method', last_payment_error: { code: 'card_declined' } });
  });

  it("refuses another customer's saved card and off_session without confirm", async () => {
    const { customer, card } = await saveCardThroughCheckout(h);
    const stranger = await h.stripe.customers.create({ email: 'someone@else.test' });
    const foreign = await h.stripe.paymentIntents
      .create({ amount: 100, currency: 'usd', customer: stranger.id, payment_method: card!.id, off_session: true, confirm: true })
      .catch((e: unknown) => e);
    expect(foreign).toMatchObject({ type: 'StripeInvalidRequestError', param: 'payment_method' });
    const unconfirmed = await h.stripe.paymentIntents
      .create({ amount: 100, currency: 'usd', customer: customer.id, payment_method: card!.id, off_session: true })
      .catch((e: unknown) => e);
    expect(unconfirmed).toMatchObject({ type: 'StripeInvalidRequestError', param: 'off_session' });
  });
});

describe('stand-in: Checkout in payment mode with a manual-capture hold', () => {
  it('authorises through the hosted page, completes the session unpaid, and captures later', async () => {
    const customer = await h.stripe.customers.create({ email: 'renter@owner.test' });
    const session = await h.stripe.checkout.sessions.create({
      mode: 'payment',
      customer: customer.id,
      line_items: [{ price_data: { currency: 'usd', unit_amount: 25_000, product_data: { name: 'Deposit hold' } }, quantity: 1 }],
      payment_intent_data: { capture_method: 'manual', metadata: { rental: 'r_3' } },
      success_url: 'http://127.0.0.1:5173/rentals/3',
    });
    const page = await h.http().get(`/checkout/${session.id}`);
    expect(page.text).toContain('Authorise a hold');
    expect(page.text).toContain('Held on your card');
    expect(page.text).toContain('250.00 USD');
    expect((await h.submitCheckout(session.id)).status).toBe(303);

    const done = await h.stripe.checkout.sessions.retrieve(session.id, { expand: ['payment_intent'] });
    // [MEM] With manual capture the provider completes the session while payment_status stays `unpaid` until capture.
    expect(done).toMatchObject({ status: 'complete', payment_status: 'unpaid' });
    const intent = done.payment_intent as Stripe.PaymentIntent;
    expect(intent).toMatchObject({ status: 'requires_capture', capture_method: 'manual', amount_capturable: 25_000, amount_received: 0, metadata: { rental: 'r_3' } });

    await h.fake.control.settle();
    expect(h.receiver.ofType('checkout.session.completed')).toHaveLength(1);
    expect(h.receiver.ofType('payment_intent.amount_capturable_updated')).toHaveLength(1);
    expect(h.receiver.ofType('payment_intent.succeeded')).toHaveLength(0);

    const captured = await h.stripe.paymentIntents.capture(intent.id, { amount_to_capture: 6_000 });
    expect(captured).toMatchObject({ status: 'succeeded', amount_received: 6_000 });
    await h.fake.control.settle();
    expect(h.receiver.ofType('payment_intent.succeeded')).toHaveLength(1);
  });

  it('rejects an unknown capture_method', async () => {
    const err = await h.stripe.checkout.sessions
      .create({
        mode: 'payment',
        line_items: [{ price_data: { currency: 'usd', unit_amount: 100, product_data: { name: 'x' } }, quantity: 1 }],
        payment_intent_data: { capture_method: 'later' as 'manual' },
      })
      .catch((e: unknown) => e);
    expect(err).toMatchObject({ type: 'StripeInvalidRequestError', param: 'capture_method' });
  });
});
