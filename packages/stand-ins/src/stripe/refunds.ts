import { Router } from 'express';
import { invalidRequest } from './errors';
import { filtered, id, matches, params, type ApiContext } from './http';
import { formatAmount } from './money';
import type { FakeCharge, FakeRefund, Metadata } from './objects';
import { allowOnly, applyMetadata, optEnum, optInt, optString } from './params';
import { changedFields, newId, paginate, type FakeState } from './state';

export function createRefund(
  state: FakeState,
  input: { paymentIntent?: string; charge?: string; amount?: number; reason: FakeRefund['reason']; metadata: Metadata },
): FakeRefund {
  let charge: FakeCharge;
  if (input.charge) charge = state.get(state.charges, 'charge', input.charge, 'charge');
  else if (input.paymentIntent) {
    const intent = state.get(state.paymentIntents, 'payment_intent', input.paymentIntent, 'payment_intent');
    const latest = intent.latest_charge ? state.charges.get(intent.latest_charge) : undefined;
    if (intent.status !== 'succeeded' || !latest) {
      throw invalidRequest(`This PaymentIntent (${intent.id}) does not have a successful charge to refund.`, 'payment_intent');
    }
    charge = latest;
  } else throw invalidRequest('One of the following params should be provided for this request: payment_intent or charge.');
  if (charge.status !== 'succeeded') throw invalidRequest(`Charge ${charge.id} has not succeeded and cannot be refunded.`, 'charge');
  const remaining = charge.amount - charge.amount_refunded;
  if (remaining <= 0) throw invalidRequest(`Charge ${charge.id} has already been refunded.`, undefined, 'charge_already_refunded');
  const amount = input.amount ?? remaining;
  if (amount < 1) throw invalidRequest('Refund amount must be at least 1.', 'amount');
  if (amount > remaining) {
    throw invalidRequest(
      `Refund amount (${formatAmount(amount, charge.currency)}) is greater than unrefunded amount on charge (${formatAmount(remaining, charge.currency)})`,
      'amount',
      'amount_too_large',
    );
  }
  const refund: FakeRefund = {
    id: newId('re_'),
    object: 'refund',
    amount,
    balance_transaction: null,
    charge: charge.id,
    created: state.now(),
    currency: charge.currency,
    metadata: input.metadata,
    payment_intent: charge.payment_intent,
    reason: input.reason,
    receipt_number: null,
    source_transfer_reversal: null,
    status: 'succeeded',
    transfer_reversal: null,
  };
  state.refunds.set(refund.id, refund);
  const before = structuredClone(charge);
  charge.amount_refunded += amount;
  charge.refunded = charge.amount_refunded === charge.amount;
  state.emit('refund.created', refund);
  state.emit('charge.refunded', charge, changedFields(before, charge));
  return refund;
}

export function refundsRouter({ state, send }: ApiContext): Router {
  const router = Router();
  router.post('/refunds', (req, res) => {
    const body = params(req);
    allowOnly(body, ['payment_intent', 'charge', 'amount', 'reason', 'metadata']);
    const paymentIntent = optString(body, 'payment_intent');
    const charge = optString(body, 'charge');
    const amount = optInt(body, 'amount');
    const reason: FakeRefund['reason'] = optEnum(body, 'reason', ['duplicate', 'fraudulent', 'requested_by_customer'] as const) ?? null;
    const refund = createRefund(state, {
      ...(paymentIntent ? { paymentIntent } : {}),
      ...(charge ? { charge } : {}),
      ...(amount !== undefined ? { amount } : {}),
      reason,
      metadata: applyMetadata({}, body),
    });
    res.json(send(req, refund));
  });
  router.get('/refunds/:id', (req, res) => {
    res.json(send(req, state.get(state.refunds, 'refund', id(req))));
  });
  router.get('/refunds', (req, res) => {
    const query = params(req);
    const list = filtered(state.refunds.values(), (r) => matches(query, 'charge', r.charge) && matches(query, 'payment_intent', r.payment_intent));
    res.json(send(req, paginate(list, query, '/v1/refunds')));
  });

  return router;
}

