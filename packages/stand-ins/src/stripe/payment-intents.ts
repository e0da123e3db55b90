import { Router } from 'express';
import { cardError, consumeFailure } from './cards';
import { invalidRequest, missingParam, StripeFakeError } from './errors';
import { filtered, id, matches, params, type ApiContext } from './http';
import { formatAmount } from './money';
import type { Decline, FakeCard, FakeCharge, FakePaymentIntent, Metadata } from './objects';
import { allowOnly, applyMetadata, optBool, optEnum, optInt, optNullableString, optString, reqString } from './params';
import { resolvePaymentMethod } from './payment-methods';
import { changedFields, newId, paginate, type FakeState } from './state';

const HOUR = 3600;
const DAY = 24 * HOUR;
/**
 * How long a card authorisation holds before it lapses: 7 days for an online payment the customer makes,
 * 4 days 18 hours for a merchant-initiated one on Visa (the provider's "Place a hold on a payment method").
 */
export const HOLD_WINDOW_SECONDS = { customerInitiated: 7 * DAY, merchantInitiatedVisa: 4 * DAY + 18 * HOUR } as const;

const CANCELABLE = ['requires_payment_method', 'requires_capture', 'requires_confirmation', 'requires_action', 'processing'];
type CaptureMethod = 'automatic' | 'automatic_async' | 'manual';

export function newPaymentIntent(
  state: FakeState,
  fields: { amount: number; currency: string; customer: string | null; description: string | null; metadata: Metadata; captureMethod?: CaptureMethod },
): FakePaymentIntent {
  const intent: FakePaymentIntent = {
    id: newId('pi_'),
    object: 'payment_intent',
    amount: fields.amount,
    amount_capturable: 0,
    amount_received: 0,
    canceled_at: null,
    cancellation_reason: null,
    capture_method: fields.captureMethod ?? 'automatic_async',
    client_secret: null,
    confirmation_method: 'automatic',
    created: state.now(),
    currency: fields.currency,
    customer: fields.customer,
    description: fields.description,
    last_payment_error: null,
    latest_charge: null,
    livemode: false,
    metadata: fields.metadata,
    next_action: null,
    payment_method: null,
    payment_method_types: ['card'],
    receipt_email: null,
    setup_future_usage: null,
    statement_descriptor: null,
    status: 'requires_payment_method',
  };
  intent.client_secret = `${intent.id}_secret_${newId('', 24)}`;
  state.paymentIntents.set(intent.id, intent);
  return intent;
}

interface PaymentInput {
  amount: number;
  currency: string;
  customer: string | null;
  subscription?: string | null;
  card: FakeCard;
  cardDecline: Decline | null;
  paymentMethod: string;
  description: string | null;
  metadata: Metadata;
  intent?: FakePaymentIntent;
  captureMethod?: CaptureMethod;
  /** A merchant-initiated charge of a saved card, as `off_session: true` marks it. */
  offSession?: boolean;
}

interface PaymentResult {
  intent: FakePaymentIntent;
  charge: FakeCharge;
  decline: Decline | null;
}

/** One confirmation: charges the card, or with manual capture only authorises it and starts the hold's clock. */
export function attemptPayment(state: FakeState, input: PaymentInput): PaymentResult {
  const now = state.now();
  const intent = input.intent ?? newPaymentIntent(state, { ...input, ...(input.captureMethod ? { captureMethod: input.captureMethod } : {}) });
  const manual = intent.capture_method === 'manual';
  const decline = input.cardDecline ?? consumeFailure(state, [input.customer, input.subscription]);
  const customerEmail = input.customer ? (state.customers.get(input.customer)?.email ?? null) : null;
  const holdSeconds = input.offSession && input.card.brand === 'visa' ? HOLD_WINDOW_SECONDS.merchantInitiatedVisa : HOLD_WINDOW_SECONDS.customerInitiated;
  const charge: FakeCharge = {
    id: newId('ch_'),
    object: 'charge',
    amount: input.amount,
    amount_captured: decline || manual ? 0 : input.amount,
    amount_refunded: 0,
    balance_transaction: null,
    captured: !decline && !manual,
    created: now,
    currency: input.currency,
    customer: input.customer,
    description: input.description,
    disputed: false,
    failure_code: decline?.code ?? null,
    failure_message: decline?.message ?? null,
    livemode: false,
    metadata: {},
    outcome: decline
      ? { network_status: 'declined_by_network', reason: decline.declineCode, seller_message: 'The bank did not return any further details with this decline.', type: 'issuer_declined' }
      : { network_status: 'approved_by_network', reason: null, seller_message: 'Payment complete.', type: 'authorized' },
    paid: !decline,
    payment_intent: intent.id,
    payment_method: input.paymentMethod,
    payment_method_details: { type: 'card', card: { ...input.card, ...(manual && !decline ? { capture_before: now + holdSeconds } : {}) } },
    receipt_email: customerEmail,
    receipt_url: null,
    refunded: false,
    status: decline ? 'failed' : 'succeeded',
  };
  state.charges.set(charge.id, charge);
  intent.latest_charge = charge.id;
  intent.payment_method = input.paymentMethod;
  if (decline) {
    intent.status = 'requires_payment_method';
    intent.last_payment_error = {
      type: 'card_error',
      code: decline.code,
      decline_code: decline.declineCode,
      message: decline.message,
      charge: charge.id,
      payment_method: { id: input.paymentMethod, object: 'payment_method', type: 'card' },
    };
    state.emit('charge.failed', charge);
    state.emit('payment_intent.payment_failed', intent);
  } else if (manual) {
    intent.status = 'requires_capture';
    intent.amount_capturable = input.amount;
    intent.last_payment_error = null;
    state.emit('charge.succeeded', charge);
    state.emit('payment_intent.amount_capturable_updated', intent);
  } else {
    intent.status = 'succeeded';
    intent.amount_received = input.amount;
    intent.last_payment_error = null;
    state.emit('charge.succeeded', charge);
    state.emit('payment_intent.succeeded', intent);
  }
  return { intent, charge, decline };
}

