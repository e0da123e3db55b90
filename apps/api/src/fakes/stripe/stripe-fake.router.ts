import express, { Router, type Request, type RequestHandler } from 'express';
import {
  attemptInvoicePayment,
  cancelSubscription,
  cardError,
  changedFields,
  createCustomer,
  createRefund,
  newSubscriptionItem,
} from './stripe-fake.billing';
import { invalidRequest, missingParam, noSuch, StripeFakeError } from './stripe-fake.errors';
import { idempotency } from './stripe-fake.idempotency';
import type { FakeCheckoutSession, FakeLineItem, FakePrice, FakeProduct, FakeRefund, FakeSubscription, ListObject } from './stripe-fake.objects';
import {
  allowOnly,
  applyMetadata,
  asParams,
  optArray,
  optBool,
  optEnum,
  optInt,
  optNullableString,
  optString,
  reqString,
  stringList,
  type Params,
} from './stripe-fake.params';
import { expand, newId, paginate, requestContext, type FakeState } from './stripe-fake.state';

const NO_KEY_MESSAGE =
  "You did not provide an API key. You need to provide your API key in the Authorization header, using Bearer auth (e.g. 'Authorization: Bearer YOUR_SECRET_KEY').";

const authenticate: RequestHandler = (req, _res, next) => {
  const header = req.get('authorization');
  if (!header) throw new StripeFakeError(401, { type: 'invalid_request_error', message: NO_KEY_MESSAGE });
  const key = /^Bearer (.+)$/.exec(header)?.[1] ?? '';
  if (!/^(sk|rk)_test_\w+$/.test(key)) {
    throw new StripeFakeError(401, { type: 'invalid_request_error', message: `Invalid API Key provided: ${key.slice(0, 8)}****${key.slice(-4)}` });
  }
  next();
};

/** Runs the rest of the request inside a context so events can name the request that caused them. */
const withRequestContext: RequestHandler = (req, res, next) => {
  const id = newId('req_', 14);
  res.set('Request-Id', id);
  requestContext.run({ id, idempotencyKey: req.get('idempotency-key') ?? null }, next);
};

function params(req: Request): Params {
  return req.method === 'GET' || req.method === 'DELETE' ? (req.query as Params) : asParams(req.body, 'body');
}

function id(req: Request): string {
  const value = req.params.id;
  if (typeof value !== 'string') throw missingParam('id');
  return value;
}

function filtered<T extends { id: string }>(items: Iterable<T>, keep: (item: T) => boolean): T[] {
  return [...items].filter(keep);
}

function matches(query: Params, name: string, value: unknown): boolean {
  const wanted = query[name];
  return wanted === undefined || wanted === value;
}

