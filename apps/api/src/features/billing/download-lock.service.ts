import { findPackage, findUserById, listJobPayments, updateJob, type CalibrationFileRow, type Db, type JobListRow, type ShopRow } from '@revloop/db';
import type { JobPayments } from '@revloop/contract';
import { DomainError } from '@revloop/domain';
import { asSubject, type Actor } from '@revloop/domain/auth';
import { downloadLockFor, type DownloadLock, type DownloadLockFacts } from '@revloop/domain/billing';
import type { AppDeps } from '../../context';
import { authorizeRow, type AuthContext } from '../../http/auth-context';
import { recordAudit } from '../audit/audit.service';
import { loadJob } from '../jobs/job.service';
import { customerLockedJobIds } from './customer-revision-locks';

// Paid before download as the API asks it: the facts of a job gathered once, the domain's downloadLockFor decides.

type ShopPaidSetting = Pick<ShopRow, 'paid_before_download' | 'currency'>;

/** The job's money: its package's retail price, what was paid and what of it was refunded. */
export async function jobMoneyFacts(db: Db, shop: { id: string; currency: string }, job: JobListRow): Promise<DownloadLockFacts['payments']> {
  const pkg = await findPackage(db, shop.id, job.package_id);
  const paid = (await listJobPayments(db, shop.id, job.id)).filter((p) => p.status === 'paid');
  return {
    priceMinor: pkg?.retail_price_minor ?? 0,
    paidMinor: paid.reduce((sum, p) => sum + p.amount_minor, 0),
    refundedMinor: paid.reduce((sum, p) => sum + p.refunded_minor, 0),
    currency: shop.currency,
  };
}

/** Owners and tuners are the bench: the lock keeps the customer side waiting, never them. */
export const isBench = (actor: Pick<Actor, 'role'>): boolean => actor.role === 'owner' || actor.role === 'tuner';

/** A function giving each file of this job its lock for this viewer; the job's money is read once, and only if needed. */
export async function downloadLocksFor(db: Db, shop: ShopPaidSetting & { id: string }, job: JobListRow, viewer: { shopStaff: boolean }) {
  const needsMoney = !viewer.shopStaff && job.dealer_id === null && shop.paid_before_download === 1 && job.payment_lock_waived_at === null;
  const payments = needsMoney ? await jobMoneyFacts(db, shop, job) : { priceMinor: 0, paidMinor: 0, refundedMinor: 0, currency: shop.currency };
  return (row: Pick<CalibrationFileRow, 'kind'> & { draft: boolean }): DownloadLock =>
    downloadLockFor({
      file: { kind: row.kind, draft: row.draft },
      job: { dealerId: job.dealer_id, paymentLockWaivedAt: job.payment_lock_waived_at },
      shop: { paidBeforeDownload: shop.paid_before_download === 1 },
      payments,
      viewer,
    });
}

const NONE: ReadonlySet<string> = new Set();

/**
 * The signed-in customer's jobs whose sent revisions are locked until paid, as ids (all their jobs in this shop, or the
 * one named): what their next step says and offers. Only a customer meets the lock (the bench never does, and a
 * dealer's jobs are paid from its balance), so anybody else gets none.
 */
export async function lockedJobIdsForCustomer(db: Db, auth: Pick<AuthContext, 'actor'> & { shop: ShopPaidSetting & { id: string } }, jobId?: string): Promise<ReadonlySet<string>> {
  if (auth.actor.role !== 'customer') return NONE;
  return customerLockedJobIds(db, auth.shop, auth.actor.userId, jobId);
}

/** The lock as the job's customer meets it on a sent revision: what the job page shows to the customer and to the owner. */
export async function customerDownloadLock(deps: Pick<AppDeps, 'db'>, auth: AuthContext & { shop: ShopRow }, job: JobListRow): Promise<JobPayments['downloadLock']> {
  const lockOf = await downloadLocksFor(deps.db, auth.shop, job, { shopStaff: false });
  const lock = lockOf({ kind: 'revision', draft: false });
  const waiver = job.payment_lock_waived_by_user_id ? await findUserById(deps.db, job.payment_lock_waived_by_user_id) : undefined;
  const waivable = job.dealer_id === null && auth.shop.paid_before_download === 1 && job.payment_lock_waived_at === null;
  return {
    locked: lock.locked,
    reason: lock.reason,
    message: lock.message,
    waivedAt: job.payment_lock_waived_at,
    waivedBy: job.payment_lock_waived_by_user_id ? { id: job.payment_lock_waived_by_user_id, name: waiver?.name ?? '' } : null,
    canWaive: lock.locked && waivable && auth.ability.can('waive', asSubject('Payment', { shopId: job.shop_id, customerUserId: job.customer_user_id, dealerId: job.dealer_id })),
  };
}

/**
 * `POST /api/billing/jobs/:jobId/payment-lock/waive`: the owner lets this job's customer download before paying.
 * Recorded on the job's timeline; waiving twice is a conflict, not a second entry.
 */
export async function waivePaymentLock(deps: AppDeps, auth: AuthContext & { shop: ShopRow }, jobId: string): Promise<void> {
  const job = await loadJob(deps.db, auth, jobId);
  authorizeRow(auth, 'waive', 'Payment', { shopId: job.shop_id, customerUserId: job.customer_user_id, dealerId: job.dealer_id }, 'Job not found.');
  if (job.dealer_id !== null) throw new DomainError('conflict', 'A dealer’s job is paid from the dealer balance and never locked.');
  if (job.payment_lock_waived_at !== null) throw new DomainError('conflict', 'Payment before download is already waived for this job.');
  const now = deps.clock.now();
  await deps.db.transaction().execute(async (trx) => {
    await updateJob(trx, auth.shop.id, job.id, { payment_lock_waived_at: now.toISOString(), payment_lock_waived_by_user_id: auth.user.id });
    await recordAudit(trx, {
      shopId: auth.shop.id,
      actorUserId: auth.user.id,
      action: 'payment.lock_waived',
      subjectType: 'Job',
      subjectId: job.id,
      details: { text: 'Payment before download waived: the customer may download the revisions before paying' },
      at: now,
    });
  });
}
