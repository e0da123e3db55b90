import { monthlyAmountMinor, planById } from './plans';
import type { SubscriptionStatus } from './subscription.rules';

/** Statuses that bring in recurring revenue: trials pay nothing yet, ended ones no longer pay. */
const EARNING: ReadonlySet<SubscriptionStatus> = new Set(['active', 'past_due']);

/** Monthly recurring revenue of one subscription, in minor units of the platform currency. */
export function mrrMinorOf(sub: { status: SubscriptionStatus; planId: string; seats: number }): number {
  return EARNING.has(sub.status) ? monthlyAmountMinor(planById(sub.planId), sub.seats) : 0;
}

export interface MrrChange {
  shopId: string;
  /** ISO time the shop's MRR became `mrrMinor`. */
  at: string;
  mrrMinor: number;
}

export interface MrrPoint {
  /** Calendar month, `YYYY-MM` in UTC. */
  month: string;
  mrrMinor: number;
  shops: number;
}

/**
 * MRR at the end of each of the last `months` calendar months (the current month up to `now`): for every shop,
 * the latest change at or before that instant counts.
 */
export function mrrSeries(changes: readonly MrrChange[], now: Date, months: number): MrrPoint[] {
  const sorted = [...changes].sort((a, b) => a.at.localeCompare(b.at));
  const points: MrrPoint[] = [];
  for (let back = months - 1; back >= 0; back--) {
    const start = new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth() - back, 1));
    const nextMonth = Date.UTC(start.getUTCFullYear(), start.getUTCMonth() + 1, 1);
    const cutoff = Math.min(nextMonth - 1, now.getTime());
    const latest = new Map<string, number>();
    for (const change of sorted) {
      if (Date.parse(change.at) > cutoff) break;
      latest.set(change.shopId, change.mrrMinor);
    }
    const values = [...latest.values()];
    points.push({
      month: `${start.getUTCFullYear()}-${String(start.getUTCMonth() + 1).padStart(2, '0')}`,
      mrrMinor: values.reduce((sum, v) => sum + v, 0),
      shops: values.filter((v) => v > 0).length,
    });
  }
  return points;
}
