import type Stripe from 'stripe';

// Each object is a Pick of the SDK's own type, so a renamed or retyped field fails `tsc` here.

export type Metadata = Record<string, string>;

export interface ListObject<T> {
  object: 'list';
  data: T[];
  has_more: boolean;
  url: string;
}

export type FakeCustomer = Pick<
  Stripe.Customer,
  | 'id'
  | 'object'
  | 'address'
  | 'balance'
  | 'created'
  | 'currency'
  | 'default_source'
  | 'delinquent'
  | 'description'
  | 'email'
  | 'invoice_prefix'
  | 'livemode'
  | 'metadata'
  | 'name'
  | 'next_invoice_sequence'
  | 'phone'
  | 'preferred_locales'
  | 'shipping'
  | 'tax_exempt'
> & {
  invoice_settings: { custom_fields: null; default_payment_method: string | null; footer: null; rendering_options: null };
};

export type FakeProduct = Pick<
  Stripe.Product,
  | 'id'
  | 'object'
  | 'active'
  | 'created'
  | 'default_price'
  | 'description'
  | 'images'
  | 'livemode'
  | 'marketing_features'
  | 'metadata'
  | 'name'
  | 'package_dimensions'
  | 'shippable'
  | 'statement_descriptor'
  | 'tax_code'
  | 'tax_details'
  | 'unit_label'
  | 'updated'
  | 'url'
> & { type: 'service' };

export type FakeRecurring = Pick<Stripe.Price.Recurring, 'interval' | 'interval_count' | 'meter' | 'trial_period_days' | 'usage_type'>;

export type FakePrice = Pick<
  Stripe.Price,
  | 'id'
  | 'object'
  | 'active'
  | 'billing_scheme'
  | 'created'
  | 'currency'
  | 'custom_unit_amount'
  | 'livemode'
  | 'lookup_key'
  | 'metadata'
  | 'nickname'
  | 'tax_behavior'
  | 'tiers_mode'
  | 'transform_quantity'
  | 'type'
  | 'unit_amount'
> & { product: string; recurring: FakeRecurring | null; unit_amount_decimal: string };

export type FakeLineItem = Pick<
  Stripe.LineItem,
  'id' | 'object' | 'amount_discount' | 'amount_subtotal' | 'amount_tax' | 'amount_total' | 'currency' | 'description' | 'metadata' | 'quantity'
> & { price: FakePrice };

export type FakeCheckoutSession = Pick<
  Stripe.Checkout.Session,
  | 'id'
  | 'object'
  | 'after_expiration'
  | 'allow_promotion_codes'
  | 'amount_subtotal'
  | 'amount_total'
  | 'billing_address_collection'
  | 'cancel_url'
  | 'client_reference_id'
  | 'client_secret'
  | 'consent'
  | 'consent_collection'
  | 'created'
  | 'currency'
  | 'custom_fields'
  | 'customer_creation'
  | 'customer_email'
  | 'expires_at'
  | 'livemode'
  | 'locale'
  | 'metadata'
  | 'mode'
  | 'payment_link'
  | 'payment_method_collection'
  | 'payment_method_types'
  | 'payment_status'
  | 'recovered_from'
  | 'status'
  | 'submit_type'
  | 'success_url'
  | 'ui_mode'
  | 'url'
> & {
  customer: string | null;
  customer_details: { email: string | null; name: string | null; phone: string | null; address: null; tax_exempt: 'none'; tax_ids: [] } | null;
  invoice: string | null;
  payment_intent: string | null;
  setup_intent: string | null;
  subscription: string | null;
  line_items?: ListObject<FakeLineItem>;
};

export interface FakeLastPaymentError {
  type: 'card_error';
  code: string;
  decline_code: string;
  message: string;
  charge: string;
  payment_method: { id: string; object: 'payment_method'; type: 'card' };
}

export type FakePaymentIntent = Pick<
  Stripe.PaymentIntent,
  | 'id'
  | 'object'
  | 'amount'
  | 'amount_capturable'
  | 'amount_received'
  | 'canceled_at'
  | 'cancellation_reason'
  | 'capture_method'
  | 'client_secret'
  | 'confirmation_method'
  | 'created'
  | 'currency'
  | 'description'
  | 'livemode'
  | 'metadata'
  | 'next_action'
  | 'payment_method_types'
  | 'receipt_email'
  | 'setup_future_usage'
  | 'statement_descriptor'
  | 'status'
> & { customer: string | null; last_payment_error: FakeLastPaymentError | null; latest_charge: string | null; payment_method: string | null };

export interface FakeCard {
  brand: string;
  country: string;
  exp_month: number;
  exp_year: number;
  funding: 'credit';
  last4: string;
}

/** A card decline: the API error code, the issuer's decline code and the message shown to the payer. */
export interface Decline {
  code: string;
  declineCode: string;
  message: string;
}

export type FakePaymentMethod = Pick<Stripe.PaymentMethod, 'id' | 'object' | 'created' | 'livemode' | 'type'> & {
  billing_details: { address: null; email: string | null; name: string | null; phone: null };
  card: FakeCard;
  customer: string | null;
  metadata: Metadata;
};

export type FakeCharge = Pick<
  Stripe.Charge,
  | 'id'
  | 'object'
  | 'amount'
  | 'amount_captured'
  | 'amount_refunded'
  | 'balance_transaction'
  | 'captured'
  | 'created'
  | 'currency'
  | 'description'
  | 'disputed'
  | 'failure_code'
  | 'failure_message'
  | 'livemode'
  | 'metadata'
  | 'paid'
  | 'receipt_email'
  | 'receipt_url'
  | 'refunded'
  | 'status'
