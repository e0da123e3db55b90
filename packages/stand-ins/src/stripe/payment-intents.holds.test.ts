import Stripe from 'stripe';
import { describe, expect, it } from 'vitest';
import { saveCardThroughCheckout, startHarness, useHarness, WEBHOOK_SECRET } from './test-support';

const HOUR = 3600;
const DAY = 24 * HOUR;
// [3P] Stripe docs, "Place a hold on a payment method": an online card authorisation the customer makes is held
// 7 days; a merchant-initiated one on Visa about 5 days (4 days 18 hours), after which it is released.
const CUSTOMER_INITIATED_HOLD = 7 * DAY;
const VISA_MERCHANT_INITIATED_HOLD = 4 * DAY + 18 * HOUR;

// A fixed wall clock, so only the test clock moves time and the hold windows can be checked to the second.
const WALL_MS = Date.UTC(2026, 11, 2, 12);
const h = useHarness({ now: () => WALL_MS });

/** A 250.00 USD deposit held on a test Visa card, the customer present. */
async function placeHold(amount = 25_000) {
  const customer = await h.stripe.customers.create({ email: 'renter@owner.test' });
  const intent = await h.stripe.paymentIntents.create({
    amount,
    currency: 'usd',
    customer: customer.id,
    payment_method: 'pm_card_visa',
    capture_method: 'manual',
    confirm: true,
    metadata: { purpose: 'deposit' },
  });
  return { customer, intent };
}

async function stripeError(promise: Promise<unknown>): Promise<Stripe.errors.StripeError> {
  const err = await promise.then(
    () => undefined,
    (e: unknown) => e,
  );
  expect(err).toBeInstanceOf(Stripe.errors.StripeError);
  return err as Stripe.errors.StripeError;
}

describe('stand-in: PaymentIntents with manual capture', () => {
  it('authorises without charging: requires_capture, nothing received, a signed amount_capturable_updated event', async () => {
    const { intent } = await placeHold();
    expect(intent).toMatchObject({ status: 'requires_capture', capture_method: 'manual', amount: 25_000, amount_capturable: 25_000, amount_received: 0 });
    const charge = await h.stripe.charges.retrieve(intent.latest_charge as string);
    expect(charge).toMatchObject({ captured: false, paid: true, amount_captured: 0, status: 'succeeded' });
    expect(charge.payment_method_details?.card?.capture_before).toBe(intent.created + CUSTOMER_INITIATED_HOLD);

    await h.fake.control.settle();
    const [updated] = h.receiver.ofType('payment_intent.amount_capturable_updated');
    expect(updated).toBeDefined();
    const event = h.stripe.webhooks.constructEvent(updated!.body, updated!.signature, WEBHOOK_SECRET);
    expect(event.data.object).toMatchObject({ id: intent.id, amount_capturable: 25_000, status: 'requires_capture' });
    expect(h.receiver.ofType('payment_intent.succeeded')).toHaveLength(0);
  });

  it('captures part of the hold and releases the rest', async () => {
    const { intent } = await placeHold();
    const captured = await h.stripe.paymentIntents.capture(intent.id, { amount_to_capture: 8_000 });
    expect(captured).toMatchObject({ status: 'succeeded', amount: 25_000, amount_received: 8_000, amount_capturable: 0 });
    const charge = await h.stripe.charges.retrieve(intent.latest_charge as string);
    // The released 170.00 shows as refunded on the charge; only the captured 80.00 can still be refunded.
    expect(charge).toMatchObject({ captured: true, amount_captured: 8_000, amount_refunded: 17_000, refunded: false });
    const refundTooMuch = await stripeError(h.stripe.refunds.create({ payment_intent: intent.id, amount: 8_001 }));
    expect(refundTooMuch).toMatchObject({ type: 'StripeInvalidRequestError', code: 'amount_too_large' });

    await h.fake.control.settle();
    const [succeeded] = h.receiver.ofType('payment_intent.succeeded');
    expect(succeeded?.event.data.object).toMatchObject({ id: intent.id, amount_received: 8_000 });
    expect(h.receiver.ofType('charge.captured')).toHaveLength(1);
  });

  it('captures the whole authorised amount when no amount is given', async () => {
    const { intent } = await placeHold();
    const captured = await h.stripe.paymentIntents.capture(intent.id);
    expect(captured).toMatchObject({ status: 'succeeded', amount_received: 25_000 });
  });

  it('refuses to capture more than was authorised, and leaves the hold in place', async () => {
    const { intent } = await placeHold();
    const err = await stripeError(h.stripe.paymentIntents.capture(intent.id, { amount_to_capture: 25_001 }));
    expect(err).toMatchObject({ type: 'StripeInvalidRequestError', statusCode: 400, code: 'amount_too_large', param: 'amount_to_capture' });
    expect(await h.stripe.paymentIntents.retrieve(intent.id)).toMatchObject({ status: 'requires_capture', amount_capturable: 25_000 });
  });

  it('cancels to release the hold, then refuses a capture', async () => {
    const { intent } = await placeHold();
    const canceled = await h.stripe.paymentIntents.cancel(intent.id, { cancellation_reason: 'requested_by_customer' });
    expect(canceled).toMatchObject({ status: 'canceled', cancellation_reason: 'requested_by_customer', amount_capturable: 0, amount_received: 0 });
    expect(canceled.canceled_at).toBe(h.fake.control.now());
    const charge = await h.stripe.charges.retrieve(intent.latest_charge as string);
    expect(charge).toMatchObject({ captured: false, amount_refunded: 25_000, refunded: true });

    const err = await stripeError(h.stripe.paymentIntents.capture(intent.id));
    expect(err).toMatchObject({ type: 'StripeInvalidRequestError', code: 'payment_intent_unexpected_state' });
    expect(err.raw).toMatchObject({ payment_intent: { id: intent.id, status: 'canceled' } });
    const again = await stripeError(h.stripe.paymentIntents.cancel(intent.id));
    expect(again.code).toBe('payment_intent_unexpected_state');

    await h.fake.control.settle();
    expect(h.receiver.ofType('payment_intent.canceled').map((w) => w.event.data.object)).toMatchObject([{ id: intent.id, cancellation_reason: 'requested_by_customer' }]);
  });

  it('refuses to cancel a payment that has already been captured', async () => {
    const { intent } = await placeHold();
    await h.stripe.paymentIntents.capture(intent.id);
    const err = await stripeError(h.stripe.paymentIntents.cancel(intent.id));
    expect(err).toMatchObject({ code: 'payment_intent_unexpected_state', statusCode: 400 });
  });

  it('declines a hold on a declining card with a 402 that names the intent', async () => {
    const customer = await h.stripe.customers.create({ email: 'renter@owner.test' });
    const err = await stripeError(
      h.stripe.paymentIntents.create({ amount: 25_000, currency: 'usd', customer: customer.id, payment_method: 'pm_card_chargeDeclined', capture_method: 'manual', confirm: true }),
    );
    expect(err).toMatchObject({ type: 'StripeCardError', statusCode: 402, code: 'card_declined', decline_code: 'generic_decline' });
    const intentId = (err.raw as { payment_intent?: { id: string } }).payment_intent?.id as string;
    expect(await h.stripe.paymentIntents.retrieve(intentId)).toMatchObject({ status: 'requires_payment_method', amount_capturable: 0 });
  });

  it('creates, then confirms in a second call', async () => {
    const intent = await h.stripe.paymentIntents.create({ amount: 5_000, currency: 'usd', capture_method: 'manual' });
    expect(intent).toMatchObject({ status: 'requires_payment_method', capture_method: 'manual' });
    const confirmed = await h.stripe.paymentIntents.confirm(intent.id, { payment_method: 'pm_card_mastercard' });
    expect(confirmed).toMatchObject({ status: 'requires_capture', amount_capturable: 5_000 });
    const err = await stripeError(h.stripe.paymentIntents.confirm(intent.id, { payment_method: 'pm_card_visa' }));
    expect(err.code).toBe('payment_intent_unexpected_state');
  });
});

