import { countJobsOpenedSince, countPendingSeatInvitations, countSeatsInUse, type Db } from '@revloop/db';
import { assertJobVolume, assertSeatAvailable, planById } from '@revloop/domain/billing';
import { ensureSubscription } from './subscription.service';

/** One more owner or tuner must fit the shop's plan; pending invitations already hold their seats. */
export async function assertSeatFor(db: Db, shopId: string, now: Date): Promise<void> {
  const subscription = await ensureSubscription(db, shopId, now);
  const taken = (await countSeatsInUse(db, shopId)) + (await countPendingSeatInvitations(db, shopId, now.toISOString()));
  assertSeatAvailable(planById(subscription.plan_id), subscription.seats, subscription.status === 'trialing', taken);
}

/** A new job must fit this calendar month's volume (UTC months, as the invoices count them). */
export async function assertJobRoom(db: Db, shopId: string, now: Date): Promise<void> {
  const subscription = await ensureSubscription(db, shopId, now);
  const monthStart = new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), 1)).toISOString();
  assertJobVolume(planById(subscription.plan_id), await countJobsOpenedSince(db, shopId, monthStart));
}
