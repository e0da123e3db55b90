import { Router } from 'express';
import { cardError, type Decline } from './cards';
import { invalidRequest } from './errors';
import { filtered, id, matches, params, type ApiContext } from './http';
import { formatAmount } from './money';
import type { FakeInvoice, FakeInvoiceLine, FakeInvoicePayment, FakeLineItem, FakePaymentIntent, FakeSubscription, FakeSubscriptionItem } from './objects';
import { allowOnly, optBool } from './params';
import { attemptPayment } from './payment-intents';
import { newId, paginate, type FakeState } from './state';
import { cancelSubscription, DAY, setSubscriptionStatus } from './subscriptions';

/** Days after each failed attempt before the next automatic retry; when they run out, dunning applies. */
const RETRY_AFTER_DAYS = [3, 5, 7];

function invoiceLine(state: FakeState, invoiceId: string, subscription: FakeSubscription, item: FakeSubscriptionItem, trial: boolean): FakeInvoiceLine {
  const productName = state.products.get(item.price.product)?.name ?? item.price.product;
  const unit = item.price.unit_amount ?? 0;
  const amount = trial ? 0 : unit * item.quantity;
  const interval = item.price.recurring?.interval ?? 'period';
  return {
    id: newId('il_'),
    object: 'line_item',
    amount,
    currency: item.price.currency,
    description: trial ? `Trial period for ${productName}` : `${item.quantity} × ${productName} (at ${formatAmount(unit, item.price.currency)} / ${interval})`,
    discountable: true,
    discounts: [],
    invoice: invoiceId,
    livemode: false,
    metadata: {},
    parent: {
      type: 'subscription_item_details',
      subscription_item_details: { invoice_item: null, proration: false, proration_details: null, subscription: subscription.id, subscription_item: item.id },
      invoice_item_details: null,
    },
    period: { start: item.current_period_start, end: item.current_period_end },
    pricing: { type: 'price_details', price_details: { price: item.price.id, product: item.price.product }, unit_amount_decimal: String(unit) },
    quantity: item.quantity,
    subtotal: amount,
  };
}

function oneTimeLine(invoiceId: string, line: FakeLineItem, period: { start: number; end: number }): FakeInvoiceLine {
  return {
    id: newId('il_'),
    object: 'line_item',
    amount: line.amount_total,
    currency: line.currency,
    description: line.description,
    discountable: true,
    discounts: [],
    invoice: invoiceId,
    livemode: false,
    metadata: {},
    parent: { type: 'invoice_item_details', subscription_item_details: null, invoice_item_details: null },
    period,
    pricing: { type: 'price_details', price_details: { price: line.price.id, product: line.price.product }, unit_amount_decimal: String(line.price.unit_amount ?? 0) },
    quantity: line.quantity,
    subtotal: line.amount_total,
  };
}

export function createSubscriptionInvoice(
  state: FakeState,
  subscription: FakeSubscription,
  reason: 'subscription_create' | 'subscription_cycle',
  oneTime: FakeLineItem[] = [],
): FakeInvoice {
  const now = state.now();
  const customer = state.get(state.customers, 'customer', subscription.customer, 'customer');
  const id = newId('in_');
  const trial = subscription.status === 'trialing';
  const periodStart = subscription.items.data[0]?.current_period_start ?? now;
  const periodEnd = subscription.items.data[0]?.current_period_end ?? now;
  const lines = [
    ...subscription.items.data.map((item) => invoiceLine(state, id, subscription, item, trial)),
    ...oneTime.map((line) => oneTimeLine(id, line, { start: periodStart, end: periodEnd })),
  ];
  const total = lines.reduce((sum, line) => sum + line.amount, 0);
  const invoice: FakeInvoice = {
    id,
    object: 'invoice',
    amount_due: total,
    amount_overpaid: 0,
    amount_paid: 0,
    amount_remaining: total,
    amount_shipping: 0,
    attempt_count: 0,
    attempted: false,
    auto_advance: true,
    billing_reason: reason,
    collection_method: 'charge_automatically',
    created: now,
    currency: subscription.currency,
    customer: customer.id,
    customer_email: customer.email,
    customer_name: customer.name ?? null,
    description: null,
    due_date: null,
    effective_at: null,
    ending_balance: null,
    hosted_invoice_url: null,
    invoice_pdf: null,
    lines: { object: 'list', data: lines, has_more: false, url: `/v1/invoices/${id}/lines` },
    livemode: false,
    metadata: {},
    next_payment_attempt: null,
    number: null,
    parent: { type: 'subscription_details', quote_details: null, subscription_details: { metadata: { ...subscription.metadata }, subscription: subscription.id } },
    payments: { object: 'list', data: [], has_more: false, url: '/v1/invoice_payments' },
    period_end: periodEnd,
    period_start: periodStart,
    starting_balance: 0,
    status: 'draft',
    status_transitions: { finalized_at: null, marked_uncollectible_at: null, paid_at: null, voided_at: null },
    subtotal: total,
    total,
    webhooks_delivered_at: null,
  };
  state.invoices.set(id, invoice);
  subscription.latest_invoice = id;
  state.emit('invoice.created', invoice);
  invoice.status = 'open';
  invoice.number = `${customer.invoice_prefix}-${String(customer.next_invoice_sequence ?? 1).padStart(4, '0')}`;
  customer.next_invoice_sequence = (customer.next_invoice_sequence ?? 1) + 1;
  invoice.status_transitions.finalized_at = now;
  invoice.effective_at = now;
  invoice.ending_balance = 0;
  state.emit('invoice.finalized', invoice);
  return invoice;
}