function unexpectedState(intent: FakePaymentIntent, action: string, allowed: string[]): StripeFakeError {
  return new StripeFakeError(400, {
    type: 'invalid_request_error',
    code: 'payment_intent_unexpected_state',
    message: `You cannot ${action} this PaymentIntent because it has a status of ${intent.status}. Only a PaymentIntent with one of the following statuses may be ${action === 'capture' ? 'captured' : `${action}ed`}: ${allowed.join(', ')}.`,
    payment_intent: { id: intent.id, status: intent.status },
  });
}

function uncapturedCharge(state: FakeState, intent: FakePaymentIntent): FakeCharge | undefined {
  return intent.latest_charge ? state.charges.get(intent.latest_charge) : undefined;
}

/** Takes up to the authorised amount; the rest of the hold is released at once, as the provider does. */
export function capturePaymentIntent(state: FakeState, intent: FakePaymentIntent, amountToCapture?: number): FakePaymentIntent {
  expireHolds(state);
  const charge = uncapturedCharge(state, intent);
  if (intent.status !== 'requires_capture' || !charge) throw unexpectedState(intent, 'capture', ['requires_capture']);
  const amount = amountToCapture ?? intent.amount_capturable;
  if (amount > intent.amount_capturable) {
    throw invalidRequest(
      `The amount to capture (${formatAmount(amount, intent.currency)}) is greater than the amount capturable on this PaymentIntent (${formatAmount(intent.amount_capturable, intent.currency)}).`,
      'amount_to_capture',
      'amount_too_large',
    );
  }
  const before = structuredClone(charge);
  charge.captured = true;
  charge.amount_captured = amount;
  // The released remainder shows as refunded on the charge, so later refunds can take back at most what was captured.
  charge.amount_refunded = charge.amount - amount;
  intent.amount_capturable = 0;
  intent.amount_received = amount;
  intent.status = 'succeeded';
  state.emit('charge.captured', charge, changedFields(before, charge));
  state.emit('payment_intent.succeeded', intent);
  return intent;
}

export function cancelPaymentIntent(state: FakeState, intent: FakePaymentIntent, reason: FakePaymentIntent['cancellation_reason']): FakePaymentIntent {
  if (!CANCELABLE.includes(intent.status)) throw unexpectedState(intent, 'cancel', CANCELABLE);
  const charge = uncapturedCharge(state, intent);
  if (intent.status === 'requires_capture' && charge) {
    charge.amount_refunded = charge.amount;
    charge.refunded = true;
  }
  intent.status = 'canceled';
  intent.amount_capturable = 0;
  intent.canceled_at = state.now();
  intent.cancellation_reason = reason;
  state.emit('payment_intent.canceled', intent);
  return intent;
}

function holdLapsesAt(state: FakeState, intent: FakePaymentIntent): number | null {
  if (intent.status !== 'requires_capture') return null;
  return uncapturedCharge(state, intent)?.payment_method_details.card.capture_before ?? null;
}

/** The earliest moment an open authorisation lapses, for the test clock. */
export function nextHoldExpiry(state: FakeState): number | null {
  let next: number | null = null;
  for (const intent of state.paymentIntents.values()) {
    const lapses = holdLapsesAt(state, intent);
    if (lapses !== null && (next === null || lapses < next)) next = lapses;
  }
  return next;
}

/** Cancels every authorisation whose hold has lapsed, with the reason `automatic`, as the provider does. */
export function expireHolds(state: FakeState): void {
  const now = state.now();
  for (const intent of state.paymentIntents.values()) {
    const lapses = holdLapsesAt(state, intent);
    if (lapses !== null && lapses <= now) cancelPaymentIntent(state, intent, 'automatic');
  }
}

