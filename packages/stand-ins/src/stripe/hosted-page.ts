import express, { Router, type Response } from 'express';
import { payCheckoutSession } from './checkout-sessions';
import { formatAmount } from './money';
import type { FakeCheckoutSession } from './objects';
import type { FakeState } from './state';

const PAYING_CARD = '4242 4242 4242 4242';
const DECLINING_CARD = '4000 0000 0000 0002';

function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

function page(title: string, body: string): string {
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<link rel="icon" href="data:,">
<title>${escapeHtml(title)} · local test payment page</title>
<style>
  body { font-family: system-ui, sans-serif; max-width: 34rem; margin: 2rem auto; padding: 0 1rem; color: #1f2933; }
  .notice { border: 2px dashed #b45309; background: #fffbeb; padding: .75rem 1rem; margin-bottom: 1.5rem; }
  table { width: 100%; border-collapse: collapse; margin: 1rem 0; }
  td { padding: .4rem 0; border-bottom: 1px solid #e5e7eb; }
  td.amount { text-align: right; white-space: nowrap; }
  .total td { font-weight: 600; border-bottom: none; }
  label { display: block; margin: 1rem 0 .25rem; }
  input { font: inherit; padding: .5rem; width: 100%; box-sizing: border-box; }
  .actions { display: flex; gap: .75rem; margin-top: 1.25rem; }
  button { font: inherit; padding: .6rem 1.4rem; cursor: pointer; }
  .error { color: #b91c1c; border: 1px solid #fca5a5; background: #fef2f2; padding: .75rem 1rem; }
  .hint { color: #52606d; font-size: .9rem; }
</style>
</head>
<body>
<p class="notice"><strong>Local test payment page.</strong> This is a development stand-in for a hosted payment page. No real card is charged and no money moves.</p>
${body}
</body>
</html>`;
}

function summary(state: FakeState, session: FakeCheckoutSession): string {
  const extras = state.sessionExtras.get(session.id);
  const rows = (extras?.lineItems ?? [])
    .map((line) => {
      const recurring = line.price.recurring ? ` / ${line.price.recurring.interval}` : '';
      return `<tr><td>${escapeHtml(line.description ?? line.price.id)} × ${line.quantity ?? 1}</td><td class="amount">${formatAmount(line.amount_total, line.currency)}${recurring}</td></tr>`;
    })
    .join('\n');
  const trial = extras?.trialPeriodDays ? `<p>Includes a ${extras.trialPeriodDays}-day free trial; the first charge comes when it ends.</p>` : '';
  const hold = extras?.paymentIntentCaptureMethod === 'manual';
  const total =
    session.amount_total !== null && session.currency
      ? `<tr class="total"><td>${hold ? 'Held on your card' : 'Due today'}</td><td class="amount">${formatAmount(session.amount_total, session.currency)}</td></tr>`
      : '';
  const holdNote = hold ? '<p>This amount is held on your card, not charged. The shop takes only what it needs and the rest is released.</p>' : '';
  const who = session.customer_email ?? (session.customer ? state.customers.get(session.customer)?.email : null);
  return `${who ? `<p>Paying as ${escapeHtml(who)}</p>` : ''}<table>${rows}${total}</table>${trial}${holdNote}`;
}

function checkoutForm(state: FakeState, session: FakeCheckoutSession, error?: string, card = PAYING_CARD): string {
  const cancel = session.cancel_url ? `<p><a href="${escapeHtml(session.cancel_url)}">Cancel and go back</a></p>` : '';
  const hold = state.sessionExtras.get(session.id)?.paymentIntentCaptureMethod === 'manual';
  const [heading, button] = session.mode === 'setup' ? ['Save a card', 'Save card'] : hold ? ['Authorise a hold', 'Authorise'] : ['Pay', 'Pay'];
  return page(
    heading,
    `<h1>${heading}</h1>
${summary(state, session)}
${error ? `<p class="error" role="alert">${escapeHtml(error)}</p>` : ''}
<form method="post" action="/checkout/${encodeURIComponent(session.id)}">
  <label for="card">Card number</label>
  <input id="card" name="card" inputmode="numeric" autocomplete="off" value="${escapeHtml(card)}">
  <p class="hint">${PAYING_CARD} pays; ${DECLINING_CARD} is declined. Any expiry date and CVC.</p>
  <div class="actions">
    <button type="submit" name="action" value="pay">${button}</button>
    <button type="submit" name="action" value="decline">Decline</button>
  </div>
</form>
${cancel}`,
  );
}

function notice(res: Response, status: number, title: string, text: string, link?: string | null): void {
  const back = link ? `<p><a href="${escapeHtml(link)}">Return to the shop</a></p>` : '';
  res.status(status).type('html').send(page(title, `<h1>${escapeHtml(title)}</h1><p>${escapeHtml(text)}</p>${back}`));
}

/** Browser-facing stand-in for Stripe's hosted Checkout at `/checkout/:sessionId`. */
export function hostedPageRouter(state: FakeState): Router {
  const router = Router();
  router.use(express.urlencoded({ extended: false }));

  router.get('/:sessionId', (req, res) => {
    const session = state.sessions.get(req.params.sessionId);
    if (!session) {
      notice(res, 404, 'Checkout session not found', 'This payment link is unknown or was reset.');
      return;
    }
    if (session.status === 'complete') {
      notice(res, 200, 'Already paid', 'This checkout session is complete.', session.success_url?.replaceAll('{CHECKOUT_SESSION_ID}', session.id));
      return;
    }
    if (session.status === 'expired' || session.expires_at <= state.now()) {
      notice(res, 410, 'Checkout session expired', 'Start again from the shop.', session.cancel_url);
      return;
    }
    res.type('html').send(checkoutForm(state, session));
  });

  router.post('/:sessionId', (req, res) => {
    const body = req.body as Record<string, unknown>;
    const entered = typeof body.card === 'string' ? body.card : PAYING_CARD;
    const card = body.action === 'decline' ? DECLINING_CARD : entered;
    if (!state.sessions.has(req.params.sessionId)) {
      notice(res, 404, 'Checkout session not found', 'This payment link is unknown or was reset.');
      return;
    }
    const outcome = payCheckoutSession(state, req.params.sessionId, card);
    const { session } = outcome;
    if (!outcome.ok) {
      if (session.status === 'expired') notice(res, 410, 'Checkout session expired', outcome.message, session.cancel_url);
      else res.status(402).type('html').send(checkoutForm(state, session, outcome.message, entered));
      return;
    }
    if (session.success_url) {
      res.redirect(303, session.success_url.replaceAll('{CHECKOUT_SESSION_ID}', session.id));
      return;
    }
    notice(res, 200, 'Payment complete', 'You can close this page.');
  });
  return router;
}
