import express, { Router } from 'express';
import type Stripe from 'stripe';
import { claimStripeEvent, findShopSubscriptionByProvider, type Db } from '@revloop/db';
import { DomainError } from '@revloop/domain';
import type { AppDeps } from '../../context';
import { handleRentalStripeEvent } from '../rentals/rental-money';
import { applyCheckoutExpired, applyCheckoutPaid } from './payment.service';
import { idOf, stripeFor } from './stripe-client';
import { retryOpenInvoices, syncSubscription } from './subscription.service';

/** Stripe's own default: a signature older than five minutes is refused, so a captured request cannot be replayed later. */
const SIGNATURE_TOLERANCE_S = 300;

const customerOf = (object: unknown): string | null => {
  const customer = (object as { customer?: string | { id: string } | null }).customer;
  return idOf(customer ?? null);
};

/** Applies one verified event. Every branch claims the event id in the transaction that applies its effect. */
export async function handleStripeEvent(deps: AppDeps, event: Stripe.Event): Promise<void> {
  const claimFor = (shopId: string | null) => (db: Db) => claimStripeEvent(db, { id: event.id, type: event.type, shopId, at: deps.clock.now().toISOString() });
  if (await handleRentalStripeEvent(deps, event, claimFor)) return;

  if (event.type === 'checkout.session.completed' && event.data.object.mode === 'payment') {
    await applyCheckoutPaid(deps, event.data.object, claimFor(event.data.object.metadata?.shopId ?? null));
    return;
  }
  if (event.type === 'checkout.session.expired') {
    await applyCheckoutExpired(deps, event.data.object, claimFor(event.data.object.metadata?.shopId ?? null));
    return;
  }
  const customerId = customerOf(event.data.object);
  const shop = customerId ? await findShopSubscriptionByProvider(deps.db, { customerId }) : undefined;
  if (!shop) {
    // Events about objects Revloop did not create (or other accounts' tests) are recorded and otherwise ignored.
    await claimFor(null)(deps.db);
    return;
  }
  if (event.type === 'checkout.session.completed' && event.data.object.mode === 'setup') {
    const claimed = await deps.db.transaction().execute((trx) => claimFor(shop.shop_id)(trx));
    if (claimed && customerId) await retryOpenInvoices(deps, customerId);
    return;
  }
  if (event.type.startsWith('customer.subscription.') || event.type.startsWith('invoice.') || event.type === 'checkout.session.completed') {
    await syncSubscription(deps, shop, event, claimFor(shop.shop_id));
    return;
  }
  await claimFor(shop.shop_id)(deps.db);
}

/** `POST /api/stripe/webhook`: mounted before the JSON parser, because the signature covers the raw bytes. */
export function createStripeWebhookRouter(deps: AppDeps): Router {
  const router = Router();
  router.post('/webhook', express.raw({ type: 'application/json', limit: '1mb' }), async (req, res) => {
    const signature = req.get('stripe-signature');
    if (!signature || !Buffer.isBuffer(req.body)) throw new DomainError('validation', 'A signed JSON body is required.');
    let event: Stripe.Event;
    try {
      event = stripeFor(deps.env).webhooks.constructEvent(req.body, signature, deps.env.STRIPE_WEBHOOK_SECRET, SIGNATURE_TOLERANCE_S, undefined, deps.clock.now().getTime());
    } catch {
      throw new DomainError('validation', 'The webhook signature does not match this body, or it is more than five minutes old.');
    }
    await handleStripeEvent(deps, event);
    res.json({ received: true });
  });
  return router;
}