export function invoiceSubscription(state: FakeState, invoice: FakeInvoice): FakeSubscription | undefined {
  const id = invoice.parent?.subscription_details.subscription;
  return id ? state.subscriptions.get(id) : undefined;
}

function markInvoicePaid(state: FakeState, invoice: FakeInvoice): void {
  const now = state.now();
  invoice.status = 'paid';
  invoice.amount_paid = invoice.amount_due;
  invoice.amount_remaining = 0;
  invoice.next_payment_attempt = null;
  invoice.status_transitions.paid_at = now;
  state.emit('invoice.paid', invoice);
  state.emit('invoice.payment_succeeded', invoice);
  const subscription = invoiceSubscription(state, invoice);
  if (subscription && ['past_due', 'unpaid', 'incomplete'].includes(subscription.status)) setSubscriptionStatus(state, subscription, 'active');
}

export type InvoicePaymentOutcome = { paid: true } | { paid: false; decline: Decline; intent?: FakePaymentIntent };

const NO_PAYMENT_METHOD: Decline = {
  code: 'resource_missing',
  declineCode: 'no_payment_method',
  message: 'This customer has no attached payment source or default payment method.',
};

/** One collection attempt: charges the card on file, then applies Stripe's retry and dunning rules on failure. */
export function attemptInvoicePayment(state: FakeState, invoice: FakeInvoice, options: { outOfBand?: boolean } = {}): InvoicePaymentOutcome {
  if (invoice.status !== 'open') throw invalidRequest(`Invoice is already ${invoice.status}.`, undefined, 'invoice_not_open');
  invoice.attempted = true;
  if (invoice.amount_remaining === 0 || options.outOfBand) {
    markInvoicePaid(state, invoice);
    return { paid: true };
  }
  const subscription = invoiceSubscription(state, invoice);
  const onFile = state.cardsOnFile.get(invoice.customer);
  invoice.attempt_count += 1;
  let decline: Decline | null = NO_PAYMENT_METHOD;
  let intent: FakePaymentIntent | undefined;
  if (onFile) {
    const record = invoice.payments.data[0];
    const previous = record ? state.paymentIntents.get(record.payment.payment_intent) : undefined;
    const result = attemptPayment(state, {
      amount: invoice.amount_remaining,
      currency: invoice.currency,
      customer: invoice.customer,
      subscription: subscription?.id ?? null,
      card: onFile.card,
      cardDecline: null,
      paymentMethod: onFile.paymentMethod,
      description: invoice.billing_reason === 'subscription_create' ? 'Subscription creation' : 'Subscription update',
      metadata: {},
      ...(previous ? { intent: previous } : {}),
    });
    intent = result.intent;
    decline = result.decline;
    if (!record) invoice.payments.data.push(invoicePaymentRecord(state, invoice, result.intent.id));
  }
  const record = invoice.payments.data[0];
  if (!decline) {
    if (record) {
      record.status = 'paid';
      record.amount_paid = invoice.amount_remaining;
      record.status_transitions.paid_at = state.now();
    }
    markInvoicePaid(state, invoice);
    return { paid: true };
  }
  const retryDays = RETRY_AFTER_DAYS[invoice.attempt_count - 1];
  invoice.next_payment_attempt = retryDays === undefined ? null : state.now() + retryDays * DAY;
  state.emit('invoice.payment_failed', invoice);
  if (subscription) {
    if (retryDays === undefined) applyDunning(state, subscription);
    else if (subscription.status === 'active' || subscription.status === 'trialing') setSubscriptionStatus(state, subscription, 'past_due');
  }
  return { paid: false, decline, ...(intent ? { intent } : {}) };
}

function invoicePaymentRecord(state: FakeState, invoice: FakeInvoice, intentId: string): FakeInvoicePayment {
  return {
    id: newId('inpay_'),
    object: 'invoice_payment',
    amount_paid: null,
    amount_requested: invoice.amount_remaining,
    created: state.now(),
    currency: invoice.currency,
    invoice: invoice.id,
    is_default: true,
    livemode: false,
    payment: { type: 'payment_intent', payment_intent: intentId },
    status: 'open',
    status_transitions: { canceled_at: null, paid_at: null },
  };
}

function applyDunning(state: FakeState, subscription: FakeSubscription): void {
  if (state.options.dunning === 'mark_unpaid') setSubscriptionStatus(state, subscription, 'unpaid');
  else cancelSubscription(state, subscription, 'payment_failed');
}

export function invoicesRouter({ state, send }: ApiContext): Router {
  const router = Router();
  router.get('/invoices/:id', (req, res) => {
    res.json(send(req, state.get(state.invoices, 'invoice', id(req))));
  });
  router.get('/invoices', (req, res) => {
    const query = params(req);
    const list = filtered(
      state.invoices.values(),
      (i) => matches(query, 'customer', i.customer) && matches(query, 'status', i.status) && matches(query, 'subscription', i.parent?.subscription_details.subscription),
    );
    res.json(send(req, paginate(list, query, '/v1/invoices')));
  });
  router.post('/invoices/:id/pay', (req, res) => {
    const invoice = state.get(state.invoices, 'invoice', id(req));
    const body = params(req);
    allowOnly(body, ['paid_out_of_band', 'payment_method', 'off_session']);
    if (invoice.status === 'paid') throw invalidRequest('Invoice is already paid', undefined, 'invoice_already_paid');
    const outcome = attemptInvoicePayment(state, invoice, { outOfBand: optBool(body, 'paid_out_of_band') ?? false });
    if (!outcome.paid) throw cardError(outcome.decline, outcome.intent);
    res.json(send(req, invoice));
  });

  return router;
}

