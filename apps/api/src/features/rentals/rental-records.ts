import { findRental, insertRentalEntry, newId, type Db, type RentalListRow, type RentalRow } from '@revloop/db';
import { rentalScopeFor } from '@revloop/domain/auth';
import { rentalSettings, type RentalEntryKind } from '@revloop/domain/rentals';
import { parseShopSettings } from '@revloop/domain/shops';
import { authorizeRow, type AuthContext } from '../../http/auth-context';
import { recordAudit, type AuditInput } from '../audit/audit.service';

// What every part of the rentals feature shares: the viewer's rental, the shop's rental settings, money lines, audit.

export type ShopAuth = AuthContext & { shop: { id: string; name: string; currency: string; settings: string } };

/** The Rental subject a row is checked against: its shop and the job's customer and dealer. */
export const rentalSubject = (row: Pick<RentalRow, 'shop_id' | 'customer_user_id' | 'dealer_id'>) => ({
  shopId: row.shop_id,
  customerUserId: row.customer_user_id,
  dealerId: row.dealer_id,
});

export const shopRentalSettings = (settingsJson: string) => {
  const settings = parseShopSettings(settingsJson);
  return { ...rentalSettings(settings), timeZone: settings.timeZone };
};

/** The rental if this viewer may read it; another shop's, or another customer's, answers 404. */
export async function loadRental(db: Db, auth: ShopAuth, id: string): Promise<RentalListRow> {
  const row = await findRental(db, auth.shop.id, id, rentalScopeFor(auth.actor));
  authorizeRow(auth, 'read', 'Rental', row && rentalSubject(row), 'Rental not found.');
  return row!;
}

/** A money line, written once (provider_ref) and told on the job's timeline. */
export async function addEntry(db: Db, row: RentalRow, kind: RentalEntryKind, amountMinor: number, description: string, at: Date, providerRef: string | null): Promise<boolean> {
  return insertRentalEntry(db, { id: newId(), shop_id: row.shop_id, rental_id: row.id, kind, amount_minor: amountMinor, description, provider_ref: providerRef, at: at.toISOString() });
}

type AuditedRental = Pick<RentalRow, 'shop_id' | 'id' | 'job_id' | 'kit_id'>;

/** Every move is one event on the job's timeline and one in the kit's history (for `writeWithAudit`). */
export function rentalAuditEvents(row: AuditedRental, actorUserId: string | null, action: string, text: string, at: Date): AuditInput[] {
  const details = { rentalId: row.id, kitId: row.kit_id, jobId: row.job_id, text };
  const event = (subjectType: string, subjectId: string): AuditInput => ({ shopId: row.shop_id, actorUserId, action, subjectType, subjectId, details, at });
  return row.kit_id ? [event('Job', row.job_id), event('Kit', row.kit_id)] : [event('Job', row.job_id)];
}

/** The same events, written on the caller's transaction `trx`. */
export async function auditRental(trx: Db, row: AuditedRental, actorUserId: string | null, action: string, text: string, at: Date): Promise<void> {
  for (const event of rentalAuditEvents(row, actorUserId, action, text, at)) await recordAudit(trx, event);
}


