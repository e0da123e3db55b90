import { Router } from 'express';
import { readTestCard, consumeFailure } from './cards';
import { createCustomer } from './customers';
import { invalidRequest, missingParam } from './errors';
import { filtered, id, lineItemsOf, matches, params, type ApiContext } from './http';
import { attemptInvoicePayment, createSubscriptionInvoice } from './invoices';
import type { FakeCheckoutSession, FakeLineItem, FakePrice } from './objects';
import { allowOnly, applyMetadata, asParams, optArray, optEnum, optInt, optString } from './params';
import { attemptPayment } from './payment-intents';
import { createPaymentMethod, saveCardOnFile } from './payment-methods';
import { createPrice } from './prices';
import { createSucceededSetupIntent } from './setup-intents';
import { newId, paginate, type FakeState } from './state';
import { createSubscription } from './subscriptions';

export function checkoutSessionsRouter({ state, send, publicUrl }: ApiContext): Router {
  const router = Router();
  router.post('/checkout/sessions', (req, res) => {
    const body = params(req);
    allowOnly(body, [
      'mode',
      'line_items',
      'customer',
      'customer_email',
      'customer_creation',
      'client_reference_id',
      'metadata',
      'success_url',
      'cancel_url',
      'subscription_data',
      'payment_intent_data',
      'setup_intent_data',
      'expires_at',
      'payment_method_types',
      'currency',
      'locale',
      'ui_mode',
    ]);
    const mode = optEnum(body, 'mode', ['payment', 'subscription', 'setup'] as const);
    if (!mode) throw missingParam('mode');
    optEnum(body, 'ui_mode', ['hosted'] as const);
    const customerId = optString(body, 'customer');
    const customerEmail = optString(body, 'customer_email');
    if (customerId && customerEmail) throw invalidRequest('You may only specify one of these parameters: customer, customer_email.', 'customer_email');
    if (customerId) state.get(state.customers, 'customer', customerId, 'customer');

    const lineItems: FakeLineItem[] = (optArray(body, 'line_items') ?? []).map((line, i) => {
      const param = `line_items[${i}]`;
      const priceId = optString(line, 'price');
      const priceData = line.price_data === undefined ? undefined : asParams(line.price_data, `${param}[price_data]`);
      if (priceId && priceData) throw invalidRequest('You may only specify one of these parameters: price, price_data.', `${param}[price]`);
      let price: FakePrice;
      if (priceId) {
        price = state.get(state.prices, 'price', priceId, `${param}[price]`);
        if (!price.active) throw invalidRequest('The price specified is inactive. This field only accepts active prices.', `${param}[price]`);
      } else if (priceData) price = createPrice(state, priceData, `${param}[price_data]`, false);
      else throw missingParam(`${param}[price]`);
      const quantity = optInt(line, 'quantity', 1);
      if (quantity === undefined) throw missingParam(`${param}[quantity]`);
      if (mode === 'payment' && price.recurring) {
        throw invalidRequest(
          'You specified `payment` mode but passed a recurring price. Either switch to `subscription` mode or use only one-time prices.',
          `${param}[price]`,
        );
      }
      const amount = (price.unit_amount ?? 0) * quantity;
      return {
        id: newId('li_'),
        object: 'item',
        amount_discount: 0,
        amount_subtotal: amount,
        amount_tax: 0,
        amount_total: amount,
        currency: price.currency,
        description: state.products.get(price.product)?.name ?? null,
        metadata: {},
        price: structuredClone(price),
        quantity,
      };
    });
    if (mode !== 'setup' && lineItems.length === 0) throw missingParam('line_items');
    if (mode === 'setup' && lineItems.length > 0) throw invalidRequest('`line_items` cannot be used in `setup` mode.', 'line_items');
    if (mode === 'subscription' && !lineItems.some((line) => line.price.recurring)) {
      throw invalidRequest('You must provide at least one recurring price in `subscription` mode when using prices.', 'line_items');
    }
    const currency = lineItems[0]?.currency ?? optString(body, 'currency')?.toLowerCase() ?? null;
    if (lineItems.some((line) => line.currency !== currency)) throw invalidRequest('All prices must use the same currency.', 'line_items');
    const intervals = new Set(lineItems.flatMap((line) => (line.price.recurring ? [`${line.price.recurring.interval}/${line.price.recurring.interval_count}`] : [])));
    if (intervals.size > 1) throw invalidRequest('All recurring prices must have the same billing interval.', 'line_items');

    const subscriptionData = body.subscription_data === undefined ? {} : asParams(body.subscription_data, 'subscription_data');
    const intentData = body.payment_intent_data === undefined ? {} : asParams(body.payment_intent_data, 'payment_intent_data');
    if (mode !== 'subscription' && body.subscription_data !== undefined) {
      throw invalidRequest('You can only specify `subscription_data` in `subscription` mode.', 'subscription_data');
    }
    if (mode !== 'payment' && body.payment_intent_data !== undefined) {
      throw invalidRequest('You can only specify `payment_intent_data` in `payment` mode.', 'payment_intent_data');
    }
    allowOnly(subscriptionData, ['trial_period_days', 'metadata', 'description']);
    const setupData = body.setup_intent_data === undefined ? {} : asParams(body.setup_intent_data, 'setup_intent_data');
    if (mode !== 'setup' && body.setup_intent_data !== undefined) {
      throw invalidRequest('You can only specify `setup_intent_data` in `setup` mode.', 'setup_intent_data');
    }
    allowOnly(intentData, ['metadata', 'description', 'capture_method']);
    allowOnly(setupData, ['metadata', 'description']);
    const trialDays = optInt(subscriptionData, 'trial_period_days', 1) ?? null;

    const now = state.now();
    const expiresAt = optInt(body, 'expires_at') ?? now + 24 * 3600;
    if (expiresAt < now + 30 * 60 || expiresAt > now + 24 * 3600) {
      throw invalidRequest('The `expires_at` timestamp must be between 30 minutes and 24 hours from Checkout Session creation.', 'expires_at');
    }
    const subtotal = lineItems.reduce((sum, line) => sum + line.amount_subtotal, 0);
    const dueNow = lineItems.reduce((sum, line) => sum + (trialDays && line.price.recurring ? 0 : line.amount_total), 0);
    const sessionId = newId('cs_test_', 58);
    const session: FakeCheckoutSession = {
      id: sessionId,
      object: 'checkout.session',
      after_expiration: null,
      allow_promotion_codes: null,
      amount_subtotal: mode === 'setup' ? null : subtotal,
      amount_total: mode === 'setup' ? null : dueNow,
      billing_address_collection: null,
      cancel_url: optString(body, 'cancel_url') ?? null,
      client_reference_id: optString(body, 'client_reference_id') ?? null,
      client_secret: null,
      consent: null,
      consent_collection: null,
      created: now,
      currency,
      custom_fields: [],
      customer: customerId ?? null,
      customer_creation: mode === 'payment' && !customerId ? (optEnum(body, 'customer_creation', ['always', 'if_required'] as const) ?? 'if_required') : null,
      customer_details: null,
      customer_email: customerEmail ?? null,
      expires_at: expiresAt,
      invoice: null,
      livemode: false,
      locale: null,
      metadata: applyMetadata({}, body),
      mode,
      payment_intent: null,
      payment_link: null,
      payment_method_collection: 'always',
      payment_method_types: ['card'],
      payment_status: mode === 'setup' ? 'no_payment_required' : 'unpaid',
      recovered_from: null,
      setup_intent: null,
      status: 'open',
      submit_type: null,
      subscription: null,
      success_url: optString(body, 'success_url') ?? null,
      ui_mode: 'hosted',
      url: `${publicUrl(req)}/checkout/${sessionId}`,
    };
    state.sessions.set(session.id, session);
    state.sessionExtras.set(session.id, {
      lineItems,
      trialPeriodDays: trialDays,
      subscriptionMetadata: applyMetadata({}, subscriptionData),
      paymentIntentMetadata: applyMetadata({}, intentData),
      paymentIntentDescription: optString(intentData, 'description') ?? null,
      // `automatic` and `automatic_async` both capture at once; the stand-in records the newer default.
      paymentIntentCaptureMethod: optEnum(intentData, 'capture_method', ['automatic', 'automatic_async', 'manual'] as const) === 'manual' ? 'manual' : 'automatic_async',
      setupIntentMetadata: applyMetadata({}, setupData),
    });
    res.json(send(req, session));
  });
  router.get('/checkout/sessions/:id', (req, res) => {
    res.json(send(req, state.get(state.sessions, 'checkout.session', id(req))));
  });
  router.get('/checkout/sessions/:id/line_items', (req, res) => {
    const session = state.get(state.sessions, 'checkout.session', id(req));
    const list = lineItemsOf(state, session);
    res.json(send(req, paginate([...list.data].reverse(), params(req), list.url)));
  });
  router.post('/checkout/sessions/:id/expire', (req, res) => {
    const session = state.get(state.sessions, 'checkout.session', id(req));
    if (session.status !== 'open') throw invalidRequest(`Only Checkout Sessions with a status of \`open\` can be expired.`);
    session.status = 'expired';
    state.emit('checkout.session.expired', session);
    res.json(send(req, session));
  });
  router.get('/checkout/sessions', (req, res) => {
    const query = params(req);
    const list = filtered(
      state.sessions.values(),
      (s) =>
        matches(query, 'customer', s.customer) &&
        matches(query, 'payment_intent', s.payment_intent) &&
        matches(query, 'subscription', s.subscription) &&
        matches(query, 'status', s.status),
    );
    res.json(send(req, paginate(list, query, '/v1/checkout/sessions')));
  });
  return router;
}

