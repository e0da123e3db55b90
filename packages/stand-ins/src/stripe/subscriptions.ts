import { Router } from 'express';
import { invalidRequest, missingParam, noSuch } from './errors';
import { filtered, id, matches, params, type ApiContext } from './http';
import type { FakePrice, FakeRecurring, FakeSubscription, FakeSubscriptionItem, Metadata } from './objects';
import { allowOnly, applyMetadata, asParams, optArray, optBool, optInt, optNullableString, optString, type Params } from './params';
import { changedFields, newId, paginate, type FakeState } from './state';

export const DAY = 86_400;

function addMonths(anchor: number, months: number): number {
  const date = new Date(anchor * 1000);
  const day = date.getUTCDate();
  const target = new Date(Date.UTC(date.getUTCFullYear(), date.getUTCMonth() + months, 1, date.getUTCHours(), date.getUTCMinutes(), date.getUTCSeconds()));
  const lastDay = new Date(Date.UTC(target.getUTCFullYear(), target.getUTCMonth() + 1, 0)).getUTCDate();
  target.setUTCDate(Math.min(day, lastDay));
  return Math.floor(target.getTime() / 1000);
}

export function periodBoundary(anchor: number, recurring: FakeRecurring, periods: number): number {
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

export function subscriptionRecurring(subscription: FakeSubscription): FakeRecurring {
  const recurring = subscription.items.data[0]?.price.recurring;
  if (!recurring) throw new Error(`subscription ${subscription.id} has no recurring item`);
  return recurring;
}

export function setPeriod(subscription: FakeSubscription, start: number, end: number): void {
  for (const item of subscription.items.data) {
    item.current_period_start = start;
    item.current_period_end = end;
  }
}

export function currentPeriodEnd(subscription: FakeSubscription): number {
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

export function createSubscription(
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

export function setSubscriptionStatus(state: FakeState, subscription: FakeSubscription, status: FakeSubscription['status']): void {
  if (subscription.status === status) return;
  const before = structuredClone(subscription);
  subscription.status = status;
  state.emit('customer.subscription.updated', subscription, changedFields(before, subscription));
}

export function cancelSubscription(state: FakeState, subscription: FakeSubscription, reason: 'cancellation_requested' | 'payment_failed', comment?: string | null): void {
  if (subscription.status === 'canceled') throw invalidRequest(`This subscription is already canceled: '${subscription.id}'`, undefined, 'resource_already_canceled');
  const now = state.now();
  subscription.status = 'canceled';
  subscription.canceled_at = now;
  subscription.ended_at = now;
  subscription.cancellation_details = { comment: comment ?? null, feedback: null, reason };
  state.emit('customer.subscription.deleted', subscription);
}

export function subscriptionsRouter({ state, send }: ApiContext): Router {
  const router = Router();
  router.get('/subscriptions/:id', (req, res) => {
    res.json(send(req, state.get(state.subscriptions, 'subscription', id(req))));
  });
  router.get('/subscriptions', (req, res) => {
    const query = params(req);
    const status = optString(query, 'status');
    const list = filtered(
      state.subscriptions.values(),
      (s) =>
        matches(query, 'customer', s.customer) &&
        (status === 'all' || (status === undefined ? s.status !== 'canceled' : s.status === status)) &&
        (query.price === undefined || s.items.data.some((item) => item.price.id === query.price)),
    );
    res.json(send(req, paginate(list, query, '/v1/subscriptions')));
  });
  router.post('/subscriptions/:id', (req, res) => {
    const subscription = state.get(state.subscriptions, 'subscription', id(req));
    const body = params(req);
    allowOnly(body, ['items', 'metadata', 'cancel_at_period_end', 'proration_behavior', 'description', 'payment_behavior', 'cancellation_details']);
    if (subscription.status === 'canceled') {
      throw invalidRequest('A canceled subscription can only update its cancellation_details and metadata.', undefined, 'resource_already_canceled');
    }
    // Changes are applied to a copy so a rejected parameter leaves the subscription untouched.
    const next = structuredClone(subscription);
    updateItems(state, next, optArray(body, 'items') ?? []);
    next.metadata = applyMetadata(next.metadata, body);
    const description = optNullableString(body, 'description');
    if (description !== undefined) next.description = description;
    const cancelAtPeriodEnd = optBool(body, 'cancel_at_period_end');
    if (cancelAtPeriodEnd !== undefined) {
      next.cancel_at_period_end = cancelAtPeriodEnd;
      next.cancel_at = cancelAtPeriodEnd ? (next.items.data[0]?.current_period_end ?? null) : null;
      next.cancellation_details.reason = cancelAtPeriodEnd ? 'cancellation_requested' : null;
    }
    const changes = changedFields(subscription, next);
    Object.assign(subscription, next);
    if (Object.keys(changes).length > 0) state.emit('customer.subscription.updated', subscription, changes);
    res.json(send(req, subscription));
  });
  router.delete('/subscriptions/:id', (req, res) => {
    const subscription = state.get(state.subscriptions, 'subscription', id(req));
    const query = params(req);
    const details = query.cancellation_details === undefined ? {} : asParams(query.cancellation_details, 'cancellation_details');
    cancelSubscription(state, subscription, 'cancellation_requested', optString(details, 'comment') ?? null);
    res.json(send(req, subscription));
  });

  return router;
}

/** Applies `items[]` changes: by id to change price or quantity or delete; without id to add. Proration is ignored. */
function updateItems(state: FakeState, subscription: FakeSubscription, changes: Params[]): void {
  const items = subscription.items.data;
  const first = items[0];
  changes.forEach((change, i) => {
    const param = `items[${i}]`;
    allowOnly(change, ['id', 'price', 'quantity', 'deleted', 'metadata']);
    const itemId = optString(change, 'id');
    const priceId = optString(change, 'price');
    const price = priceId ? state.get(state.prices, 'price', priceId, `${param}[price]`) : undefined;
    if (price && (!price.recurring || price.currency !== subscription.currency)) {
      throw invalidRequest('Subscription items must use recurring prices in the subscription currency.', `${param}[price]`);
    }
    const quantity = optInt(change, 'quantity', 0);
    if (itemId) {
      const index = items.findIndex((item) => item.id === itemId);
      const item = items[index];
      if (!item) throw noSuch('subscription item', itemId, `${param}[id]`);
      if (optBool(change, 'deleted')) {
        items.splice(index, 1);
        return;
      }
      if (price) item.price = structuredClone(price);
      if (quantity !== undefined) item.quantity = quantity;
      item.metadata = applyMetadata(item.metadata, change);
      return;
    }
    if (!price) throw missingParam(`${param}[price]`);
    if (items.some((item) => item.price.id === price.id)) {
      throw invalidRequest('Cannot add multiple subscription items with the same price.', `${param}[price]`);
    }
    const start = first?.current_period_start ?? state.now();
    const end = first?.current_period_end ?? state.now();
    items.push(newSubscriptionItem(state, subscription.id, price, quantity ?? 1, start, end));
  });
  if (items.length === 0) throw invalidRequest('A subscription must have at least one active plan.', 'items');
}

