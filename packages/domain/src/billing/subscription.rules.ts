import { PAST_DUE_GRACE_DAYS } from './plans';

/** Stripe's subscription statuses that Revloop keeps, plus `none` for a shop that never subscribed. */
export const SUBSCRIPTION_STATUSES = ['trialing', 'active', 'past_due', 'unpaid', 'canceled', 'incomplete'] as const;
export type SubscriptionStatus = (typeof SUBSCRIPTION_STATUSES)[number];

export const SUBSCRIPTION_STATUS_LABELS: Record<SubscriptionStatus, string> = {
  trialing: 'Trial',
  active: 'Active',
  past_due: 'Payment overdue',
  unpaid: 'Unpaid',
  canceled: 'Cancelled',
  incomplete: 'Incomplete',
};

export type ReadOnlyReason = 'trial_ended' | 'payment_overdue' | 'subscription_ended';

export const READ_ONLY_REASON_TEXT: Record<ReadOnlyReason, string> = {
  trial_ended: 'The free trial has ended. The owner can choose a plan on the Billing page to unlock the shop.',
  payment_overdue: 'The subscription payment is overdue. The owner can update the card on the Billing page to unlock the shop.',
  subscription_ended: 'The subscription has ended. The owner can choose a plan on the Billing page to unlock the shop.',
};

export function toSubscriptionStatus(stripeStatus: string): SubscriptionStatus {
  if ((SUBSCRIPTION_STATUSES as readonly string[]).includes(stripeStatus)) return stripeStatus as SubscriptionStatus;
  // incomplete_expired and paused both mean nothing is being paid.
  return stripeStatus === 'incomplete_expired' ? 'canceled' : 'unpaid';
}

export interface BillingStanding {
  status: SubscriptionStatus;
  /** Set while the shop tries Revloop without a paid subscription. */
  trialEndsAt: string | null;
  /** When the first renewal failed, while the subscription is past due. */
  pastDueSince: string | null;
}

const DAY_MS = 86_400_000;

/** When a past-due shop turns read-only. */
export const graceEndsAt = (pastDueSince: string): Date => new Date(Date.parse(pastDueSince) + PAST_DUE_GRACE_DAYS * DAY_MS);

/**
 * Why the shop is read-only for billing, or null when it is not. `now` is the latest time known, which for a
 * test clock of the payment provider may run ahead of the wall clock.
 */
export function readOnlyReasonOf(standing: BillingStanding, now: Date): ReadOnlyReason | null {
  switch (standing.status) {
    case 'trialing':
      return standing.trialEndsAt !== null && Date.parse(standing.trialEndsAt) <= now.getTime() ? 'trial_ended' : null;
    case 'past_due':
      return standing.pastDueSince !== null && graceEndsAt(standing.pastDueSince).getTime() <= now.getTime() ? 'payment_overdue' : null;
    case 'unpaid':
      return 'payment_overdue';
    case 'canceled':
    case 'incomplete':
      return 'subscription_ended';
    case 'active':
      return null;
  }
}
