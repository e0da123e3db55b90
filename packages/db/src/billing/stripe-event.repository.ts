import type { Db } from '../client';

/**
 * Claims a webhook event for processing. Call it inside the transaction that applies the event: false means
 * the event was applied before (or is being applied by a concurrent delivery that will commit first).
 */
export async function claimStripeEvent(db: Db, event: { id: string; type: string; shopId: string | null; at: string }): Promise<boolean> {
  const result = await db
    .insertInto('stripe_events')
    .values({ id: event.id, type: event.type, shop_id: event.shopId, received_at: event.at })
    .onConflict((oc) => oc.column('id').doNothing())
    .executeTakeFirst();
  return Number(result.numInsertedOrUpdatedRows ?? 0) === 1;
}

export async function countStripeEvents(db: Db, id: string): Promise<number> {
  const row = await db.selectFrom('stripe_events').select((eb) => eb.fn.countAll<number>().as('n')).where('id', '=', id).executeTakeFirstOrThrow();
  return Number(row.n);
}
