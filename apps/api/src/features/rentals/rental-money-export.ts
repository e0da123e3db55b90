import { listRentalMoney } from '@revloop/db';
import { DomainError } from '@revloop/domain';
import { minorToDecimalString } from '@revloop/domain/billing';
import { toCsv } from '@revloop/domain/csv';
import { addDays, daysInRange, localDay, RENTAL_ENTRY_LABELS, type DayRange } from '@revloop/domain/rentals';
import type { AppDeps } from '../../context';
import { authorize } from '../../http/auth-context';
import { shopRentalSettings, type ShopAuth } from './rental-records';

/** Ten years at a time is plenty for an accountant and keeps one download bounded. */
const MAX_EXPORT_DAYS = 3_660;

export const RENTAL_MONEY_CSV_HEADER = ['Day', 'Time (UTC)', 'Job', 'Customer', 'Kit', 'Line', 'Description', 'Amount', 'Currency', 'Rental'];

/**
 * GET /api/rentals/money.csv (owner): every money line of every rental (fee, card saved, hold placed, released or
 * lapsed, capture with its reason, late fee) whose instant falls on a shop-local day within from..to.
 */
export async function rentalMoneyCsv(deps: Pick<AppDeps, 'db'>, auth: ShopAuth, range: DayRange): Promise<{ csv: string; fileName: string }> {
  authorize(auth, 'update', 'Rental');
  if (daysInRange(range) > MAX_EXPORT_DAYS) throw new DomainError('validation', `to: Export at most ${MAX_EXPORT_DAYS} days at a time.`);
  const { timeZone } = shopRentalSettings(auth.shop.settings);
  // UTC bounds a day either side of the range cover every zone; the shop-local day decides.
  const rows = await listRentalMoney(deps.db, auth.shop.id, `${addDays(range.from, -1)}T00:00:00.000Z`, `${addDays(range.to, 2)}T00:00:00.000Z`);
  const lines = rows
    .map((r) => ({ r, day: localDay(new Date(r.at), timeZone) }))
    .filter(({ day }) => day >= range.from && day <= range.to)
    .map(({ r, day }) => [day, r.at, r.job_number, r.customer_name, r.kit_name, RENTAL_ENTRY_LABELS[r.kind], r.description, minorToDecimalString(r.amount_minor, r.currency), r.currency, r.rental_id]);
  return { csv: toCsv(RENTAL_MONEY_CSV_HEADER, lines), fileName: `kit-rental-money-${range.from}-to-${range.to}.csv` };
}
