import { listCustomerJobMoney, type Db, type JobMoneyRow, type ShopRow } from '@revloop/db';
import { downloadLockFor } from '@revloop/domain/billing';

// Which of a customer's jobs keep their sent revisions locked until paid, read in one query: what the customer's next
// step (job pages, lists, notices) says. Kept apart from download-lock.service so the jobs feature can use it too
// without an import cycle. The domain's downloadLockFor decides each job.

type ShopPaidSetting = Pick<ShopRow, 'id' | 'paid_before_download' | 'currency'>;

const lockedFor = (shop: ShopPaidSetting, r: JobMoneyRow): boolean =>
  downloadLockFor({
    file: { kind: 'revision', draft: false },
    job: { dealerId: r.dealer_id, paymentLockWaivedAt: r.payment_lock_waived_at },
    shop: { paidBeforeDownload: shop.paid_before_download === 1 },
    payments: { priceMinor: r.price_minor, paidMinor: r.paid_minor, refundedMinor: r.refunded_minor, currency: shop.currency },
    viewer: { shopStaff: false },
  }).locked;

/** The ids of the customer's jobs in this shop (or of the one named) whose sent revisions the customer meets locked until paid. */
export async function customerLockedJobIds(db: Db, shop: ShopPaidSetting, customerUserId: string, jobId?: string): Promise<ReadonlySet<string>> {
  // With the shop setting off nothing locks (the domain says so too): skip the read.
  if (shop.paid_before_download !== 1) return new Set();
  const rows = await listCustomerJobMoney(db, shop.id, customerUserId, jobId);
  return new Set(rows.filter((r) => lockedFor(shop, r)).map((r) => r.job_id));
}
