import { describe, expect, it } from 'vitest';
import { assertPlanChoice, monthlyAmountMinor, planById } from './plans';
import { graceEndsAt, readOnlyReasonOf, toSubscriptionStatus } from './subscription.rules';

const at = (iso: string) => new Date(iso);

describe('readOnlyReasonOf', () => {
  it('locks a trial once it has ended without a plan', () => {
    const standing = { status: 'trialing' as const, trialEndsAt: '2027-01-15T00:00:00.000Z', pastDueSince: null };
    expect(readOnlyReasonOf(standing, at('2027-01-14T23:59:59Z'))).toBeNull();
    expect(readOnlyReasonOf(standing, at('2027-01-15T00:00:00Z'))).toBe('trial_ended');
  });

  it('keeps a past-due shop writable through the 7-day grace period', () => {
    const standing = { status: 'past_due' as const, trialEndsAt: null, pastDueSince: '2027-01-01T10:00:00.000Z' };
    // [CALC] 1 January 10:00 + 7 × 24 h = 8 January 10:00
    expect(graceEndsAt(standing.pastDueSince).toISOString()).toBe('2027-01-08T10:00:00.000Z');
    expect(readOnlyReasonOf(standing, at('2027-01-08T09:59:59Z'))).toBeNull();
    expect(readOnlyReasonOf(standing, at('2027-01-08T10:00:00Z'))).toBe('payment_overdue');
  });

  it('locks unpaid and ended subscriptions and leaves active ones alone', () => {
    const now = at('2027-01-01T00:00:00Z');
    expect(readOnlyReasonOf({ status: 'unpaid', trialEndsAt: null, pastDueSince: null }, now)).toBe('payment_overdue');
    expect(readOnlyReasonOf({ status: 'canceled', trialEndsAt: null, pastDueSince: null }, now)).toBe('subscription_ended');
    expect(readOnlyReasonOf({ status: 'active', trialEndsAt: null, pastDueSince: '2026-01-01T00:00:00Z' }, now)).toBeNull();
  });

  it('maps provider statuses it does not keep', () => {
    expect(toSubscriptionStatus('past_due')).toBe('past_due');
    expect(toSubscriptionStatus('incomplete_expired')).toBe('canceled');
    expect(toSubscriptionStatus('paused')).toBe('unpaid');
  });
});

describe('plans', () => {
  it('prices seats and checks the seat range', () => {
    // [CALC] Fleet 39.00 × 12 seats = 468.00
    expect(monthlyAmountMinor(planById('fleet'), 12)).toBe(46800);
    expect(() => assertPlanChoice(planById('solo'), 2, 1)).toThrow(/exactly 1 tuner seat/);
    expect(() => assertPlanChoice(planById('workshop'), 2, 3)).toThrow(/at least 3 seats/);
    expect(() => planById('gold')).toThrow(expect.objectContaining({ code: 'validation' }));
    expect(() => assertPlanChoice(planById('workshop'), 3, 3)).not.toThrow();
  });
});
