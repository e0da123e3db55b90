import { invalidRequest } from './errors';
import { attemptInvoicePayment, createSubscriptionInvoice, invoiceSubscription } from './invoices';
import { expireHolds, nextHoldExpiry } from './payment-intents';
import type { FakeSubscription } from './objects';
import { changedFields, type FakeState } from './state';
import { cancelSubscription, currentPeriodEnd, DAY, periodBoundary, setPeriod, subscriptionRecurring } from './subscriptions';

const TRIAL_WILL_END_NOTICE = 3 * DAY;

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
  const hold = nextHoldExpiry(state);
  if (hold !== null) consider(hold);
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
  expireHolds(state);
}

/** The test clock: walks fake time forward, firing trial ends, renewals, retries and lapsing card holds in order. */
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

