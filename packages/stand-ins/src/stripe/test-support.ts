import { createServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import Stripe from 'stripe';
import request from 'supertest';
import { afterAll, beforeAll, beforeEach } from 'vitest';
import { startStripeFake, type StripeFakeOptions } from './index';

export const WEBHOOK_SECRET = 'whsec_test_revloop_fake';

export interface ReceivedWebhook {
  body: string;
  signature: string;
  event: Stripe.Event;
}

/** A webhook endpoint on 127.0.0.1 that records raw bodies and can be told to fail. */
export async function startReceiver() {
  const received: ReceivedWebhook[] = [];
  let failuresLeft = 0;
  let failType: string | undefined;
  const server = createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on('data', (chunk: Buffer) => chunks.push(chunk));
    req.on('end', () => {
      const body = Buffer.concat(chunks).toString('utf8');
      const event = JSON.parse(body) as Stripe.Event;
      if (failuresLeft > 0 && (failType === undefined || failType === event.type)) {
        failuresLeft -= 1;
        res.writeHead(500).end('down for a moment');
        return;
      }
      received.push({ body, signature: String(req.headers['stripe-signature']), event });
      res.writeHead(200, { 'content-type': 'application/json' }).end('{"received":true}');
    });
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${port}/webhooks/stripe`,
    received,
    /** Answers 500 to the next `count` deliveries, of one event type if given. */
    failNext(count: number, type?: string) {
      failuresLeft = count;
      failType = type;
    },
    ofType(type: string) {
      return received.filter((w) => w.event.type === type);
    },
    close: () => {
      server.closeAllConnections();
      return new Promise<void>((resolve) => server.close(() => resolve()));
    },
  };
}

export async function startHarness(options: Partial<StripeFakeOptions> = {}) {
  const receiver = await startReceiver();
  const fake = await startStripeFake({ webhookUrl: receiver.url, webhookSecret: WEBHOOK_SECRET, webhookRetryDelaysMs: [20, 40], ...options });
  const stripe = new Stripe('sk_test_revloop', { host: '127.0.0.1', port: fake.port, protocol: 'http', maxNetworkRetries: 0, telemetry: false });
  return {
    stripe,
    fake,
    receiver,
    http: () => request(fake.url),
    /** Submits the hosted page form the way a browser would. */
    submitCheckout: (sessionId: string, action: 'pay' | 'decline' = 'pay', card = '4242 4242 4242 4242') =>
      request(fake.url).post(`/checkout/${sessionId}`).type('form').send({ card, action }),
    close: async () => {
      await fake.close();
      await receiver.close();
    },
  };
}

export type Harness = Awaited<ReturnType<typeof startHarness>>;

/**
 * One harness per test file, reset with its received webhooks cleared before each test. The returned object
 * forwards to the harness started in `beforeAll`, so tests can hold it from the top of the file.
 */
export function useHarness(options: Partial<StripeFakeOptions> = {}): Harness {
  let current: Harness | undefined;
  beforeAll(async () => {
    current = await startHarness(options);
  });
  afterAll(() => current?.close());
  beforeEach(() => {
    current?.fake.control.reset();
    if (current) current.receiver.received.length = 0;
  });
  return new Proxy({} as Harness, {
    get: (_target, key) => {
      if (!current) throw new Error('the stand-in harness starts in beforeAll');
      return Reflect.get(current, key);
    },
  });
}

export async function createMonthlyPrice(stripe: Stripe, unitAmount = 4900) {
  const product = await stripe.products.create({ name: 'Shop plan', metadata: { plan: 'pro' } });
  return stripe.prices.create({ product: product.id, unit_amount: unitAmount, currency: 'usd', recurring: { interval: 'month' } });
}

/** Saves a test card for a new customer through Checkout in setup mode, as a booking made ahead would. */
export async function saveCardThroughCheckout(h: Harness, card?: string) {
  const customer = await h.stripe.customers.create({ email: 'renter@owner.test' });
  const session = await h.stripe.checkout.sessions.create({
    mode: 'setup',
    customer: customer.id,
    currency: 'usd',
    setup_intent_data: { metadata: { booking: 'bk_7' } },
    success_url: 'http://127.0.0.1:5173/bookings/7?session={CHECKOUT_SESSION_ID}',
  });
  const submitted = await h.submitCheckout(session.id, 'pay', card);
  const [saved] = (await h.stripe.customers.listPaymentMethods(customer.id)).data;
  return { customer, session, submitted, card: saved };
}