> & {
  customer: string | null;
  payment_intent: string;
  payment_method: string;
  /** `capture_before` is set on an uncaptured authorisation: the moment the hold lapses. */
  payment_method_details: { type: 'card'; card: FakeCard & { capture_before?: number } };
  outcome: { network_status: string; reason: string | null; seller_message: string; type: 'authorized' | 'issuer_declined' };
};

export type FakeRefund = Pick<
  Stripe.Refund,
  'id' | 'object' | 'amount' | 'balance_transaction' | 'created' | 'currency' | 'metadata' | 'reason' | 'receipt_number' | 'source_transfer_reversal' | 'status' | 'transfer_reversal'
> & { charge: string; payment_intent: string; metadata: Metadata };

export type FakeSubscriptionItem = Pick<
  Stripe.SubscriptionItem,
  'id' | 'object' | 'created' | 'current_period_end' | 'current_period_start' | 'discounts' | 'metadata' | 'subscription' | 'tax_rates'
> & { price: FakePrice; quantity: number };

export type FakeSubscription = Pick<
  Stripe.Subscription,
  | 'id'
  | 'object'
  | 'billing_cycle_anchor'
  | 'cancel_at'
  | 'cancel_at_period_end'
  | 'canceled_at'
  | 'collection_method'
  | 'created'
  | 'currency'
  | 'days_until_due'
  | 'description'
  | 'discounts'
  | 'ended_at'
  | 'livemode'
  | 'metadata'
  | 'pending_update'
  | 'schedule'
  | 'start_date'
  | 'status'
  | 'test_clock'
  | 'trial_end'
  | 'trial_start'
> & {
  cancellation_details: { comment: string | null; feedback: string | null; reason: 'cancellation_requested' | 'payment_failed' | null };
  customer: string;
  default_payment_method: string | null;
  items: ListObject<FakeSubscriptionItem>;
  latest_invoice: string | null;
};

export type FakeInvoiceLine = Pick<
  Stripe.InvoiceLineItem,
  'id' | 'object' | 'amount' | 'currency' | 'description' | 'discountable' | 'discounts' | 'livemode' | 'metadata' | 'period' | 'quantity' | 'subtotal'
> & {
  invoice: string;
  parent: {
    type: 'subscription_item_details' | 'invoice_item_details';
    subscription_item_details: { invoice_item: null; proration: false; proration_details: null; subscription: string; subscription_item: string } | null;
    invoice_item_details: null;
  };
  pricing: { type: 'price_details'; price_details: { price: string; product: string }; unit_amount_decimal: string };
};

export type FakeInvoicePayment = Pick<
  Stripe.InvoicePayment,
  'id' | 'object' | 'amount_paid' | 'amount_requested' | 'created' | 'currency' | 'is_default' | 'livemode' | 'status'
> & {
  invoice: string;
  payment: { type: 'payment_intent'; payment_intent: string };
  status_transitions: { canceled_at: number | null; paid_at: number | null };
};

export type FakeInvoice = Pick<
  Stripe.Invoice,
  | 'id'
  | 'object'
  | 'amount_due'
  | 'amount_overpaid'
  | 'amount_paid'
  | 'amount_remaining'
  | 'amount_shipping'
  | 'attempt_count'
  | 'attempted'
  | 'auto_advance'
  | 'billing_reason'
  | 'collection_method'
  | 'created'
  | 'currency'
  | 'customer_email'
  | 'customer_name'
  | 'description'
  | 'due_date'
  | 'effective_at'
  | 'ending_balance'
  | 'hosted_invoice_url'
  | 'invoice_pdf'
  | 'livemode'
  | 'next_payment_attempt'
  | 'number'
  | 'period_end'
  | 'period_start'
  | 'starting_balance'
  | 'status'
  | 'subtotal'
  | 'total'
  | 'webhooks_delivered_at'
> & {
  customer: string;
  lines: ListObject<FakeInvoiceLine>;
  metadata: Metadata;
  parent: {
    type: 'subscription_details';
    quote_details: null;
    subscription_details: { metadata: Metadata; subscription: string };
  } | null;
  payments: ListObject<FakeInvoicePayment>;
  status_transitions: { finalized_at: number | null; marked_uncollectible_at: number | null; paid_at: number | null; voided_at: number | null };
};

export interface FakeSetupIntent {
  id: string;
  object: 'setup_intent';
  created: number;
  customer: string | null;
  livemode: false;
  metadata: Metadata;
  payment_method: string;
  payment_method_types: ['card'];
  status: 'succeeded';
  usage: 'off_session';
}

export type FakeEventType = Stripe.Event.Type;

export type FakeObject =
  | FakeCustomer
  | FakeProduct
  | FakePrice
  | FakeCheckoutSession
  | FakePaymentIntent
  | FakeCharge
  | FakeRefund
  | FakeSubscription
  | FakeInvoice
  | FakePaymentMethod
  | FakeSetupIntent;

export interface FakeEvent {
  id: string;
  object: 'event';
  api_version: string;
  created: number;
  data: { object: FakeObject; previous_attributes?: Record<string, unknown> };
  livemode: false;
  pending_webhooks: number;
  request: { id: string | null; idempotency_key: string | null };
  type: FakeEventType;
}
