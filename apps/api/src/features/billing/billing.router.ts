import { Router } from 'express';
import { checkoutInputSchema, planChangeSchema, refundInputSchema } from '@revloop/domain/billing';
import type { AppDeps } from '../../context';
import { authorize, requireShop } from '../../http/auth-context';
import { parseInput } from '../../http/validate';
import { waivePaymentLock } from './download-lock.service';
import { dealerBalances } from './ledger.service';
import { jobPaymentsView, refundPayment, startJobCheckout, startTopUpCheckout } from './payment.service';
import { changePlan, startSubscriptionCheckout, subscriptionView } from './subscription.service';

/**
 * Billing routes, mounted at /billing. A dealer's statement is served by the dealers router and the platform's
 * revenue by the admin router, both through this feature's services.
 */
export function createBillingRouter(deps: AppDeps): Router {
  const router = Router();

  router.get('/subscription', async (req, res) => {
    const auth = requireShop(req);
    authorize(auth, 'read', 'Subscription');
    res.json({ data: await subscriptionView(deps, auth.shop.id) });
  });

  router.post('/subscription/plan', async (req, res) => {
    const auth = requireShop(req);
    authorize(auth, 'update', 'Subscription');
    const input = parseInput(planChangeSchema, req.body);
    await changePlan(deps, auth.shop.id, input.planId, input.seats);
    res.json({ data: await subscriptionView(deps, auth.shop.id) });
  });

  router.post('/checkout', async (req, res) => {
    const auth = requireShop(req);
    const input = parseInput(checkoutInputSchema, req.body);
    // Job and top-up checkouts check the payer against the job or the dealer's ledger in their services.
    if (input.purpose === 'job') {
      res.json({ url: await startJobCheckout(deps, auth, input.jobId) });
      return;
    }
    if (input.purpose === 'topup') {
      res.json({ url: await startTopUpCheckout(deps, auth, input.dealerId, input.amountMinor) });
      return;
    }
    authorize(auth, 'update', 'Subscription');
    res.json({ url: await startSubscriptionCheckout(deps, auth.shop.id, auth.user.email, input) });
  });

  router.get('/jobs/:jobId/payments', async (req, res) => {
    const auth = requireShop(req);
    res.json({ data: await jobPaymentsView(deps, auth, req.params.jobId) });
  });

  // Paid before download: the owner lets this job's customer download before paying (audited on the job's timeline).
  router.post('/jobs/:jobId/payment-lock/waive', async (req, res) => {
    const auth = requireShop(req);
    await waivePaymentLock(deps, auth, req.params.jobId);
    res.json({ data: await jobPaymentsView(deps, auth, req.params.jobId) });
  });

  router.post('/payments/:paymentId/refunds', async (req, res) => {
    const auth = requireShop(req);
    authorize(auth, 'refund', 'Payment');
    const input = parseInput(refundInputSchema, req.body);
    res.json({ data: await refundPayment(deps, auth, req.params.paymentId, input) });
  });

  router.get('/dealer-balances', async (req, res) => {
    const auth = requireShop(req);
    authorize(auth, 'read', 'Dealer');
    authorize(auth, 'update', 'Ledger');
    res.json({ data: await dealerBalances(deps, auth.shop) });
  });

  return router;
}
