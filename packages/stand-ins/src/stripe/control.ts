import express, { Router } from 'express';
import { advanceTime } from './test-clocks';
import { invalidRequest, noSuch } from './errors';
import type { FakeState } from './state';
import type { WebhookDelivery, WebhookDispatcher } from './webhooks';

/** Test-only levers that real Stripe does not have (or has only in its dashboard and test clocks). */
export interface StripeFakeControl {
  /** Fake time in unix seconds. */
  now(): number;
  /** Moves the test clock forward, ending trials, renewing periods and retrying payments on the way; returns the new time. */
  advanceTime(seconds: number): number;
  /** Declines the next payment attempt for this customer or subscription, whatever card is used. */
  failNextPayment(customerOrSubscriptionId: string): void;
  /** Delivers a stored event again, with the same id. */
  resendEvent(eventId: string): void;
  deliveries(): WebhookDelivery[];
  /** Queues new events instead of sending them, until `releaseDeliveries`. */
  holdDeliveries(): void;
  /** Sends the queued events in creation order or reversed. */
  releaseDeliveries(order?: 'created' | 'reverse'): void;
  /** Resolves when no webhook is queued, in flight or waiting to retry. */
  settle(): Promise<void>;
  reset(): void;
}

export function createControl(state: FakeState, webhooks: WebhookDispatcher): StripeFakeControl {
  return {
    now: () => state.now(),
    advanceTime: (seconds) => advanceTime(state, seconds),
    failNextPayment: (id) => {
      if (!state.customers.has(id) && !state.subscriptions.has(id)) throw noSuch('customer or subscription', id);
      state.failNext.add(id);
    },
    resendEvent: (eventId) => webhooks.send(state.get(state.events, 'event', eventId)),
    deliveries: () => webhooks.deliveries(),
    holdDeliveries: () => webhooks.hold(),
    releaseDeliveries: (order) => webhooks.release(order),
    settle: () => webhooks.settle(),
    reset: () => {
      webhooks.reset();
      state.reset();
    },
  };
}

/** The same levers as JSON over HTTP under `/_control`, for browser tests. */
export function controlRouter(control: StripeFakeControl): Router {
  const router = Router();
  router.use(express.json());
  const body = (value: unknown): Record<string, unknown> => (typeof value === 'object' && value !== null ? (value as Record<string, unknown>) : {});

  router.get('/now', (_req, res) => {
    res.json({ now: control.now() });
  });
  router.post('/advance-time', (req, res) => {
    const seconds = Number(body(req.body).seconds);
    if (!Number.isFinite(seconds)) throw invalidRequest('seconds must be a number', 'seconds');
    res.json({ now: control.advanceTime(seconds) });
  });
  router.post('/fail-next-payment', (req, res) => {
    const id = body(req.body).id;
    if (typeof id !== 'string') throw invalidRequest('id must be a customer or subscription id', 'id');
    control.failNextPayment(id);
    res.json({ ok: true });
  });
  router.post('/events/:id/resend', (req, res) => {
    control.resendEvent(req.params.id);
    res.json({ ok: true });
  });
  router.get('/deliveries', (_req, res) => {
    res.json({ data: control.deliveries() });
  });
  router.post('/deliveries/hold', (_req, res) => {
    control.holdDeliveries();
    res.json({ ok: true });
  });
  router.post('/deliveries/release', (req, res) => {
    control.releaseDeliveries(body(req.body).order === 'reverse' ? 'reverse' : 'created');
    res.json({ ok: true });
  });
  router.post('/deliveries/settle', async (_req, res) => {
    await control.settle();
    res.json({ ok: true });
  });
  router.post('/reset', (_req, res) => {
    control.reset();
    res.json({ ok: true });
  });
  return router;
}
