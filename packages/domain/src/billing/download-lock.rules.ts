import { DomainError } from '../errors';
import { formatMoney } from './money';

/**
 * Paid before download: the one rule deciding whether a calibration file may be downloaded before its job is paid.
 * A shop (on by default) keeps a retail customer's sent revisions locked until the job's package is paid in full, or
 * until the owner waives the lock for that job. Reads, re-reads and logs are never locked, nor is anything a dealer's
 * customer gets (the dealer paid from its balance at intake), nor anything the shop's own staff download.
 */
export const DOWNLOAD_LOCK_REASONS = [
  /** Locked: the job is not paid yet. */
  'unpaid',
  /** Not locked, and why not. */
  'not_a_revision',
  'draft',
  'shop_staff',
  'setting_off',
  'dealer_job',
  'paid',
  'waived',
] as const;
export type DownloadLockReason = (typeof DOWNLOAD_LOCK_REASONS)[number];

export interface DownloadLockFacts {
  file: { kind: 'read' | 'revision' | 're_read'; draft: boolean };
  job: { dealerId: string | null; paymentLockWaivedAt: string | null };
  shop: { paidBeforeDownload: boolean };
  /** The job's money in minor units: its package's retail price, what was paid and what of it was refunded. */
  payments: { priceMinor: number; paidMinor: number; refundedMinor: number; currency: string };
  /** Owners and tuners download whatever they see: the lock keeps the customer side waiting, never the bench. */
  viewer: { shopStaff: boolean };
}

export interface DownloadLock {
  locked: boolean;
  reason: DownloadLockReason;
  /** What is still due on the job, in minor units (0 unless locked). */
  dueMinor: number;
  /** A sentence for the person who sees the lock. */
  message: string;
}

/** What is still due on a retail job: the price less what was paid and not refunded, never below nothing. */
export const dueOnJobMinor = (p: DownloadLockFacts['payments']): number => Math.max(0, p.priceMinor - (p.paidMinor - p.refundedMinor));

const open = (reason: DownloadLockReason, message: string): DownloadLock => ({ locked: false, reason, dueMinor: 0, message });

/** Whether this file is locked for this viewer, and why (or why not). */
export function downloadLockFor(facts: DownloadLockFacts): DownloadLock {
  const { file, job, shop, payments, viewer } = facts;
  if (file.kind !== 'revision') return open('not_a_revision', 'Reads, re-reads and logs are never locked.');
  if (file.draft) return open('draft', 'A draft is the shop’s own until it is sent.');
  if (viewer.shopStaff) return open('shop_staff', 'The shop’s own staff download every revision they see.');
  if (job.dealerId !== null) return open('dealer_job', 'The dealer paid for this job from its balance.');
  if (!shop.paidBeforeDownload) return open('setting_off', 'This shop lets revisions be downloaded before payment.');
  if (job.paymentLockWaivedAt !== null) return open('waived', 'The shop waived payment before download for this job.');
  const dueMinor = dueOnJobMinor(payments);
  if (dueMinor === 0) return open('paid', 'The job is paid.');
  return {
    locked: true,
    reason: 'unpaid',
    dueMinor,
    message: `This revision unlocks when the job is paid: ${formatMoney(dueMinor, payments.currency)} is due. Pay on the job page, then download it.`,
  };
}

/** Refuses a locked download with 402 `payment_required` and the lock's message. */
export function assertDownloadUnlocked(lock: DownloadLock): void {
  if (lock.locked) throw new DomainError('payment_required', lock.message, { reason: lock.reason, dueMinor: lock.dueMinor });
}
