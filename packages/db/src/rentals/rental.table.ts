import type { Generated, Insertable, Selectable, Updateable } from 'kysely';
import type { DepositStatus, KitStatus, RentalEntryKind, RentalState, ReturnCondition } from '@revloop/domain/rentals';

/** A flashing kit the shop rents out; contents and platforms are JSON arrays of strings. */
export interface KitTable {
  id: string;
  shop_id: string;
  name: string;
  interface_serial: string;
  laptop_asset_tag: Generated<string>;
  contents: Generated<string>;
  platforms: Generated<string>;
  condition_notes: Generated<string>;
  status: KitStatus;
  weekly_price_minor: number;
  deposit_minor: number;
  late_fee_per_day_minor: number;
  /** Shop-local day the kit entered service (utilisation counts from here). */
  in_service_since: string;
  retired_on: string | null;
  created_at: string;
  updated_at: string;
}
export type KitRow = Selectable<KitTable>;
export type InsertableKitRow = Insertable<KitTable>;
export type UpdateableKitRow = Updateable<KitTable>;

/** A photo of a kit: the bytes are in the blob store under sha256. */
export interface KitPhotoTable {
  id: string;
  shop_id: string;
  kit_id: string;
  sha256: string;
  size_bytes: number;
  content_type: string;
  original_name: string;
  uploaded_by_user_id: string | null;
  created_at: string;
}
export type KitPhotoRow = Selectable<KitPhotoTable>;

/** One rental of a kit for one job; prices are copied from the kit at booking so later kit edits change nothing. */
export interface RentalTable {
  id: string;
  shop_id: string;
  job_id: string;
  kit_id: string | null;
  customer_user_id: string;
  dealer_id: string | null;
  state: RentalState;
  start_date: string;
  due_date: string;
  /** start_date and due_date widened by the shop's shipping days: the days no other booking may touch. */
  blocked_from: string;
  blocked_to: string;
  notes: Generated<string>;
  carrier: string | null;
  tracking_number: string | null;
  shipped_at: string | null;
  delivered_at: string | null;
  received_date: string | null;
  returned_contents: string | null;
  condition: ReturnCondition | null;
  condition_notes: Generated<string>;
  cancel_reason: Generated<string>;
  terms_accepted_at: string | null;
  currency: string;
  fee_minor: number;
  deposit_minor: number;
  late_fee_per_day_minor: number;
  fee_paid_at: string | null;
  fee_checkout_session_id: string | null;
  setup_checkout_session_id: string | null;
  stripe_customer_id: string | null;
  payment_method_id: string | null;
  deposit_status: Generated<DepositStatus>;
  hold_intent_id: string | null;
  hold_minor: Generated<number>;
  hold_expires_at: string | null;
  closed_at: string | null;
  created_at: string;
  updated_at: string;
}
export type RentalRow = Selectable<RentalTable>;
export type InsertableRentalRow = Insertable<RentalTable>;
export type UpdateableRentalRow = Updateable<RentalTable>;

export interface RentalEntryTable {
  id: string;
  shop_id: string;
  rental_id: string;
  kind: RentalEntryKind;
  amount_minor: number;
  description: string;
  /** The provider object behind the line (intent, session), so a webhook replay adds nothing. */
  provider_ref: string | null;
  at: string;
}
export type RentalEntryRow = Selectable<RentalEntryTable>;
export type InsertableRentalEntryRow = Insertable<RentalEntryTable>;

export interface RentalReminderTable {
  rental_id: string;
  kind: string;
  /** The shop-local day the reminder is for. */
  day: string;
  shop_id: string;
  sent_at: string;
}
