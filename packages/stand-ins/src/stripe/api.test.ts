import Stripe from 'stripe';
import { describe, expect, it } from 'vitest';
import { useHarness } from './test-support';

const h = useHarness();

describe('stripe fake: catalogue and customers', () => {
  it('creates, retrieves, updates and lists customers by email', async () => {
    const created = await h.stripe.customers.create({ email: 'owner@shop.test', name: 'Shop Owner', metadata: { shopId: 'shop_1' } });
    expect(created).toMatchObject({ object: 'customer', email: 'owner@shop.test', livemode: false, metadata: { shopId: 'shop_1' } });
    expect(created.id).toMatch(/^cus_/);
    expect(typeof created.created).toBe('number');
    await h.stripe.customers.create({ email: 'other@shop.test' });

    const updated = await h.stripe.customers.update(created.id, { name: 'Renamed', metadata: { shopId: '', tier: 'gold' } });
    expect(updated.name).toBe('Renamed');
    expect(updated.metadata).toEqual({ tier: 'gold' });

    const retrieved = await h.stripe.customers.retrieve(created.id);
    expect(retrieved).toMatchObject({ id: created.id, name: 'Renamed' });

    const byEmail = await h.stripe.customers.list({ email: 'owner@shop.test' });
    expect(byEmail).toMatchObject({ object: 'list', has_more: false, url: '/v1/customers' });
    expect(byEmail.data.map((c) => c.id)).toEqual([created.id]);
  });

  it('creates a product and a recurring price', async () => {
    const product = await h.stripe.products.create({ name: 'Stage 1 tune', metadata: { packageId: 'pkg_1' } });
    expect(product).toMatchObject({ object: 'product', active: true, name: 'Stage 1 tune' });
    expect(product.id).toMatch(/^prod_/);
    const price = await h.stripe.prices.create({ product: product.id, unit_amount: 2500, currency: 'EUR', recurring: { interval: 'month' } });
    expect(price).toMatchObject({
      object: 'price',
      currency: 'eur',
      unit_amount: 2500,
      type: 'recurring',
      product: product.id,
      recurring: { interval: 'month', interval_count: 1 },
    });
    expect(price.id).toMatch(/^price_/);
    const prices = await h.stripe.prices.list({ product: product.id });
    expect(prices.data.map((p) => p.id)).toEqual([price.id]);
  });

  it('pages newest first with limit and starting_after', async () => {
    const ids: string[] = [];
    for (let i = 0; i < 25; i++) ids.push((await h.stripe.customers.create({ email: `c${i}@shop.test` })).id);
    const newestFirst = [...ids].reverse();

    const first = await h.stripe.customers.list({ limit: 10 });
    expect(first.has_more).toBe(true);
    expect(first.data.map((c) => c.id)).toEqual(newestFirst.slice(0, 10));
    const second = await h.stripe.customers.list({ limit: 10, starting_after: first.data.at(-1)?.id });
    expect(second.data.map((c) => c.id)).toEqual(newestFirst.slice(10, 20));
    const before = await h.stripe.customers.list({ limit: 5, ending_before: second.data[0]?.id });
    expect(before.data.map((c) => c.id)).toEqual(newestFirst.slice(5, 10));

    const all = await h.stripe.customers.list({ limit: 7 }).autoPagingToArray({ limit: 100 });
    expect(all.map((c) => c.id)).toEqual(newestFirst);
  });
});

describe('stripe fake: errors', () => {
  it('answers a missing object with a 404 in Stripe shape', async () => {
    const error = await h.stripe.customers.retrieve('cus_missing').catch((err: unknown) => err);
    expect(error).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect(error).toMatchObject({ statusCode: 404, code: 'resource_missing', param: 'id', message: "No such customer: 'cus_missing'" });

    const raw = await h.http().get('/v1/subscriptions/sub_missing').set('Authorization', 'Bearer sk_test_x');
    expect(raw.status).toBe(404);
    expect(raw.body).toEqual({ error: { type: 'invalid_request_error', code: 'resource_missing', message: "No such subscription: 'sub_missing'", param: 'id' } });
  });

  it('answers an endpoint it does not implement with a 404 in Stripe shape', async () => {
    const raw = await h.http().get('/v1/payouts').set('Authorization', 'Bearer sk_test_x');
    expect(raw.status).toBe(404);
    expect(raw.body.error).toMatchObject({ type: 'invalid_request_error', message: expect.stringContaining('Unrecognized request URL (GET: /v1/payouts)') });
  });

  it('requires a test secret key', async () => {
    const none = await h.http().get('/v1/customers');
    expect(none.status).toBe(401);
    expect(none.body.error).toMatchObject({ type: 'invalid_request_error' });
    const wrong = new Stripe('pk_live_nope', { host: '127.0.0.1', port: h.fake.port, protocol: 'http', maxNetworkRetries: 0, telemetry: false });
    await expect(wrong.customers.list()).rejects.toBeInstanceOf(Stripe.errors.StripeAuthenticationError);
  });

  it('rejects unknown and missing parameters', async () => {
    await expect(h.stripe.products.create({ name: 'x', colour: 'red' } as Stripe.ProductCreateParams)).rejects.toMatchObject({
      statusCode: 400,
      code: 'parameter_unknown',
      param: 'colour',
    });
    await expect(h.stripe.prices.create({ currency: 'usd', unit_amount: 100 })).rejects.toMatchObject({ code: 'parameter_missing', param: 'product' });
  });
});

describe('stripe fake: idempotency', () => {
  it('replays the saved response for the same key and params', async () => {
    const first = await h.stripe.customers.create({ email: 'same@shop.test' }, { idempotencyKey: 'key-1' });
    const again = await h.stripe.customers.create({ email: 'same@shop.test' }, { idempotencyKey: 'key-1' });
    expect(again.id).toBe(first.id);
    expect(again.lastResponse.headers['idempotent-replayed']).toBe('true');
    expect((await h.stripe.customers.list()).data).toHaveLength(1);
  });

  it('refuses the same key with other params', async () => {
    await h.stripe.customers.create({ email: 'a@shop.test' }, { idempotencyKey: 'key-2' });
    const error = await h.stripe.customers.create({ email: 'b@shop.test' }, { idempotencyKey: 'key-2' }).catch((err: unknown) => err);
    expect(error).toBeInstanceOf(Stripe.errors.StripeIdempotencyError);
    expect(error).toMatchObject({ statusCode: 400, type: 'StripeIdempotencyError' });
  });

  it('forgets keys after 24 hours of fake time', async () => {
    const first = await h.stripe.customers.create({ email: 'late@shop.test' }, { idempotencyKey: 'key-3' });
    h.fake.control.advanceTime(24 * 3600);
    const later = await h.stripe.customers.create({ email: 'late@shop.test' }, { idempotencyKey: 'key-3' });
    expect(later.id).not.toBe(first.id);
  });
});
