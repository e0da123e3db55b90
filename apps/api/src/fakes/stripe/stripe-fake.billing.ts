import { invalidRequest, StripeFakeError } from './stripe-fake.errors';
import type {
  FakeCard,
  FakeCharge,
  FakeCheckoutSession,
  FakeCustomer,
  FakeInvoice,
  FakeInvoiceLine,
  FakeInvoicePayment,
  FakeLineItem,
  FakePaymentIntent,
  FakePrice,
  FakeRecurring,
  FakeRefund,
  FakeSubscription,
  FakeSubscriptionItem,
  Metadata,
} from './stripe-fake.objects';
import { newId, type FakeState } from './stripe-fake.state';

const DAY = 86_400;
/** Days after each failed attempt before the next automatic retry; when they run out, dunning applies. */
const RETRY_AFTER_DAYS = [3, 5, 7];
const TRIAL_WILL_END_NOTICE = 3 * DAY;
const ZERO_DECIMAL = new Set(['bif', 'clp', 'djf', 'gnf', 'jpy', 'kmf', 'krw', 'mga', 'pyg', 'rwf', 'ugx', 'vnd', 'vuv', 'xaf', 'xof', 'xpf']);

export function formatAmount(amount: number, currency: string): string {
  const value = ZERO_DECIMAL.has(currency) ? String(amount) : (amount / 100).toFixed(2);
  return `${value} ${currency.toUpperCase()}`;
}

/** Previous values of the top-level fields that changed, as Stripe sends in `*.updated` events. */
export function changedFields<T extends object>(before: T, after: T): Record<string, unknown> {
  const prev: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(before)) {
    if (JSON.stringify(value) !== JSON.stringify((after as Record<string, unknown>)[key])) prev[key] = value;
  }
  return prev;
}

// ---- Cards -------------------------------------------------------------------------------------

export interface Decline {
  code: string;
  declineCode: string;
  message: string;
}

export interface TestCard {
  number: string;
  card: FakeCard;
  decline: Decline | null;
}

const GENERIC_DECLINE: Decline = { code: 'card_declined', declineCode: 'generic_decline', message: 'Your card was declined.' };

/** Stripe's published test numbers that this stand-in knows; anything else reads as a mistyped number. */
const TEST_CARDS: Record<string, { brand: string; decline: Decline | null }> = {
  '4242424242424242': { brand: 'visa', decline: null },
  '5555555555554444': { brand: 'mastercard', decline: null },
  '4000000000000002': { brand: 'visa', decline: GENERIC_DECLINE },
  '4000000000009995': {
    brand: 'visa',
    decline: { code: 'card_declined', declineCode: 'insufficient_funds', message: 'Your card has insufficient funds.' },
  },
};

export function readTestCard(input: string): TestCard | null {
  const number = input.replace(/[\s-]/g, '');
  const known = TEST_CARDS[number];
  if (!known) return null;
  return {
    number,
    card: { brand: known.brand, country: 'US', exp_month: 12, exp_year: new Date().getUTCFullYear() + 3, funding: 'credit', last4: number.slice(-4) },
    decline: known.decline,
  };
}

function consumeFailure(state: FakeState, ids: (string | null | undefined)[]): Decline | null {
  for (const id of ids) {
    if (id && state.failNext.delete(id)) return GENERIC_DECLINE;
  }
  return null;
}

// ---- Customers ---------------------------------------------------------------------------------

export function createCustomer(state: FakeState, fields: { email?: string | null; name?: string | null; phone?: string | null; description?: string | null; metadata?: Metadata }): FakeCustomer {
  const customer: FakeCustomer = {
    id: newId('cus_', 14),
    object: 'customer',
    address: null,
    balance: 0,
    created: state.now(),
    currency: null,
    default_source: null,
    delinquent: false,
    description: fields.description ?? null,
    email: fields.email ?? null,
    invoice_prefix: newId('', 8).toUpperCase().replace(/[^A-Z0-9]/g, 'X'),
    invoice_settings: { custom_fields: null, default_payment_method: null, footer: null, rendering_options: null },
    livemode: false,
    metadata: fields.metadata ?? {},
    name: fields.name ?? null,
    next_invoice_sequence: 1,
    phone: fields.phone ?? null,
    preferred_locales: [],
    shipping: null,
    tax_exempt: 'none',
  };
  state.customers.set(customer.id, customer);
  return customer;
}

