import express, { Router, type Request, type RequestHandler } from 'express';
import { checkoutSessionsRouter } from './checkout-sessions';
import { customersRouter } from './customers';
import { StripeFakeError } from './errors';
import { eventsRouter } from './events';
import { apiContext } from './http';
import { idempotency } from './idempotency';
import { invoicesRouter } from './invoices';
import { paymentIntentsRouter } from './payment-intents';
import { paymentMethodsRouter } from './payment-methods';
import { pricesRouter } from './prices';
import { productsRouter } from './products';
import { refundsRouter } from './refunds';
import { setupIntentsRouter } from './setup-intents';
import { newId, requestContext, type FakeState } from './state';
import { subscriptionsRouter } from './subscriptions';

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

/** The `/v1` API: one router per resource, behind the key check, request context and idempotency replay. */
export function apiRouter(state: FakeState, publicUrl: (req: Request) => string): Router {
  const router = Router();
  // The context starts after body parsing: parser callbacks would otherwise run outside it.
  router.use(authenticate, express.urlencoded({ extended: true, limit: '1mb' }), withRequestContext, idempotency(state));
  const context = apiContext(state, publicUrl);
  for (const resource of [
    customersRouter,
    productsRouter,
    pricesRouter,
    checkoutSessionsRouter,
    paymentIntentsRouter,
    paymentMethodsRouter,
    setupIntentsRouter,
    refundsRouter,
    subscriptionsRouter,
    invoicesRouter,
    eventsRouter,
  ]) {
    router.use(resource(context));
  }
  router.use((req) => {
    throw new StripeFakeError(404, {
      type: 'invalid_request_error',
      message: `Unrecognized request URL (${req.method}: ${req.originalUrl.split('?')[0]}). This local stand-in implements only the endpoints listed in its README.`,
    });
  });
  return router;
}
