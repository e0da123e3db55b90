import { listSubscriptionChanges, listSubscriptionsForPlatform } from '@revloop/db';
import { PLATFORM_CURRENCY, READ_ONLY_REASON_TEXT, SUBSCRIPTION_STATUS_LABELS, mrrMinorOf, mrrSeries, planById } from '@revloop/domain/billing';
import type { AppDeps } from '../../context';
import { applyBillingDeadlines } from './subscription.service';

/** The platform's revenue for the admin: every shop's plan and monthly recurring revenue, and twelve months of MRR. */
export async function platformRevenue(deps: AppDeps) {
  await applyBillingDeadlines(deps);
  const rows = await listSubscriptionsForPlatform(deps.db);
  const shops = rows.map((r) => ({
    shopId: r.shop_id,
    shopName: r.shop_name,
    shopStatus: r.shop_status,
    planId: r.plan_id,
    planName: planById(r.plan_id).name,
    seats: r.seats,
    status: r.status,
    statusLabel: SUBSCRIPTION_STATUS_LABELS[r.status],
    mrrMinor: mrrMinorOf({ status: r.status, planId: r.plan_id, seats: r.seats }),
    trialEndsAt: r.status === 'trialing' ? r.trial_ends_at : null,
    currentPeriodEnd: r.current_period_end,
    readOnlyReason: r.read_only_reason,
    readOnlyText: r.read_only_reason ? READ_ONLY_REASON_TEXT[r.read_only_reason] : null,
  }));
  const changes = await listSubscriptionChanges(deps.db);
  return {
    currency: PLATFORM_CURRENCY,
    mrrMinor: shops.reduce((sum, s) => sum + s.mrrMinor, 0),
    shops,
    series: mrrSeries(changes.map((c) => ({ shopId: c.shop_id, at: c.at, mrrMinor: c.mrr_minor })), deps.clock.now(), 12),
  };
}