function saveCardOnFile(state: FakeState, customerId: string, card: FakeCard): string {
  const paymentMethod = newId('pm_');
  state.cardsOnFile.set(customerId, { paymentMethod, card });
  const customer = state.customers.get(customerId);
  if (customer) customer.invoice_settings.default_payment_method = paymentMethod;
  return paymentMethod;
}

// ---- Payments ----------------------------------------------------------------------------------

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
}

interface PaymentResult {
  intent: FakePaymentIntent;
  charge: FakeCharge;
  decline: Decline | null;
}

function attemptPayment(state: FakeState, input: PaymentInput): PaymentResult {
  const now = state.now();
  const intent: FakePaymentIntent = input.intent ?? {
    id: newId('pi_'),
    object: 'payment_intent',
    amount: input.amount,
    amount_capturable: 0,
    amount_received: 0,
    canceled_at: null,
    cancellation_reason: null,
    capture_method: 'automatic_async',
    client_secret: null,
    confirmation_method: 'automatic',
    created: now,
    currency: input.currency,
    customer: input.customer,
    description: input.description,
    last_payment_error: null,
    latest_charge: null,
    livemode: false,
    metadata: input.metadata,
    next_action: null,
    payment_method: null,
    payment_method_types: ['card'],
    receipt_email: null,
    setup_future_usage: null,
    statement_descriptor: null,
    status: 'requires_payment_method',
  };
  intent.client_secret ??= `${intent.id}_secret_${newId('', 24)}`;
  state.paymentIntents.set(intent.id, intent);
  const decline = input.cardDecline ?? consumeFailure(state, [input.customer, input.subscription]);
  const customerEmail = input.customer ? (state.customers.get(input.customer)?.email ?? null) : null;
  const charge: FakeCharge = {
    id: newId('ch_'),
    object: 'charge',
    amount: input.amount,
    amount_captured: decline ? 0 : input.amount,
    amount_refunded: 0,
    balance_transaction: null,
    captured: !decline,
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
    payment_method_details: { type: 'card', card: input.card },
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
  } else {
    intent.status = 'succeeded';
    intent.amount_received = input.amount;
    intent.last_payment_error = null;
    state.emit('charge.succeeded', charge);
    state.emit('payment_intent.succeeded', intent);
  }
  return { intent, charge, decline };
}

export function cardError(decline: Decline, intent?: FakePaymentIntent): StripeFakeError {
  return new StripeFakeError(402, {
    type: 'card_error',
    code: decline.code,
    decline_code: decline.declineCode,
    message: decline.message,
    ...(intent ? { charge: intent.latest_charge ?? undefined, payment_intent: { id: intent.id, status: intent.status } } : {}),
  });
}

// ---- Refunds -----------------------------------------------------------------------------------

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

// ---- Subscription periods ----------------------------------------------------------------------

function addMonths(anchor: number, months: number): number {
  const date = new Date(anchor * 1000);
  const day = date.getUTCDate();
  const target = new Date(Date.UTC(date.getUTCFullYear(), date.getUTCMonth() + months, 1, date.getUTCHours(), date.getUTCMinutes(), date.getUTCSeconds()));
  const lastDay = new Date(Date.UTC(target.getUTCFullYear(), target.getUTCMonth() + 1, 0)).getUTCDate();
  target.setUTCDate(Math.min(day, lastDay));
  return Math.floor(target.getTime() / 1000);
}

function periodBoundary(anchor: number, recurring: FakeRecurring, periods: number): number {
  const n = recurring.interval_count * periods;
  switch (recurring.interval) {
    case 'day':
      return anchor + n * DAY;
    case 'week':
      return anchor + n * 7 * DAY;
    case 'month':
      return addMonths(anchor, n);
    default:
      return addMonths(anchor, 12 * n);
  }
}

