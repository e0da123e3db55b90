import { DOWNLOAD_LOCK_REASONS, LEDGER_KINDS, PLAN_IDS, SUBSCRIPTION_STATUSES, type MrrPoint, type ReadOnlyReason } from '@revloop/domain/billing';
import { z } from 'zod';
import { itemOf, listOf, timestamp } from './envelope';

const readOnlyReason = z.custom<ReadOnlyReason>((v) => typeof v === 'string');

export const planOfferSchema = z.object({
  id: z.enum(PLAN_IDS),
  name: z.string(),
  seatPriceMinor: z.number(),
  minSeats: z.number(),
  maxSeats: z.number(),
  jobsPerMonth: z.number(),
  summary: z.string(),
});
export type PlanOffer = z.infer<typeof planOfferSchema>;

export const subscriptionInvoiceSchema = z.object({
  id: z.string(),
  status: z.string(),
  reason: z.string().nullable(),
  amountDueMinor: z.number(),
  amountPaidMinor: z.number(),
  currency: z.string(),
  periodStart: timestamp.nullable(),
  periodEnd: timestamp.nullable(),
  createdAt: timestamp,
});
export type SubscriptionInvoice = z.infer<typeof subscriptionInvoiceSchema>;

/** `GET /api/billing/subscription`: plan, seats, usage, status, invoices and the plans on offer. */
export const subscriptionSchema = z.object({
  planId: z.enum(PLAN_IDS),
  planName: z.string(),
  seats: z.number(),
  status: z.enum(SUBSCRIPTION_STATUSES),
  statusLabel: z.string(),
  currency: z.string(),
  monthlyAmountMinor: z.number(),
  trialEndsAt: timestamp.nullable(),
  currentPeriodEnd: timestamp.nullable(),
  cancelAtPeriodEnd: z.boolean(),
  pastDueSince: timestamp.nullable(),
  graceEndsAt: timestamp.nullable(),
  readOnlyReason: readOnlyReason.nullable(),
  readOnlyText: z.string().nullable(),
  /** A running subscription at the payment provider: plan changes apply to it directly. */
  managedByProvider: z.boolean(),
  hasPaymentMethod: z.boolean(),
  usage: z.object({ seatsInUse: z.number(), jobsThisMonth: z.number(), jobsPerMonth: z.number() }),
  invoices: z.array(subscriptionInvoiceSchema),
  plans: z.array(planOfferSchema),
});
export type Subscription = z.infer<typeof subscriptionSchema>;
export const subscriptionResponseSchema = itemOf(subscriptionSchema);

export const jobRefundSchema = z.object({ id: z.string(), amountMinor: z.number(), reason: z.string(), createdAt: timestamp });
export type JobRefund = z.infer<typeof jobRefundSchema>;

export const PAYMENT_STATUSES = ['open', 'paid', 'expired'] as const;

export const jobPaymentSchema = z.object({
  id: z.string(),
  amountMinor: z.number(),
  currency: z.string(),
  status: z.enum(PAYMENT_STATUSES),
  payerName: z.string(),
  createdAt: timestamp,
  paidAt: timestamp.nullable(),
  refundedMinor: z.number(),
  refunds: z.array(jobRefundSchema),
});
export type JobPayment = z.infer<typeof jobPaymentSchema>;

/** `GET /api/billing/jobs/:id/payments`. */
export const jobPaymentsSchema = z.object({
  jobId: z.string(),
  currency: z.string(),
  /** Retail price of the job's package. */
  priceMinor: z.number(),
  paidMinor: z.number(),
  refundedMinor: z.number(),
  dueMinor: z.number(),
  /** A dealer's customer: the dealer paid wholesale from their balance; the amount only for those who may read that ledger. */
  paidByDealer: z.object({ dealerName: z.string(), amountMinor: z.number().nullable() }).nullable(),
  payments: z.array(jobPaymentSchema),
  canPay: z.boolean(),
  canRefund: z.boolean(),
  /** Paid before download, as the job's customer meets it: their sent revisions locked until the job is paid, or not. */
  downloadLock: z.object({
    /** The customer's sent revisions are locked now (the job is unpaid and nobody waived the lock). */
    locked: z.boolean(),
    reason: z.enum(DOWNLOAD_LOCK_REASONS),
    message: z.string(),
    /** When and by whom the owner waived the lock for this job; null while it is not waived. */
    waivedAt: timestamp.nullable(),
    waivedBy: z.object({ id: z.string(), name: z.string() }).nullable(),
    /** The viewer may waive the lock now (the owner, while it still holds). */
    canWaive: z.boolean(),
  }),
});
export type JobPayments = z.infer<typeof jobPaymentsSchema>;
export const jobPaymentsResponseSchema = itemOf(jobPaymentsSchema);

