import { newId, type Db } from '@revloop/db';
import { blockedRange } from '@revloop/domain/rentals';
import { writeWithAudit } from '../audit/audit.service';
import { rentalAuditEvents } from './rental-records';

export interface RentalRequest {
  shopId: string;
  currency: string;
  job: { id: string; customer_user_id: string; dealer_id: string | null };
  startDate: string;
  dueDate: string;
  notes: string;
  shippingDays: number;
  actorUserId: string;
  now: Date;
}

/**
 * Writes a requested rental (no kit yet: the shop picks it) and its audit events in one transaction, the caller's when
 * `db` is one, so the job intake can open the job and ask for the kit together. Returns the new rental's id.
 */
export async function insertRentalRequest(db: Db, r: RentalRequest): Promise<string> {
  const at = r.now.toISOString();
  const blocked = blockedRange(r.startDate, r.dueDate, r.shippingDays);
  const row = {
    id: newId(),
    shop_id: r.shopId,
    job_id: r.job.id,
    kit_id: null,
    customer_user_id: r.job.customer_user_id,
    dealer_id: r.job.dealer_id,
    state: 'requested' as const,
    start_date: r.startDate,
    due_date: r.dueDate,
    blocked_from: blocked.from,
    blocked_to: blocked.to,
    notes: r.notes,
    currency: r.currency,
    fee_minor: 0,
    deposit_minor: 0,
    late_fee_per_day_minor: 0,
    created_at: at,
    updated_at: at,
  };
  await writeWithAudit(
    db,
    (trx) => trx.insertInto('rentals').values(row).execute(),
    () => rentalAuditEvents(row, r.actorUserId, 'rental.requested', `Kit asked for ${r.startDate} to ${r.dueDate}`, r.now),
  );
  return row.id;
}
