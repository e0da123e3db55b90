import type { Generated, Insertable, Selectable, Updateable } from 'kysely';
import type { LedgerKind, PlanId, ReadOnlyReason, SubscriptionStatus } from '@revloop/domain/billing';

/** One row per shop: the platform subscription as Revloop last learned it from the payment provider. */
export interface ShopSubscriptionTable {
  shop_id: string;
  plan_id: PlanId;
  seats: number;
  status: SubscriptionStatus;
  trial_ends_at: string | null;
  current_period_end: string | null;
  cancel_at_period_end: Generated<number>;
  past_due_since: string | null;
  read_only_reason: ReadOnlyReason | null;
  stripe_customer_id: string | null;
  stripe_subscription_id: string | null;
  /** Latest time the provider reported (its test clock can run ahead of ours). */
  provider_clock: string | null;
  created_at: string;
  updated_at: string;
}
export type ShopSubscriptionRow = Selectable<ShopSubscriptionTable>;
export type InsertableShopSubscriptionRow = Insertable<ShopSubscriptionTable>;
export type UpdateableShopSubscriptionRow = Updateable<ShopSubscriptionTable>;

/** Append-only history of each shop's plan, seats, status and MRR: the revenue chart reads it. */
export interface SubscriptionChangeTable {
  id: string;
  shop_id: string;
  plan_id: PlanId;
  seats: number;
  status: SubscriptionStatus;
  mrr_minor: number;
  at: string;
}
export type SubscriptionChangeRow = Selectable<SubscriptionChangeTable>;

export interface SubscriptionInvoiceTable {
  /** The provider's invoice id. */
  id: string;
  shop_id: string;
  status: string;
  billing_reason: string | null;
  amount_due_minor: number;
  amount_paid_minor: number;
  currency: string;
  period_start: string | null;
  period_end: string | null;
  created_at: string;
  updated_at: string;
}
export type SubscriptionInvoiceRow = Selectable<SubscriptionInvoiceTable>;
export type InsertableSubscriptionInvoiceRow = Insertable<SubscriptionInvoiceTable>;

/** Webhook events already applied: the id is inserted in the same transaction as the event's effect. */
export interface StripeEventTable {
  id: string;
  type: string;
  shop_id: string | null;
  received_at: string;
}

export type PaymentPurpose = 'job' | 'topup';
export type PaymentStatus = 'open' | 'paid' | 'expired';

/** A Checkout payment to a shop: a customer paying a job, or a dealer topping up their balance. */
export interface PaymentTable {
  id: string;
  shop_id: string;
  purpose: PaymentPurpose;
  job_id: string | null;
  dealer_id: string | null;
  payer_user_id: string;
  amount_minor: number;
  currency: string;
  status: PaymentStatus;
  stripe_checkout_session_id: string;
  stripe_payment_intent_id: string | null;
  created_at: string;
  paid_at: string | null;
}
export type PaymentRow = Selectable<PaymentTable>;
export type InsertablePaymentRow = Insertable<PaymentTable>;
export type UpdateablePaymentRow = Updateable<PaymentTable>;

export interface PaymentRefundTable {
  id: string;
  shop_id: string;
  payment_id: string;
  amount_minor: number;
  currency: string;
  reason: string;
  stripe_refund_id: string;
  by_user_id: string | null;
  created_at: string;
}
export type PaymentRefundRow = Selectable<PaymentRefundTable>;
export type InsertablePaymentRefundRow = Insertable<PaymentRefundTable>;

/** A dealer's prepaid balance, one signed entry at a time; rows are never updated or deleted. */
export interface LedgerEntryTable {
  id: string;
  shop_id: string;
  dealer_id: string;
  /** 1, 2, 3 … per dealer: the order entries were written in. */
  seq: number;
  kind: LedgerKind;
  amount_minor: number;
  currency: string;
  balance_after_minor: number;
  job_id: string | null;
  payment_id: string | null;
  memo: string;
  created_by_user_id: string | null;
  created_at: string;
}
export type LedgerEntryRow = Selectable<LedgerEntryTable>;