export const ledgerEntrySchema = z.object({
  id: z.string(),
  seq: z.number(),
  kind: z.enum(LEDGER_KINDS),
  kindLabel: z.string(),
  amountMinor: z.number(),
  balanceAfterMinor: z.number(),
  jobId: z.string().nullable(),
  jobNumber: z.number().nullable(),
  memo: z.string(),
  createdAt: timestamp,
});
export type LedgerEntry = z.infer<typeof ledgerEntrySchema>;

/** `GET /api/dealers/:id/ledger`. */
export const dealerLedgerSchema = z.object({
  dealer: z.object({ id: z.string(), name: z.string() }),
  currency: z.string(),
  balanceMinor: z.number(),
  canTopUp: z.boolean(),
  entries: z.array(ledgerEntrySchema),
});
export type DealerLedger = z.infer<typeof dealerLedgerSchema>;
export const dealerLedgerResponseSchema = itemOf(dealerLedgerSchema);

export const dealerBalanceSchema = z.object({ id: z.string(), name: z.string(), balanceMinor: z.number(), currency: z.string() });
export type DealerBalance = z.infer<typeof dealerBalanceSchema>;
export const dealerBalancesResponseSchema = listOf(dealerBalanceSchema);

export const shopRevenueSchema = z.object({
  shopId: z.string(),
  shopName: z.string(),
  shopStatus: z.enum(['active', 'suspended']),
  planId: z.enum(PLAN_IDS),
  planName: z.string(),
  seats: z.number(),
  status: z.enum(SUBSCRIPTION_STATUSES),
  statusLabel: z.string(),
  mrrMinor: z.number(),
  trialEndsAt: timestamp.nullable(),
  currentPeriodEnd: timestamp.nullable(),
  readOnlyReason: readOnlyReason.nullable(),
  readOnlyText: z.string().nullable(),
});
export type ShopRevenue = z.infer<typeof shopRevenueSchema>;

/** `GET /api/admin/revenue`. */
export const revenueSchema = z.object({
  currency: z.string(),
  mrrMinor: z.number(),
  shops: z.array(shopRevenueSchema),
  series: z.array(z.object({ month: z.string(), mrrMinor: z.number(), shops: z.number() }) satisfies z.ZodType<MrrPoint>),
});
export type Revenue = z.infer<typeof revenueSchema>;
export const revenueResponseSchema = itemOf(revenueSchema);

/** A file's paid-before-download lock as its viewer meets it (`lock` on each file of `GET /api/jobs/:id/files`). */
export const downloadLockSchema = z.object({
  locked: z.boolean(),
  reason: z.enum(DOWNLOAD_LOCK_REASONS),
  /** Still due on the job, in minor units (0 unless locked). */
  dueMinor: z.number(),
  message: z.string(),
});
export type DownloadLockView = z.infer<typeof downloadLockSchema>;

/** What `GET /api/shop` adds about payment before download: a retail customer's sent revisions stay locked until the job is paid. */
export const shopPaymentLockSchema = z.object({ paidBeforeDownload: z.boolean() });
export type ShopPaymentLock = z.infer<typeof shopPaymentLockSchema>;
/** The paid-before-download field of `PATCH /api/shop` (owner). */
export const shopPaymentLockPatchSchema = shopPaymentLockSchema.partial();
export type ShopPaymentLockPatch = z.infer<typeof shopPaymentLockPatchSchema>;