describe('stand-in: a hold lapses on the test clock', () => {
  it('releases a customer-initiated hold after 7 days with reason automatic and a payment_intent.canceled event [3P]', async () => {
    const { intent } = await placeHold();
    h.fake.control.advanceTime(CUSTOMER_INITIATED_HOLD - 1);
    expect(await h.stripe.paymentIntents.retrieve(intent.id)).toMatchObject({ status: 'requires_capture' });

    h.fake.control.advanceTime(1);
    const lapsed = await h.stripe.paymentIntents.retrieve(intent.id);
    expect(lapsed).toMatchObject({ status: 'canceled', cancellation_reason: 'automatic', amount_capturable: 0 });
    expect(lapsed.canceled_at).toBe(intent.created + CUSTOMER_INITIATED_HOLD);

    const err = await stripeError(h.stripe.paymentIntents.capture(intent.id, { amount_to_capture: 1_000 }));
    expect(err).toMatchObject({ code: 'payment_intent_unexpected_state' });

    await h.fake.control.settle();
    const [canceled] = h.receiver.ofType('payment_intent.canceled');
    const event = h.stripe.webhooks.constructEvent(canceled!.body, canceled!.signature, WEBHOOK_SECRET);
    expect(event.data.object).toMatchObject({ id: intent.id, status: 'canceled', cancellation_reason: 'automatic' });
  });

  it('gives a merchant-initiated hold on a saved Visa 4 days 18 hours [3P]', async () => {
    const { customer, card } = await saveCardThroughCheckout(h);
    const intent = await h.stripe.paymentIntents.create({
      amount: 25_000,
      currency: 'usd',
      customer: customer.id,
      payment_method: card!.id,
      capture_method: 'manual',
      off_session: true,
      confirm: true,
    });
    const charge = await h.stripe.charges.retrieve(intent.latest_charge as string);
    expect(charge.payment_method_details?.card?.capture_before).toBe(intent.created + VISA_MERCHANT_INITIATED_HOLD);

    h.fake.control.advanceTime(VISA_MERCHANT_INITIATED_HOLD);
    expect(await h.stripe.paymentIntents.retrieve(intent.id)).toMatchObject({ status: 'canceled', cancellation_reason: 'automatic' });
  });

  it('treats a hold as lapsed when the wall clock passed its window, without a test-clock step', async () => {
    let wallMs = WALL_MS;
    const own = await startHarness({ now: () => wallMs });
    try {
      const customer = await own.stripe.customers.create({ email: 'renter@owner.test' });
      const intent = await own.stripe.paymentIntents.create({ amount: 9_000, currency: 'usd', customer: customer.id, payment_method: 'pm_card_visa', capture_method: 'manual', confirm: true });
      wallMs += CUSTOMER_INITIATED_HOLD * 1000;
      const err = await stripeError(own.stripe.paymentIntents.capture(intent.id));
      expect(err.code).toBe('payment_intent_unexpected_state');
      expect(await own.stripe.paymentIntents.retrieve(intent.id)).toMatchObject({ status: 'canceled', cancellation_reason: 'automatic' });
    } finally {
      await own.close();
    }
  });
});
