import { createHmac } from 'node:crypto';
import type { FakeEvent } from './objects';

export interface WebhookDelivery {
  eventId: string;
  type: string;
  attempt: number;
  url: string;
  /** Wall-clock ISO time of the attempt. */
  at: string;
  status: number | null;
  ok: boolean;
  error?: string;
}

export interface DispatcherOptions {
  url?: string;
  secret: string;
  retryDelaysMs: readonly number[];
  timeoutMs: number;
  logger: (msg: string) => void;
}

/** Stripe's scheme: `t=<unix>,v1=<hex HMAC-SHA256(secret, "<t>.<body>")>`. */
export function signPayload(body: string, secret: string, timestamp: number): string {
  const v1 = createHmac('sha256', secret).update(`${timestamp}.${body}`).digest('hex');
  return `t=${timestamp},v1=${v1}`;
}

/**
 * Posts events to the webhook URL off the request path. First attempts go out one after another in
 * creation order; failed ones retry on their own timers so a dead endpoint never holds up the rest.
 */
export class WebhookDispatcher {
  private log: WebhookDelivery[] = [];
  private held: FakeEvent[] | null = null;
  private chain: Promise<void> = Promise.resolve();
  private pending = 0;
  private waiters: (() => void)[] = [];
  private timers = new Set<NodeJS.Timeout>();
  private generation = 0;

  constructor(private readonly options: DispatcherOptions) {}

  get enabled(): boolean {
    return Boolean(this.options.url);
  }

  deliveries(): WebhookDelivery[] {
    return this.log.map((entry) => ({ ...entry }));
  }

  send(event: FakeEvent): void {
    if (!this.options.url) return;
    if (this.held) {
      this.held.push(event);
      return;
    }
    this.track();
    const generation = this.generation;
    this.chain = this.chain.then(() => this.attempt(event, 1, generation));
  }

  hold(): void {
    this.held ??= [];
  }

  /** Sends what was held, in creation order or reversed, so tests can check order-independent handling. */
  release(order: 'created' | 'reverse' = 'created'): void {
    const events = this.held ?? [];
    this.held = null;
    for (const event of order === 'reverse' ? [...events].reverse() : events) this.send(event);
  }

  /** Resolves once nothing is queued, in flight or waiting to retry. */
  settle(): Promise<void> {
    if (this.pending === 0) return Promise.resolve();
    return new Promise((resolve) => this.waiters.push(resolve));
  }

  reset(): void {
    this.generation += 1;
    for (const timer of this.timers) clearTimeout(timer);
    this.timers.clear();
    this.log = [];
    this.held = null;
    this.pending = 0;
    this.chain = Promise.resolve();
    this.flushWaiters();
  }

  private track(): void {
    this.pending += 1;
  }

  private done(): void {
    this.pending = Math.max(0, this.pending - 1);
    if (this.pending === 0) this.flushWaiters();
  }

  private flushWaiters(): void {
    const waiters = this.waiters;
    this.waiters = [];
    for (const resolve of waiters) resolve();
  }

  private async attempt(event: FakeEvent, attempt: number, generation: number): Promise<void> {
    const url = this.options.url;
    if (!url || generation !== this.generation) return;
    const body = JSON.stringify({ ...event, pending_webhooks: 1 }, null, 2);
    // Signed with wall-clock time, not fake time: receivers check the timestamp against their own clock.
    const signature = signPayload(body, this.options.secret, Math.floor(Date.now() / 1000));
    const entry: WebhookDelivery = { eventId: event.id, type: event.type, attempt, url, at: new Date().toISOString(), status: null, ok: false };
    try {
      const response = await fetch(url, {
        method: 'POST',
        headers: { 'content-type': 'application/json; charset=utf-8', 'stripe-signature': signature, 'user-agent': 'Stripe/1.0 (+https://stripe.com/docs/webhooks)' },
        body,
        signal: AbortSignal.timeout(this.options.timeoutMs),
      });
      await response.arrayBuffer();
      entry.status = response.status;
      entry.ok = response.ok;
    } catch (err) {
      entry.error = err instanceof Error ? err.message : String(err);
    }
    if (generation !== this.generation) return;
    this.log.push(entry);
    const delay = this.options.retryDelaysMs[attempt - 1];
    if (entry.ok || delay === undefined) {
      if (!entry.ok) this.options.logger(`stripe fake: gave up delivering ${event.type} ${event.id} after ${attempt} attempts`);
      this.done();
      return;
    }
    const timer = setTimeout(() => {
      this.timers.delete(timer);
      void this.attempt(event, attempt + 1, generation);
    }, delay);
    this.timers.add(timer);
  }
}
