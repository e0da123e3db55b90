import { Router } from 'express';
import { invalidRequest, missingParam } from './errors';
import { filtered, id, matches, params, type ApiContext } from './http';
import type { FakePrice } from './objects';
import { allowOnly, applyMetadata, asParams, optBool, optEnum, optInt, optNullableString, optString, reqString, stringList, type Params } from './params';
import { createProduct } from './products';
import { newId, paginate, type FakeState } from './state';

export function createPrice(state: FakeState, body: Params, param: string, active: boolean): FakePrice {
  const productId = optString(body, 'product');
  const productData = body.product_data === undefined ? undefined : asParams(body.product_data, `${param}product_data`);
  if (productId && productData) throw invalidRequest('You may only specify one of these parameters: product, product_data.', `${param}product`);
  const product = productId
    ? state.get(state.products, 'product', productId, `${param}product`)
    : productData
      ? createProduct(state, productData)
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
}

export function pricesRouter({ state, send }: ApiContext): Router {
  const router = Router();
  router.post('/prices', (req, res) => {
    const body = params(req);
    allowOnly(body, ['currency', 'unit_amount', 'product', 'product_data', 'recurring', 'nickname', 'lookup_key', 'metadata', 'active']);
    res.json(send(req, createPrice(state, body, '', optBool(body, 'active') ?? true)));
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
  return router;
}
