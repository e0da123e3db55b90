import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import express, { type Express } from 'express';
import { controlRouter, createControl, type StripeFakeControl } from './control';
import { stripeErrorHandler } from './errors';
import { hostedPageRouter } from './hosted-page';
import { apiRouter } from './api';
import { FakeState, type Dunning } from './state';
import { WebhookDispatcher } from './webhooks';

export type { StripeFakeControl } from './control';
export type { WebhookDelivery } from './webhooks';

export interface StripeFakeOptions {
  webhookUrl?: string;
  webhookSecret: string;
  /** Origin put in `checkout.session.url`; defaults to the origin the API request came in on. */
  publicUrl?: string;
  /** Wall clock in milliseconds, like `Date.now`; the test clock adds its advance on top. */
  now?: () => number;
  logger?: (msg: string) => void;
  /** Waits between webhook retries; one attempt more than entries. Defaults to 0.5 s, 2 s, 8 s. */
  webhookRetryDelaysMs?: number[];
  /** Stripe's setting for a subscription whose last payment retry failed: cancel it (default) or mark it unpaid. */
  afterFailedRetries?: Dunning;
}

export function createStripeFake(options: StripeFakeOptions): { app: Express; control: StripeFakeControl } {
  const logger = options.logger ?? (() => undefined);
  const webhooks = new WebhookDispatcher({
    ...(options.webhookUrl ? { url: options.webhookUrl } : {}),
    secret: options.webhookSecret,
    retryDelaysMs: options.webhookRetryDelaysMs ?? [500, 2000, 8000],
    timeoutMs: 5000,
    logger,
  });
  const state = new FakeState({
    now: options.now ?? Date.now,
    dunning: options.afterFailedRetries ?? 'cancel',
    onEvent: (event) => {
      event.pending_webhooks = webhooks.enabled ? 1 : 0;
      webhooks.send(event);
    },
  });
  const control = createControl(state, webhooks);

  const app = express();
  app.disable('x-powered-by');
  // The SDK sends list filters and expand[] as nested query strings.
  app.set('query parser', 'extended');
  app.use('/_control', controlRouter(control));
  app.use('/checkout', hostedPageRouter(state));
  app.use('/v1', apiRouter(state, (req) => options.publicUrl ?? `${req.protocol}://${req.get('host') ?? '127.0.0.1'}`));
  app.use(stripeErrorHandler);
  return { app, control };
}

export async function startStripeFake(
  options: StripeFakeOptions & { port?: number; host?: string },
): Promise<{ url: string; port: number; control: StripeFakeControl; close(): Promise<void> }> {
  const { app, control } = createStripeFake(options);
  const host = options.host ?? '127.0.0.1';
  const server = await new Promise<Server>((resolve, reject) => {
    const listening = app.listen(options.port ?? 0, host, (err?: Error) => (err ? reject(err) : resolve(listening)));
  });
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://${host}:${port}`,
    port,
    control,
    close: async () => {
      control.reset();
      // The SDK keeps connections alive; close them so the server can stop.
      server.closeAllConnections();
      await new Promise<void>((resolve, reject) => server.close((err) => (err ? reject(err) : resolve())));
    },
  };
}
