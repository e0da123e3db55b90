import { Router } from 'express';
import { filtered, id, matches, params, type ApiContext } from './http';
import type { FakeCustomer, Metadata } from './objects';
import { allowOnly, applyMetadata, optNullableString } from './params';
import { newId, paginate, type FakeState } from './state';

export function createCustomer(state: FakeState, fields: { email?: string | null; name?: string | null; phone?: string | null; description?: string | null; metadata?: Metadata }): FakeCustomer {
  const customer: FakeCustomer = {
    id: newId('cus_', 14),
    object: 'customer',
    address: null,
    balance: 0,
    created: state.now(),
    currency: null,
    default_source: null,
    delinquent: false,
    description: fields.description ?? null,
    email: fields.email ?? null,
    invoice_prefix: newId('', 8).toUpperCase().replace(/[^A-Z0-9]/g, 'X'),
    invoice_settings: { custom_fields: null, default_payment_method: null, footer: null, rendering_options: null },
    livemode: false,
    metadata: fields.metadata ?? {},
    name: fields.name ?? null,
    next_invoice_sequence: 1,
    phone: fields.phone ?? null,
    preferred_locales: [],
    shipping: null,
    tax_exempt: 'none',
  };
  state.customers.set(customer.id, customer);
  return customer;
}

export function customersRouter({ state, send }: ApiContext): Router {
  const router = Router();
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

  return router;
}