function subscriptionRecurring(subscription: FakeSubscription): FakeRecurring {
  const recurring = subscription.items.data[0]?.price.recurring;
  if (!recurring) throw new Error(`subscription ${subscription.id} has no recurring item`);
  return recurring;
}

function setPeriod(subscription: FakeSubscription, start: number, end: number): void {
  for (const item of subscription.items.data) {
    item.current_period_start = start;
    item.current_period_end = end;
  }
}

function currentPeriodEnd(subscription: FakeSubscription): number {
  return subscription.items.data[0]?.current_period_end ?? subscription.created;
}

export function newSubscriptionItem(state: FakeState, subscriptionId: string, price: FakePrice, quantity: number, start: number, end: number): FakeSubscriptionItem {
  return {
    id: newId('si_', 14),
    object: 'subscription_item',
    created: state.now(),
    current_period_end: end,
    current_period_start: start,
    discounts: [],
    metadata: {},
    price: structuredClone(price),
    quantity,
    subscription: subscriptionId,
    tax_rates: [],
  };
}

function createSubscription(
  state: FakeState,
  input: { customer: string; items: { price: FakePrice; quantity: number }[]; trialDays: number | null; metadata: Metadata; paymentMethod: string | null; currency: string },
): FakeSubscription {
  const now = state.now();
  const id = newId('sub_');
  const trialEnd = input.trialDays ? now + input.trialDays * DAY : null;
  const anchor = trialEnd ?? now;
  const first = input.items[0]?.price.recurring;
  if (!first) throw invalidRequest('A subscription needs at least one recurring price.', 'line_items');
  const periodEnd = trialEnd ?? periodBoundary(anchor, first, 1);
  const subscription: FakeSubscription = {
    id,
    object: 'subscription',
    billing_cycle_anchor: anchor,
    cancel_at: null,
    cancel_at_period_end: false,
    canceled_at: null,
    cancellation_details: { comment: null, feedback: null, reason: null },
    collection_method: 'charge_automatically',
    created: now,
    currency: input.currency,
    customer: input.customer,
    days_until_due: null,
    default_payment_method: input.paymentMethod,
    description: null,
    discounts: [],
    ended_at: null,
    items: {
      object: 'list',
      data: input.items.map((item) => newSubscriptionItem(state, id, item.price, item.quantity, now, periodEnd)),
      has_more: false,
      url: `/v1/subscription_items?subscription=${id}`,
    },
    latest_invoice: null,
    livemode: false,
    metadata: input.metadata,
    pending_update: null,
    schedule: null,
    start_date: now,
    status: trialEnd ? 'trialing' : 'active',
    test_clock: null,
    trial_end: trialEnd,
    trial_start: trialEnd ? now : null,
  };
  state.subscriptions.set(id, subscription);
  state.subscriptionExtras.set(id, { periodIndex: trialEnd ? -1 : 0, trialWillEndSent: false });
  return subscription;
}

// ---- Invoices ----------------------------------------------------------------------------------

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

