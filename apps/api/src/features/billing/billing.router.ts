import { Router } from 'express';
import { countSeatsInUse, dealerBalance, listDealers, listSubscriptionChanges, listSubscriptionsForPlatform } from '@revloop/db';
import { DomainError } from '@revloop/domain';
import {
  PLATFORM_CURRENCY,
  READ_ONLY_REASON_TEXT,
  SUBSCRIPTION_STATUS_LABELS,
  assertPlanChoice,
  checkoutInputSchema,
  mrrMinorOf,
  mrrSeries,
  planById,
  planChangeSchema,
  refundInputSchema,
} from '@revloop/domain/billing';
import type { AppDeps } from '../../context';
import { authorize, requireAuth, requireShop } from '../../http/auth-context';
import { parseInput } from '../../http/validate';
import { dealerLedger, ledgerCsv } from './ledger.service';
import { jobPaymentsView, refundPayment, startJobCheckout, startTopUpCheckout } from './payment.service';
import { stripeFor } from './stripe-client';
import { applyBillingDeadlines, changePlan, ensureSubscription, planPriceId, providerCustomerId, subscriptionView } from './subscription.service';

const DAY_MS = 86_400_000;

/** Billing routes, mounted at the API root because they sit under several resources (billing, dealers, admin). */
export function createBillingRouter(deps: AppDeps): Router {
  const router = Router();
  const billingUrl = `${deps.env.APP_ORIGIN}/billing`;

  router.get('/billing/subscription', async (req, res) => {
    const auth = requireShop(req);
    authorize(auth, 'read', 'Subscription');
    res.json({ data: await subscriptionView(deps, auth.shop.id) });
  });

  router.post('/billing/subscription/plan', async (req, res) => {
    const auth = requireShop(req);
    authorize(auth, 'update', 'Subscription');
    const input = parseInput(planChangeSchema, req.body);
    await changePlan(deps, auth.shop.id, input.planId, input.seats);
    res.json({ data: await subscriptionView(deps, auth.shop.id) });
  });

  router.post('/billing/checkout', async (req, res) => {
    const auth = requireShop(req);
    const input = parseInput(checkoutInputSchema, req.body);
    if (input.purpose === 'job') {
      res.json({ url: await startJobCheckout(deps, auth, input.jobId) });
      return;
    }
    if (input.purpose === 'topup') {
      res.json({ url: await startTopUpCheckout(deps, auth, input.dealerId, input.amountMinor) });
      return;
    }
    authorize(auth, 'update', 'Subscription');
    const stripe = stripeFor(deps.env);
    const customer = await providerCustomerId(deps, auth.shop.id, auth.user.email);
    if (input.purpose === 'payment_method') {
      const session = await stripe.checkout.sessions.create({ mode: 'setup', customer, currency: PLATFORM_CURRENCY.toLowerCase(), success_url: `${billingUrl}?card=saved`, cancel_url: billingUrl, metadata: { shopId: auth.shop.id } });
      res.json({ url: session.url });
      return;
    }
    const row = await ensureSubscription(deps.db, auth.shop.id, deps.clock.now());
    if (row.stripe_subscription_id && ['trialing', 'active', 'past_due', 'unpaid'].includes(row.status)) {
      throw new DomainError('conflict', 'The shop already has a running subscription: change its plan instead.');
    }
    const plan = planById(input.planId);
    assertPlanChoice(plan, input.seats, await countSeatsInUse(deps.db, auth.shop.id));
    // A shop still in its trial keeps the days it has left; the first charge comes when they run out.
    const trialDaysLeft = row.status === 'trialing' && row.trial_ends_at ? Math.floor((Date.parse(row.trial_ends_at) - deps.clock.now().getTime()) / DAY_MS) : 0;
    const session = await stripe.checkout.sessions.create({
      mode: 'subscription',
      customer,
      line_items: [{ price: await planPriceId(stripe, plan.id), quantity: input.seats }],
      subscription_data: { metadata: { shopId: auth.shop.id, planId: plan.id }, ...(trialDaysLeft >= 1 && { trial_period_days: trialDaysLeft }) },
      metadata: { shopId: auth.shop.id },
      success_url: `${billingUrl}?checkout=done`,
      cancel_url: billingUrl,
    });
    res.json({ url: session.url });
  });

  router.get('/billing/jobs/:jobId/payments', async (req, res) => {
    const auth = requireShop(req);
    res.json({ data: await jobPaymentsView(deps, auth, req.params.jobId) });
  });

  router.post('/billing/payments/:paymentId/refunds', async (req, res) => {
    const auth = requireShop(req);
    authorize(auth, 'refund', 'Payment');
    const input = parseInput(refundInputSchema, req.body);
    res.json({ data: await refundPayment(deps, auth, req.params.paymentId, input) });
  });

  router.get('/billing/dealer-balances', async (req, res) => {
    const auth = requireShop(req);
    authorize(auth, 'read', 'Dealer');
    authorize(auth, 'update', 'Ledger');
    const dealers = await listDealers(deps.db, auth.shop.id);
    const data = [];
    for (const d of dealers) data.push({ id: d.id, name: d.name, balanceMinor: await dealerBalance(deps.db, auth.shop.id, d.id), currency: auth.shop.currency });
    res.json({ data });
  });

  router.get('/dealers/:dealerId/ledger', async (req, res) => {
    const auth = requireShop(req);
    const ledger = await dealerLedger(deps, auth, req.params.dealerId);
    if (req.query.format === 'csv') {
      const name = `statement-${ledger.dealer.name.toLowerCase().replace(/[^a-z0-9]+/g, '-')}.csv`;
      res.type('text/csv; charset=utf-8').attachment(name).send(ledgerCsv(ledger));
      return;
    }
    res.json({ data: ledger });
  });

  router.get('/admin/revenue', async (req, res) => {
    const auth = requireAuth(req);
    authorize(auth, 'manage', 'Platform');
    await applyBillingDeadlines(deps);
    const rows = await listSubscriptionsForPlatform(deps.db);
    const shops = rows.map((r) => ({
      shopId: r.shop_id,
      shopName: r.shop_name,
      shopStatus: r.shop_status,
      planId: r.plan_id,
      planName: planById(r.plan_id).name,
      seats: r.seats,
      status: r.status,
      statusLabel: SUBSCRIPTION_STATUS_LABELS[r.status],
      mrrMinor: mrrMinorOf({ status: r.status, planId: r.plan_id, seats: r.seats }),
      trialEndsAt: r.status === 'trialing' ? r.trial_ends_at : null,
      currentPeriodEnd: r.current_period_end,
      readOnlyReason: r.read_only_reason,
      readOnlyText: r.read_only_reason ? READ_ONLY_REASON_TEXT[r.read_only_reason] : null,
    }));
    const changes = await listSubscriptionChanges(deps.db);
    res.json({
      data: {
        currency: PLATFORM_CURRENCY,
        mrrMinor: shops.reduce((sum, s) => sum + s.mrrMinor, 0),
        shops,
        series: mrrSeries(changes.map((c) => ({ shopId: c.shop_id, at: c.at, mrrMinor: c.mrr_minor })), deps.clock.now(), 12),
      },
    });
  });

  return router;
}