/** Confirms with the named payment method; a decline answers 402 with the intent, like the real API. */
function confirm(state: FakeState, intent: FakePaymentIntent, paymentMethodRef: string | undefined, offSession: boolean): FakePaymentIntent {
  const ref = paymentMethodRef ?? intent.payment_method;
  if (!ref) {
    throw new StripeFakeError(400, {
      type: 'invalid_request_error',
      code: 'payment_intent_unexpected_state',
      message: "You cannot confirm this PaymentIntent because it's missing a payment method. To confirm the PaymentIntent with a payment method, pass `payment_method`.",
      payment_intent: { id: intent.id, status: intent.status },
    });
  }
  const { paymentMethod, decline } = resolvePaymentMethod(state, ref, intent.customer);
  const result = attemptPayment(state, {
    amount: intent.amount,
    currency: intent.currency,
    customer: intent.customer,
    card: paymentMethod.card,
    cardDecline: decline,
    paymentMethod: paymentMethod.id,
    description: intent.description,
    metadata: intent.metadata,
    intent,
    offSession,
  });
  if (result.decline) throw cardError(result.decline, result.intent);
  return result.intent;
}

export function paymentIntentsRouter({ state, send }: ApiContext): Router {
  const router = Router();
  router.post('/payment_intents', (req, res) => {
    const body = params(req);
    allowOnly(body, ['amount', 'currency', 'customer', 'payment_method', 'payment_method_types', 'capture_method', 'confirm', 'off_session', 'description', 'metadata']);
    const amount = optInt(body, 'amount', 1);
    if (amount === undefined) throw missingParam('amount');
    const currency = reqString(body, 'currency').toLowerCase();
    const customer = optString(body, 'customer') ?? null;
    if (customer) state.get(state.customers, 'customer', customer, 'customer');
    const captureMethod = optEnum(body, 'capture_method', ['automatic', 'automatic_async', 'manual'] as const);
    const shouldConfirm = optBool(body, 'confirm') ?? false;
    const offSession = optBool(body, 'off_session');
    if (offSession !== undefined && !shouldConfirm) throw invalidRequest('`off_session` can only be used when `confirm` is true.', 'off_session');
    const paymentMethod = optString(body, 'payment_method');
    // Resolving up front rejects an unknown or foreign payment method before anything is created.
    const resolved = paymentMethod ? resolvePaymentMethod(state, paymentMethod, customer).paymentMethod : undefined;
    const intent = newPaymentIntent(state, {
      amount,
      currency,
      customer,
      description: optNullableString(body, 'description') ?? null,
      metadata: applyMetadata({}, body),
      ...(captureMethod ? { captureMethod } : {}),
    });
    if (resolved) {
      intent.payment_method = resolved.id;
      intent.status = 'requires_confirmation';
    }
    state.emit('payment_intent.created', intent);
    res.json(send(req, shouldConfirm ? confirm(state, intent, resolved?.id, offSession ?? false) : intent));
  });
  router.post('/payment_intents/:id/confirm', (req, res) => {
    const intent = state.get(state.paymentIntents, 'payment_intent', id(req));
    const body = params(req);
    allowOnly(body, ['payment_method', 'off_session']);
    if (intent.status !== 'requires_payment_method' && intent.status !== 'requires_confirmation') {
      throw unexpectedState(intent, 'confirm', ['requires_payment_method', 'requires_confirmation']);
    }
    res.json(send(req, confirm(state, intent, optString(body, 'payment_method'), optBool(body, 'off_session') ?? false)));
  });
  router.post('/payment_intents/:id/capture', (req, res) => {
    const intent = state.get(state.paymentIntents, 'payment_intent', id(req));
    const body = params(req);
    allowOnly(body, ['amount_to_capture', 'metadata']);
    intent.metadata = applyMetadata(intent.metadata, body);
    res.json(send(req, capturePaymentIntent(state, intent, optInt(body, 'amount_to_capture', 1))));
  });
  router.post('/payment_intents/:id/cancel', (req, res) => {
    const intent = state.get(state.paymentIntents, 'payment_intent', id(req));
    const body = params(req);
    allowOnly(body, ['cancellation_reason']);
    const reason = optEnum(body, 'cancellation_reason', ['duplicate', 'fraudulent', 'requested_by_customer', 'abandoned'] as const) ?? null;
    res.json(send(req, cancelPaymentIntent(state, intent, reason)));
  });
  router.get('/payment_intents/:id', (req, res) => {
    res.json(send(req, state.get(state.paymentIntents, 'payment_intent', id(req))));
  });
  router.get('/payment_intents', (req, res) => {
    const query = params(req);
    res.json(send(req, paginate(filtered(state.paymentIntents.values(), (p) => matches(query, 'customer', p.customer)), query, '/v1/payment_intents')));
  });
  router.get('/charges/:id', (req, res) => {
    res.json(send(req, state.get(state.charges, 'charge', id(req))));
  });
  router.get('/charges', (req, res) => {
    const query = params(req);
    const list = filtered(state.charges.values(), (c) => matches(query, 'customer', c.customer) && matches(query, 'payment_intent', c.payment_intent));
    res.json(send(req, paginate(list, query, '/v1/charges')));
  });
  return router;
}