export function apiRouter(state: FakeState, publicUrl: (req: Request) => string): Router {
  const router = Router();
  // The context starts after body parsing: parser callbacks would otherwise run outside it.
  router.use(authenticate, express.urlencoded({ extended: true, limit: '1mb' }), withRequestContext, idempotency(state));

  const lineItemsOf = (session: FakeCheckoutSession): ListObject<FakeLineItem> => ({
    object: 'list',
    data: state.sessionExtras.get(session.id)?.lineItems ?? [],
    has_more: false,
    url: `/v1/checkout/sessions/${session.id}/line_items`,
  });
  const send = (req: Request, value: object) =>
    expand(state, value, params(req), (field, obj) =>
      field === 'line_items' && 'object' in obj && obj.object === 'checkout.session' ? lineItemsOf(obj as FakeCheckoutSession) : undefined,
    );

  // ---- Customers
  const customerFields = ['email', 'name', 'phone', 'description', 'metadata'];
  router.post('/customers', (req, res) => {
    const body = params(req);
    allowOnly(body, customerFields);
    const customer = createCustomer(state, {
      email: optNullableString(body, 'email'),
      name: optNullableString(body, 'name'),
      phone: optNullableString(body, 'phone'),
      description: optNullableString(body, 'description'),
      metadata: applyMetadata({}, body),
    });
    res.json(send(req, customer));
  });
  router.get('/customers/:id', (req, res) => {
    res.json(send(req, state.get(state.customers, 'customer', id(req))));
  });
  router.post('/customers/:id', (req, res) => {
    const customer = state.get(state.customers, 'customer', id(req));
    const body = params(req);
    allowOnly(body, customerFields);
    for (const field of ['email', 'name', 'phone', 'description'] as const) {
      const value = optNullableString(body, field);
      if (value !== undefined) customer[field] = value;
    }
    customer.metadata = applyMetadata(customer.metadata, body);
    res.json(send(req, customer));
  });
  router.delete('/customers/:id', (req, res) => {
    const customer = state.get(state.customers, 'customer', id(req));
    state.customers.delete(customer.id);
    res.json({ id: customer.id, object: 'customer', deleted: true });
  });
  router.get('/customers', (req, res) => {
    const query = params(req);
    res.json(send(req, paginate(filtered(state.customers.values(), (c) => matches(query, 'email', c.email)), query, '/v1/customers')));
  });

  // ---- Products
  const productFields = ['name', 'description', 'active', 'metadata', 'images', 'url', 'unit_label', 'statement_descriptor'];
  const createProduct = (body: Params): FakeProduct => {
    const now = state.now();
    const productId = optString(body, 'id') ?? newId('prod_', 14);
    if (state.products.has(productId)) throw invalidRequest(`Product already exists.`, 'id', 'resource_already_exists');
    const product: FakeProduct = {
      id: productId,
      object: 'product',
      active: optBool(body, 'active') ?? true,
      created: now,
      default_price: null,
      description: optNullableString(body, 'description') ?? null,
      images: stringList(body.images),
      livemode: false,
      marketing_features: [],
      metadata: applyMetadata({}, body),
      name: reqString(body, 'name'),
      package_dimensions: null,
      shippable: null,
      statement_descriptor: optNullableString(body, 'statement_descriptor') ?? null,
      tax_code: null,
      tax_details: null,
      type: 'service',
      unit_label: optNullableString(body, 'unit_label') ?? null,
      updated: now,
      url: optNullableString(body, 'url') ?? null,
    };
    state.products.set(product.id, product);
    return product;
  };
  router.post('/products', (req, res) => {
    const body = params(req);
    allowOnly(body, [...productFields, 'id']);
    res.json(send(req, createProduct(body)));
  });
  router.get('/products/:id', (req, res) => {
    res.json(send(req, state.get(state.products, 'product', id(req))));
  });
  router.post('/products/:id', (req, res) => {
    const product = state.get(state.products, 'product', id(req));
    const body = params(req);
    allowOnly(body, [...productFields, 'default_price']);
    const name = optString(body, 'name');
    if (name !== undefined) product.name = name;
    product.active = optBool(body, 'active') ?? product.active;
    for (const field of ['description', 'url', 'unit_label', 'statement_descriptor'] as const) {
      const value = optNullableString(body, field);
      if (value !== undefined) product[field] = value;
    }
    const defaultPrice = optNullableString(body, 'default_price');
    if (defaultPrice) state.get(state.prices, 'price', defaultPrice, 'default_price');
    if (defaultPrice !== undefined) product.default_price = defaultPrice;
    product.metadata = applyMetadata(product.metadata, body);
    product.updated = state.now();
    res.json(send(req, product));
  });
  router.get('/products', (req, res) => {
    const query = params(req);
    const active = optBool(query, 'active');
    res.json(send(req, paginate(filtered(state.products.values(), (p) => active === undefined || p.active === active), query, '/v1/products')));
  });

  // ---- Prices
  const createPrice = (body: Params, param: string, active: boolean): FakePrice => {
    const productId = optString(body, 'product');
    const productData = body.product_data === undefined ? undefined : asParams(body.product_data, `${param}product_data`);
    if (productId && productData) throw invalidRequest('You may only specify one of these parameters: product, product_data.', `${param}product`);
    const product = productId
      ? state.get(state.products, 'product', productId, `${param}product`)
      : productData
        ? createProduct(productData)
        : undefined;
    if (!product) throw missingParam(`${param}product`);
    const unitAmount = optInt(body, 'unit_amount');
    if (unitAmount === undefined) throw missingParam(`${param}unit_amount`);
    const recurringParams = body.recurring === undefined ? undefined : asParams(body.recurring, `${param}recurring`);
    const interval = recurringParams ? optEnum(recurringParams, 'interval', ['day', 'week', 'month', 'year'] as const) : undefined;
    if (recurringParams && !interval) throw missingParam(`${param}recurring[interval]`);
    const price: FakePrice = {
      id: newId('price_'),
      object: 'price',
      active,
      billing_scheme: 'per_unit',
      created: state.now(),
      currency: reqString(body, 'currency').toLowerCase(),
      custom_unit_amount: null,
      livemode: false,
      lookup_key: optNullableString(body, 'lookup_key') ?? null,
      metadata: applyMetadata({}, body),
      nickname: optNullableString(body, 'nickname') ?? null,
      product: product.id,
      recurring:
        recurringParams && interval
          ? { interval, interval_count: optInt(recurringParams, 'interval_count', 1) ?? 1, meter: null, trial_period_days: null, usage_type: 'licensed' }
          : null,
      tax_behavior: 'unspecified',
      tiers_mode: null,
      transform_quantity: null,
      type: recurringParams ? 'recurring' : 'one_time',
      unit_amount: unitAmount,
      unit_amount_decimal: String(unitAmount),
    };
    state.prices.set(price.id, price);
    return price;
  };
  router.post('/prices', (req, res) => {
    const body = params(req);
    allowOnly(body, ['currency', 'unit_amount', 'product', 'product_data', 'recurring', 'nickname', 'lookup_key', 'metadata', 'active']);
    res.json(send(req, createPrice(body, '', optBool(body, 'active') ?? true)));
  });
  router.get('/prices/:id', (req, res) => {
    res.json(send(req, state.get(state.prices, 'price', id(req))));
  });
  router.post('/prices/:id', (req, res) => {
    const price = state.get(state.prices, 'price', id(req));
    const body = params(req);
    allowOnly(body, ['active', 'metadata', 'nickname', 'lookup_key']);
    price.active = optBool(body, 'active') ?? price.active;
    for (const field of ['nickname', 'lookup_key'] as const) {
      const value = optNullableString(body, field);
      if (value !== undefined) price[field] = value;
    }
    price.metadata = applyMetadata(price.metadata, body);
    res.json(send(req, price));
  });
  router.get('/prices', (req, res) => {
    const query = params(req);
    const active = optBool(query, 'active');
    const lookupKeys = stringList(query.lookup_keys);
    const recurring = query.recurring === undefined ? undefined : asParams(query.recurring, 'recurring');
    const list = filtered(
      state.prices.values(),
      (p) =>
        matches(query, 'product', p.product) &&
        matches(query, 'type', p.type) &&
        matches(query, 'currency', p.currency) &&
        (active === undefined || p.active === active) &&
        (lookupKeys.length === 0 || (p.lookup_key !== null && lookupKeys.includes(p.lookup_key))) &&
        (recurring === undefined || matches(recurring, 'interval', p.recurring?.interval)),
    );
    res.json(send(req, paginate(list, query, '/v1/prices')));
  });

  // ---- Checkout sessions
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
      } else if (priceData) price = createPrice(priceData, `${param}[price_data]`, false);
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
    allowOnly(intentData, ['metadata', 'description']);
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
    });
    res.json(send(req, session));
  });
  router.get('/checkout/sessions/:id', (req, res) => {
    res.json(send(req, state.get(state.sessions, 'checkout.session', id(req))));
  });
  router.get('/checkout/sessions/:id/line_items', (req, res) => {
    const session = state.get(state.sessions, 'checkout.session', id(req));
    const list = lineItemsOf(session);
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

  // ---- Payment intents, charges, setup intents
  router.get('/payment_intents/:id', (req, res) => {
    res.json(send(req, state.get(state.paymentIntents, 'payment_intent', id(req))));
  });
  router.get('/payment_intents', (req, res) => {
    const query = params(req);
    res.json(send(req, paginate(filtered(state.paymentIntents.values(), (p) => matches(query, 'customer', p.customer)), query, '/v1/payment_intents')));
  });
  router.get('/charges/:id', (req, res) => {
    res.json(send(req, state.get(state.charges, 'charge', id(req))));
  });
  router.get('/charges', (req, res) => {
    const query = params(req);
    const list = filtered(state.charges.values(), (c) => matches(query, 'customer', c.customer) && matches(query, 'payment_intent', c.payment_intent));
    res.json(send(req, paginate(list, query, '/v1/charges')));
  });
  router.get('/setup_intents/:id', (req, res) => {
    res.json(send(req, state.get(state.setupIntents, 'setup_intent', id(req))));
  });

  // ---- Refunds
  router.post('/refunds', (req, res) => {
    const body = params(req);
    allowOnly(body, ['payment_intent', 'charge', 'amount', 'reason', 'metadata']);
    const paymentIntent = optString(body, 'payment_intent');
    const charge = optString(body, 'charge');
    const amount = optInt(body, 'amount');
    const reason: FakeRefund['reason'] = optEnum(body, 'reason', ['duplicate', 'fraudulent', 'requested_by_customer'] as const) ?? null;
    const refund = createRefund(state, {
      ...(paymentIntent ? { paymentIntent } : {}),
      ...(charge ? { charge } : {}),
      ...(amount !== undefined ? { amount } : {}),
      reason,
      metadata: applyMetadata({}, body),
    });
    res.json(send(req, refund));
  });
  router.get('/refunds/:id', (req, res) => {
    res.json(send(req, state.get(state.refunds, 'refund', id(req))));
  });
  router.get('/refunds', (req, res) => {
    const query = params(req);
    const list = filtered(state.refunds.values(), (r) => matches(query, 'charge', r.charge) && matches(query, 'payment_intent', r.payment_intent));
    res.json(send(req, paginate(list, query, '/v1/refunds')));
  });

  // ---- Subscriptions
  router.get('/subscriptions/:id', (req, res) => {
    res.json(send(req, state.get(state.subscriptions, 'subscription', id(req))));
  });
  router.get('/subscriptions', (req, res) => {
    const query = params(req);
    const status = optString(query, 'status');
    const list = filtered(
      state.subscriptions.values(),
      (s) =>
        matches(query, 'customer', s.customer) &&
        (status === 'all' || (status === undefined ? s.status !== 'canceled' : s.status === status)) &&
        (query.price === undefined || s.items.data.some((item) => item.price.id === query.price)),
    );
    res.json(send(req, paginate(list, query, '/v1/subscriptions')));
  });
  router.post('/subscriptions/:id', (req, res) => {
    const subscription = state.get(state.subscriptions, 'subscription', id(req));
    const body = params(req);
    allowOnly(body, ['items', 'metadata', 'cancel_at_period_end', 'proration_behavior', 'description', 'payment_behavior', 'cancellation_details']);
    if (subscription.status === 'canceled') {
      throw invalidRequest('A canceled subscription can only update its cancellation_details and metadata.', undefined, 'resource_already_canceled');
    }
    // Changes are applied to a copy so a rejected parameter leaves the subscription untouched.
    const next = structuredClone(subscription);
    updateItems(state, next, optArray(body, 'items') ?? []);
    next.metadata = applyMetadata(next.metadata, body);
    const description = optNullableString(body, 'description');
    if (description !== undefined) next.description = description;
    const cancelAtPeriodEnd = optBool(body, 'cancel_at_period_end');
    if (cancelAtPeriodEnd !== undefined) {
      next.cancel_at_period_end = cancelAtPeriodEnd;
      next.cancel_at = cancelAtPeriodEnd ? (next.items.data[0]?.current_period_end ?? null) : null;
      next.cancellation_details.reason = cancelAtPeriodEnd ? 'cancellation_requested' : null;
    }
    const changes = changedFields(subscription, next);
    Object.assign(subscription, next);
    if (Object.keys(changes).length > 0) state.emit('customer.subscription.updated', subscription, changes);
    res.json(send(req, subscription));
  });
  router.delete('/subscriptions/:id', (req, res) => {
    const subscription = state.get(state.subscriptions, 'subscription', id(req));
    const query = params(req);
    const details = query.cancellation_details === undefined ? {} : asParams(query.cancellation_details, 'cancellation_details');
    cancelSubscription(state, subscription, 'cancellation_requested', optString(details, 'comment') ?? null);
    res.json(send(req, subscription));
  });

  // ---- Invoices
  router.get('/invoices/:id', (req, res) => {
    res.json(send(req, state.get(state.invoices, 'invoice', id(req))));
  });
  router.get('/invoices', (req, res) => {
    const query = params(req);
    const list = filtered(
      state.invoices.values(),
      (i) => matches(query, 'customer', i.customer) && matches(query, 'status', i.status) && matches(query, 'subscription', i.parent?.subscription_details.subscription),
    );
    res.json(send(req, paginate(list, query, '/v1/invoices')));
  });
  router.post('/invoices/:id/pay', (req, res) => {
    const invoice = state.get(state.invoices, 'invoice', id(req));
    const body = params(req);
    allowOnly(body, ['paid_out_of_band', 'payment_method', 'off_session']);
    if (invoice.status === 'paid') throw invalidRequest('Invoice is already paid', undefined, 'invoice_already_paid');
    const outcome = attemptInvoicePayment(state, invoice, { outOfBand: optBool(body, 'paid_out_of_band') ?? false });
    if (!outcome.paid) throw cardError(outcome.decline, outcome.intent);
    res.json(send(req, invoice));
  });

  // ---- Events
  router.get('/events/:id', (req, res) => {
    res.json(send(req, state.get(state.events, 'event', id(req))));
  });
  router.get('/events', (req, res) => {
    const query = params(req);
    const types = stringList(query.types);
    const list = filtered(state.events.values(), (e) => matches(query, 'type', e.type) && (types.length === 0 || types.includes(e.type)));
    res.json(send(req, paginate(list, query, '/v1/events')));
  });

  router.use((req) => {
    throw new StripeFakeError(404, {
      type: 'invalid_request_error',
      message: `Unrecognized request URL (${req.method}: ${req.originalUrl.split('?')[0]}). This local Stripe stand-in implements only the endpoints Revloop uses.`,
    });
  });
  return router;
}

/** Applies `items[]` changes: by id to change price or quantity or delete; without id to add. Proration is ignored. */
function updateItems(state: FakeState, subscription: FakeSubscription, changes: Params[]): void {
  const items = subscription.items.data;
  const first = items[0];
  changes.forEach((change, i) => {
    const param = `items[${i}]`;
    allowOnly(change, ['id', 'price', 'quantity', 'deleted', 'metadata']);
    const itemId = optString(change, 'id');
    const priceId = optString(change, 'price');
    const price = priceId ? state.get(state.prices, 'price', priceId, `${param}[price]`) : undefined;
    if (price && (!price.recurring || price.currency !== subscription.currency)) {
      throw invalidRequest('Subscription items must use recurring prices in the subscription currency.', `${param}[price]`);
    }
    const quantity = optInt(change, 'quantity', 0);
    if (itemId) {
      const index = items.findIndex((item) => item.id === itemId);
      const item = items[index];
      if (!item) throw noSuch('subscription item', itemId, `${param}[id]`);
      if (optBool(change, 'deleted')) {
        items.splice(index, 1);
        return;
      }
      if (price) item.price = structuredClone(price);
      if (quantity !== undefined) item.quantity = quantity;
      item.metadata = applyMetadata(item.metadata, change);
      return;
    }
    if (!price) throw missingParam(`${param}[price]`);
    if (items.some((item) => item.price.id === price.id)) {
      throw invalidRequest('Cannot add multiple subscription items with the same price.', `${param}[price]`);
    }
    const start = first?.current_period_start ?? state.now();
    const end = first?.current_period_end ?? state.now();
    items.push(newSubscriptionItem(state, subscription.id, price, quantity ?? 1, start, end));
  });
  if (items.length === 0) throw invalidRequest('A subscription must have at least one active plan.', 'items');
}
