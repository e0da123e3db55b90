import { DomainError } from '../errors';
import { formatMoney } from './money';

/** Kinds of dealer ledger entries; credits are positive, debits negative. */
export const LEDGER_KINDS = ['top_up', 'job_debit', 'job_credit', 'adjustment'] as const;
export type LedgerKind = (typeof LEDGER_KINDS)[number];

export const LEDGER_KIND_LABELS: Record<LedgerKind, string> = {
  top_up: 'Top-up',
  job_debit: 'Job opened',
  job_credit: 'Job credit',
  adjustment: 'Adjustment',
};

/** Running balance after each entry, in the order given (oldest first). */
export function runningBalances(amounts: readonly number[]): number[] {
  let balance = 0;
  return amounts.map((amount) => {
    balance += amount;
    if (!Number.isSafeInteger(balance)) throw new DomainError('validation', 'The balance is out of range.');
    return balance;
  });
}

/** A dealer's prepaid balance must cover the wholesale price before a job is opened for them. */
export function assertBalanceCovers(balanceMinor: number, debitMinor: number, currency: string): void {
  if (balanceMinor < debitMinor) {
    throw new DomainError(
      'insufficient_balance',
      `The dealer balance is ${formatMoney(balanceMinor, currency)} but this package costs ${formatMoney(debitMinor, currency)} wholesale. Top up the balance first.`,
      { balanceMinor, requiredMinor: debitMinor },
    );
  }
}

/** A low-balance mail goes out once, when a debit takes the balance below what one more job of the same price needs. */
export const crossesLowBalance = (beforeMinor: number, afterMinor: number, nextJobMinor: number): boolean =>
  beforeMinor >= nextJobMinor && afterMinor < nextJobMinor;

/** How much of a payment can still be refunded, and a check that a refund fits in it. */
export function assertRefundable(paidMinor: number, refundedMinor: number, amountMinor: number, currency: string): void {
  const left = paidMinor - refundedMinor;
  if (left <= 0) throw new DomainError('conflict', 'This payment is already refunded in full.');
  if (!Number.isSafeInteger(amountMinor) || amountMinor <= 0) throw new DomainError('validation', 'Enter an amount above zero.');
  if (amountMinor > left) {
    throw new DomainError('validation', `At most ${formatMoney(left, currency)} of this payment is left to refund.`);
  }
}