function createSubscriptionInvoice(
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

function invoiceSubscription(state: FakeState, invoice: FakeInvoice): FakeSubscription | undefined {
  const id = invoice.parent?.subscription_details.subscription;
  return id ? state.subscriptions.get(id) : undefined;
}

function setSubscriptionStatus(state: FakeState, subscription: FakeSubscription, status: FakeSubscription['status']): void {
  if (subscription.status === status) return;
  const before = structuredClone(subscription);
  subscription.status = status;
  state.emit('customer.subscription.updated', subscription, changedFields(before, subscription));
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

// ---- Subscription lifecycle --------------------------------------------------------------------

export function cancelSubscription(state: FakeState, subscription: FakeSubscription, reason: 'cancellation_requested' | 'payment_failed', comment?: string | null): void {
  if (subscription.status === 'canceled') throw invalidRequest(`This subscription is already canceled: '${subscription.id}'`, undefined, 'resource_already_canceled');
  const now = state.now();
  subscription.status = 'canceled';
  subscription.canceled_at = now;
  subscription.ended_at = now;
  subscription.cancellation_details = { comment: comment ?? null, feedback: null, reason };
  state.emit('customer.subscription.deleted', subscription);
}

function renew(state: FakeState, subscription: FakeSubscription): void {
  const extras = state.subscriptionExtras.get(subscription.id);
  if (!extras) return;
  if (subscription.cancel_at_period_end) {
    cancelSubscription(state, subscription, 'cancellation_requested');
    return;
  }
  const before = structuredClone(subscription);
  const recurring = subscriptionRecurring(subscription);
  extras.periodIndex += 1;
  const start = periodBoundary(subscription.billing_cycle_anchor, recurring, extras.periodIndex);
  setPeriod(subscription, start, periodBoundary(subscription.billing_cycle_anchor, recurring, extras.periodIndex + 1));
  if (subscription.status === 'trialing') subscription.status = 'active';
  const invoice = createSubscriptionInvoice(state, subscription, 'subscription_cycle');
  state.emit('customer.subscription.updated', subscription, changedFields(before, subscription));
  attemptInvoicePayment(state, invoice);
}

const LIVE_STATUSES = new Set(['trialing', 'active', 'past_due']);

/** The next moment something is scheduled to happen, or null if nothing is. */
function nextDue(state: FakeState): number | null {
  let next: number | null = null;
  const consider = (t: number) => {
    if (next === null || t < next) next = t;
  };
  for (const subscription of state.subscriptions.values()) {
    if (!LIVE_STATUSES.has(subscription.status)) continue;
    const extras = state.subscriptionExtras.get(subscription.id);
    if (subscription.status === 'trialing' && subscription.trial_end !== null && extras && !extras.trialWillEndSent) {
      consider(Math.max(subscription.created, subscription.trial_end - TRIAL_WILL_END_NOTICE));
    }
    consider(currentPeriodEnd(subscription));
  }
  for (const invoice of state.invoices.values()) {
    if (invoice.status === 'open' && invoice.next_payment_attempt !== null) consider(invoice.next_payment_attempt);
  }
  return next;
}

function runDue(state: FakeState): void {
  const now = state.now();
  for (const subscription of [...state.subscriptions.values()]) {
    if (!LIVE_STATUSES.has(subscription.status)) continue;
    const extras = state.subscriptionExtras.get(subscription.id);
    if (
      subscription.status === 'trialing' &&
      subscription.trial_end !== null &&
      extras &&
      !extras.trialWillEndSent &&
      subscription.trial_end - TRIAL_WILL_END_NOTICE <= now
    ) {
      extras.trialWillEndSent = true;
      state.emit('customer.subscription.trial_will_end', subscription);
    }
    if (currentPeriodEnd(subscription) <= now) renew(state, subscription);
  }
  for (const invoice of [...state.invoices.values()]) {
    if (invoice.status === 'open' && invoice.next_payment_attempt !== null && invoice.next_payment_attempt <= now) {
      const subscription = invoiceSubscription(state, invoice);
      // A retry for a subscription that has since ended stops, as Stripe closes its dunning.
      if (subscription && !LIVE_STATUSES.has(subscription.status)) invoice.next_payment_attempt = null;
      else attemptInvoicePayment(state, invoice);
    }
  }
}

/** The test clock: walks fake time forward, firing trial ends, renewals and retries in order. */
export function advanceTime(state: FakeState, seconds: number): number {
  if (!Number.isFinite(seconds) || seconds < 0) throw invalidRequest('seconds must be a non-negative number', 'seconds');
  const target = state.now() + Math.floor(seconds);
  for (let step = 0; step < 100_000; step++) {
    const due = nextDue(state);
    if (due === null || due > target) break;
    if (due > state.now()) state.setNow(due);
    runDue(state);
  }
  state.setNow(target);
  return target;
}

// ---- Checkout ----------------------------------------------------------------------------------

export type CheckoutOutcome = { ok: true; session: FakeCheckoutSession } | { ok: false; session: FakeCheckoutSession; message: string };

/** What the hosted page does when the buyer submits a card. */
export function payCheckoutSession(state: FakeState, sessionId: string, cardNumber: string): CheckoutOutcome {
  const session = state.get(state.sessions, 'checkout.session', sessionId);
  if (session.status === 'complete') return { ok: true, session };
  if (session.status === 'expired' || session.expires_at <= state.now()) {
    session.status = 'expired';
    return { ok: false, session, message: 'This checkout session has expired.' };
  }
  const extras = state.sessionExtras.get(session.id);
  const test = readTestCard(cardNumber);
  if (!extras) throw new Error(`checkout session ${session.id} lost its line items`);
  if (!test) return { ok: false, session, message: 'Your card number is incorrect. Use a test card such as 4242 4242 4242 4242.' };
  const email = session.customer ? (state.customers.get(session.customer)?.email ?? null) : session.customer_email;
  const complete = (paymentStatus: FakeCheckoutSession['payment_status']): CheckoutOutcome => {
    session.status = 'complete';
    session.payment_status = paymentStatus;
    session.customer_details = { email, name: null, phone: null, address: null, tax_exempt: 'none', tax_ids: [] };
    state.emit('checkout.session.completed', session);
    return { ok: true, session };
  };

  if (session.mode === 'payment') {
    if (!session.customer && session.customer_creation === 'always') session.customer = createCustomer(state, { email }).id;
    const existing = session.payment_intent ? state.paymentIntents.get(session.payment_intent) : undefined;
    const result = attemptPayment(state, {
      amount: session.amount_total ?? 0,
      currency: session.currency ?? 'usd',
      customer: session.customer,
      card: test.card,
      cardDecline: test.decline,
      paymentMethod: newId('pm_'),
      description: extras.paymentIntentDescription,
      metadata: extras.paymentIntentMetadata,
      ...(existing ? { intent: existing } : {}),
    });
    session.payment_intent = result.intent.id;
    if (result.decline) return { ok: false, session, message: result.decline.message };
    if (session.customer) saveCardOnFile(state, session.customer, test.card);
    return complete('paid');
  }

  // Subscription and setup modes check the card before creating anything, as Checkout does.
  const decline = test.decline ?? consumeFailure(state, [session.customer]);
  if (decline) return { ok: false, session, message: decline.message };

  if (session.mode === 'setup') {
    const paymentMethod = session.customer ? saveCardOnFile(state, session.customer, test.card) : newId('pm_');
    const setupIntent = {
      id: newId('seti_'),
      object: 'setup_intent' as const,
      created: state.now(),
      customer: session.customer,
      livemode: false as const,
      metadata: {},
      payment_method: paymentMethod,
      status: 'succeeded' as const,
      usage: 'off_session' as const,
    };
    state.setupIntents.set(setupIntent.id, setupIntent);
    session.setup_intent = setupIntent.id;
    state.emit('setup_intent.succeeded', setupIntent);
    return complete('no_payment_required');
  }

  const customer = session.customer ? state.get(state.customers, 'customer', session.customer) : createCustomer(state, { email: session.customer_email });
  session.customer = customer.id;
  const paymentMethod = saveCardOnFile(state, customer.id, test.card);
  const recurring = extras.lineItems.filter((line) => line.price.recurring);
  const oneTime = extras.lineItems.filter((line) => !line.price.recurring);
  const subscription = createSubscription(state, {
    customer: customer.id,
    items: recurring.map((line) => ({ price: line.price, quantity: line.quantity ?? 1 })),
    trialDays: extras.trialPeriodDays,
    metadata: extras.subscriptionMetadata,
    paymentMethod,
    currency: session.currency ?? 'usd',
  });
  session.subscription = subscription.id;
  state.emit('customer.subscription.created', subscription);
  const invoice = createSubscriptionInvoice(state, subscription, 'subscription_create', oneTime);
  session.invoice = invoice.id;
  attemptInvoicePayment(state, invoice);
  return complete(invoice.amount_due === 0 ? 'no_payment_required' : 'paid');
}
