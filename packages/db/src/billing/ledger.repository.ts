import type { LedgerKind } from '@revloop/domain/billing';
import type { Db } from '../client';
import { newId } from '../ids';
import type { LedgerEntryRow } from './billing.table';

/** The dealer's balance: the running balance of their latest entry, 0 before the first. */
export async function dealerBalance(db: Db, shopId: string, dealerId: string): Promise<number> {
  const last = await db
    .selectFrom('ledger_entries')
    .select('balance_after_minor')
    .where('shop_id', '=', shopId)
    .where('dealer_id', '=', dealerId)
    .orderBy('seq', 'desc')
    .limit(1)
    .executeTakeFirst();
  return last?.balance_after_minor ?? 0;
}

export interface LedgerAppend {
  shopId: string;
  dealerId: string;
  kind: LedgerKind;
  /** Signed: credits positive, debits negative. */
  amountMinor: number;
  currency: string;
  jobId?: string | null;
  paymentId?: string | null;
  memo: string;
  createdByUserId?: string | null;
  at: string;
}

/**
 * Appends one entry with the next sequence number and the new running balance. Run it inside the transaction
 * that makes the money move, so the balance it read is the one it extends (the unique seq refuses a race).
 */
export async function appendLedgerEntry(db: Db, entry: LedgerAppend): Promise<LedgerEntryRow> {
  const last = await db
    .selectFrom('ledger_entries')
    .select(['seq', 'balance_after_minor'])
    .where('shop_id', '=', entry.shopId)
    .where('dealer_id', '=', entry.dealerId)
    .orderBy('seq', 'desc')
    .limit(1)
    .executeTakeFirst();
  return db
    .insertInto('ledger_entries')
    .values({
      id: newId(),
      shop_id: entry.shopId,
      dealer_id: entry.dealerId,
      seq: (last?.seq ?? 0) + 1,
      kind: entry.kind,
      amount_minor: entry.amountMinor,
      currency: entry.currency,
      balance_after_minor: (last?.balance_after_minor ?? 0) + entry.amountMinor,
      job_id: entry.jobId ?? null,
      payment_id: entry.paymentId ?? null,
      memo: entry.memo,
      created_by_user_id: entry.createdByUserId ?? null,
      created_at: entry.at,
    })
    .returningAll()
    .executeTakeFirstOrThrow();
}

export interface LedgerListRow extends LedgerEntryRow {
  job_number: number | null;
}

export async function listLedgerEntries(db: Db, shopId: string, dealerId: string): Promise<LedgerListRow[]> {
  return db
    .selectFrom('ledger_entries')
    .leftJoin('jobs', 'jobs.id', 'ledger_entries.job_id')
    .selectAll('ledger_entries')
    .select('jobs.number as job_number')
    .where('ledger_entries.shop_id', '=', shopId)
    .where('ledger_entries.dealer_id', '=', dealerId)
    .orderBy('ledger_entries.seq')
    .execute();
}

export async function findJobDebit(db: Db, shopId: string, jobId: string): Promise<LedgerEntryRow | undefined> {
  return db.selectFrom('ledger_entries').selectAll().where('shop_id', '=', shopId).where('job_id', '=', jobId).where('kind', '=', 'job_debit').executeTakeFirst();
}
