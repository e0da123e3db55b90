import { Router } from 'express';
import { invalidRequest } from './errors';
import { filtered, id, params, type ApiContext } from './http';
import type { FakeProduct } from './objects';
import { allowOnly, applyMetadata, optBool, optNullableString, optString, reqString, stringList, type Params } from './params';
import { newId, paginate, type FakeState } from './state';

export function createProduct(state: FakeState, body: Params): FakeProduct {
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
}

export function productsRouter({ state, send }: ApiContext): Router {
  const router = Router();
  const productFields = ['name', 'description', 'active', 'metadata', 'images', 'url', 'unit_label', 'statement_descriptor'];
  router.post('/products', (req, res) => {
    const body = params(req);
    allowOnly(body, [...productFields, 'id']);
    res.json(send(req, createProduct(state, body)));
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
  return router;
}