export type CheckoutOutcome = { ok: true; session: FakeCheckoutSession } | { ok: false; session: FakeCheckoutSession; message: string };

/** What the hosted page does when the buyer submits a card. */
export function payCheckoutSession(state: FakeState, sessionId: string, cardNumber: string): CheckoutOutcome {
  const session = state.get(state.sessions, 'checkout.session', sessionId);
  if (session.status === 'complete') return { ok: true, session };
  if (session.status === 'expired' || session.expires_at <= state.now()) {
    session.status = 'expired';
    return { ok: false, session, message: 'This checkout session has expired.' };
  }
  const extras = state.sessionExtras.get(session.id);
  const test = readTestCard(cardNumber);
  if (!extras) throw new Error(`checkout session ${session.id} lost its line items`);
  if (!test) return { ok: false, session, message: 'Your card number is incorrect. Use a test card such as 4242 4242 4242 4242.' };
  const email = session.customer ? (state.customers.get(session.customer)?.email ?? null) : session.customer_email;
  const complete = (paymentStatus: FakeCheckoutSession['payment_status']): CheckoutOutcome => {
    session.status = 'complete';
    session.payment_status = paymentStatus;
    session.customer_details = { email, name: null, phone: null, address: null, tax_exempt: 'none', tax_ids: [] };
    state.emit('checkout.session.completed', session);
    return { ok: true, session };
  };

  if (session.mode === 'payment') {
    if (!session.customer && session.customer_creation === 'always') session.customer = createCustomer(state, { email }).id;
    const existing = session.payment_intent ? state.paymentIntents.get(session.payment_intent) : undefined;
    const paymentMethod = createPaymentMethod(state, test, email);
    const result = attemptPayment(state, {
      amount: session.amount_total ?? 0,
      currency: session.currency ?? 'usd',
      customer: session.customer,
      card: test.card,
      cardDecline: test.decline,
      paymentMethod: paymentMethod.id,
      description: extras.paymentIntentDescription,
      metadata: extras.paymentIntentMetadata,
      captureMethod: extras.paymentIntentCaptureMethod,
      ...(existing ? { intent: existing } : {}),
    });
    session.payment_intent = result.intent.id;
    if (result.decline) return { ok: false, session, message: result.decline.message };
    if (session.customer) saveCardOnFile(state, session.customer, paymentMethod);
    // An authorisation held for manual capture has not been paid yet, so the session stays `unpaid`.
    return complete(result.intent.status === 'requires_capture' ? 'unpaid' : 'paid');
  }

  // Subscription and setup modes check the card before creating anything, as Checkout does.
  const decline = test.decline ?? consumeFailure(state, [session.customer]);
  if (decline) return { ok: false, session, message: decline.message };

  if (session.mode === 'setup') {
    const paymentMethod = createPaymentMethod(state, test, email);
    if (session.customer) saveCardOnFile(state, session.customer, paymentMethod);
    session.setup_intent = createSucceededSetupIntent(state, session.customer, paymentMethod.id, extras.setupIntentMetadata).id;
    return complete('no_payment_required');
  }

  const customer = session.customer ? state.get(state.customers, 'customer', session.customer) : createCustomer(state, { email: session.customer_email });
  session.customer = customer.id;
  const paymentMethod = saveCardOnFile(state, customer.id, createPaymentMethod(state, test, customer.email));
  const recurring = extras.lineItems.filter((line) => line.price.recurring);
  const oneTime = extras.lineItems.filter((line) => !line.price.recurring);
  const subscription = createSubscription(state, {
    customer: customer.id,
    items: recurring.map((line) => ({ price: line.price, quantity: line.quantity ?? 1 })),
    trialDays: extras.trialPeriodDays,
    metadata: extras.subscriptionMetadata,
    paymentMethod,
    currency: session.currency ?? 'usd',
  });
  session.subscription = subscription.id;
  state.emit('customer.subscription.created', subscription);
  const invoice = createSubscriptionInvoice(state, subscription, 'subscription_create', oneTime);
  session.invoice = invoice.id;
  attemptInvoicePayment(state, invoice);
  return complete(invoice.amount_due === 0 ? 'no_payment_required' : 'paid');
}

