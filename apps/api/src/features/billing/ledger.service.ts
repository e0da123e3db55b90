import {
  appendLedgerEntry,
  dealerBalance,
  findDealer,
  findShopById,
  findUserById,
  listDealers,
  listLedgerEntries,
  listMembers,
  type Db,
} from '@revloop/db';
import type { DealerLedger } from '@revloop/contract';
import { DomainError } from '@revloop/domain';
import { asSubject } from '@revloop/domain/auth';
import { LEDGER_KIND_LABELS, assertBalanceCovers, crossesLowBalance, formatMoney } from '@revloop/domain/billing';
import { toCsv } from '@revloop/domain/csv';
import type { AppDeps } from '../../context';
import { authorizeRow, type AuthContext } from '../../http/auth-context';
import { recordAudit } from '../audit/audit.service';
import { lowBalanceMail } from './billing.mails';

type ShopAuth = AuthContext & { shop: { id: string; currency: string } };

export const statementLink = (deps: Pick<AppDeps, 'env'>, dealerId: string) => `${deps.env.APP_ORIGIN}/billing/statement/${encodeURIComponent(dealerId)}`;

export interface DealerDebit {
  dealerId: string;
  amountMinor: number;
  balanceBeforeMinor: number;
  balanceAfterMinor: number;
}

/**
 * Debits the package's dealer price from the dealer's balance as the job opens. Call inside the job's transaction:
 * a short balance throws `insufficient_balance` and nothing of the job is kept.
 */
export async function debitDealerForJob(
  db: Db,
  p: { shopId: string; currency: string; dealerId: string; jobId: string; packageName: string; amountMinor: number; userId: string; at: string },
): Promise<DealerDebit | null> {
  if (p.amountMinor === 0) return null;
  const before = await dealerBalance(db, p.shopId, p.dealerId);
  assertBalanceCovers(before, p.amountMinor, p.currency);
  const entry = await appendLedgerEntry(db, { shopId: p.shopId, dealerId: p.dealerId, kind: 'job_debit', amountMinor: -p.amountMinor, currency: p.currency, jobId: p.jobId, memo: `${p.packageName} (wholesale)`, createdByUserId: p.userId, at: p.at });
  await recordAudit(db, { shopId: p.shopId, actorUserId: p.userId, action: 'ledger.job_debit', subjectType: 'Job', subjectId: p.jobId, details: { amountMinor: p.amountMinor, text: `Paid wholesale from the dealer balance: ${formatMoney(p.amountMinor, p.currency)}` }, at: new Date(p.at) });
  return { dealerId: p.dealerId, amountMinor: p.amountMinor, balanceBeforeMinor: before, balanceAfterMinor: entry.balance_after_minor };
}

/** After the job's transaction commits: the low-balance mail to the dealer's users and contact, once per crossing. */
export async function afterDealerDebit(deps: AppDeps, shopId: string, debit: DealerDebit | null): Promise<void> {
  if (!debit || !crossesLowBalance(debit.balanceBeforeMinor, debit.balanceAfterMinor, debit.amountMinor)) return;
  const [shop, dealer] = [await findShopById(deps.db, shopId), await findDealer(deps.db, shopId, debit.dealerId)];
  if (!shop || !dealer) return;
  const users = (await listMembers(deps.db, shopId, { role: 'dealer', dealerId: dealer.id })).filter((m) => m.status === 'active');
  const emails = new Set([dealer.contact_email]);
  for (const u of users) {
    const user = await findUserById(deps.db, u.user_id);
    if (user) emails.add(user.email);
  }
  for (const to of emails) {
    await deps.mailer.send(lowBalanceMail(to, { shopName: shop.name, dealerName: dealer.name, balanceMinor: debit.balanceAfterMinor, nextJobMinor: debit.amountMinor, currency: shop.currency, link: statementLink(deps, dealer.id) }));
  }
}

/** `GET /api/dealers/:id/ledger`: the statement with its running balance, for the dealer or the owner. */
export async function dealerLedger(deps: AppDeps, auth: ShopAuth, dealerId: string): Promise<DealerLedger> {
  const dealer = await findDealer(deps.db, auth.shop.id, dealerId);
  if (!dealer) throw new DomainError('not_found', 'Dealer not found.');
  authorizeRow(auth, 'read', 'Ledger', { shopId: dealer.shop_id, dealerId: dealer.id }, 'Dealer not found.');
  const entries = await listLedgerEntries(deps.db, auth.shop.id, dealerId);
  return {
    dealer: { id: dealer.id, name: dealer.name },
    currency: auth.shop.currency,
    balanceMinor: entries.at(-1)?.balance_after_minor ?? 0,
    canTopUp: auth.ability.can('create', asSubject('Payment', { shopId: auth.shop.id, dealerId })),
    entries: entries.map((e) => ({
      id: e.id,
      seq: e.seq,
      kind: e.kind,
      kindLabel: LEDGER_KIND_LABELS[e.kind],
      amountMinor: e.amount_minor,
      balanceAfterMinor: e.balance_after_minor,
      jobId: e.job_id,
      jobNumber: e.job_number,
      memo: e.memo,
      createdAt: e.created_at,
    })),
  };
}

export function ledgerCsv(ledger: Awaited<ReturnType<typeof dealerLedger>>): string {
  const amount = (minor: number) => formatMoney(minor, ledger.currency, 'en-US');
  return toCsv(
    ['Date', 'Entry', 'Job', 'Description', `Amount (${ledger.currency})`, `Balance (${ledger.currency})`],
    ledger.entries.map((e) => [e.createdAt, e.kindLabel, e.jobNumber, e.memo, amount(e.amountMinor), amount(e.balanceAfterMinor)]),
  );
}

/** Every dealer of the shop with its prepaid balance. */
export async function dealerBalances(deps: Pick<AppDeps, 'db'>, shop: { id: string; currency: string }) {
  const data = [];
  for (const d of await listDealers(deps.db, shop.id)) data.push({ id: d.id, name: d.name, balanceMinor: await dealerBalance(deps.db, shop.id, d.id), currency: shop.currency });
  return data;
}

/** A dealer's statement as a CSV download: its file name and text. */
export async function dealerStatementCsv(deps: AppDeps, auth: ShopAuth, dealerId: string) {
  const ledger = await dealerLedger(deps, auth, dealerId);
  return { fileName: `statement-${ledger.dealer.name.toLowerCase().replace(/[^a-z0-9]+/g, '-')}.csv`, csv: ledgerCsv(ledger) };
}
