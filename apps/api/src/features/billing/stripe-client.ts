import Stripe from 'stripe';
import type { Env } from '../../env';

const clients = new WeakMap<Env, Stripe>();

/**
 * The one Stripe SDK client of an app. With STRIPE_API_URL set it talks to that Stripe-compatible server (the
 * local stand-in); without it, to Stripe itself, so a real account is configuration only.
 */
export function stripeFor(env: Env): Stripe {
  const existing = clients.get(env);
  if (existing) return existing;
  const target = env.STRIPE_API_URL ? new URL(env.STRIPE_API_URL) : null;
  const client = new Stripe(env.STRIPE_SECRET_KEY, {
    ...(target && {
      host: target.hostname,
      port: Number(target.port || (target.protocol === 'https:' ? 443 : 80)),
      protocol: target.protocol === 'https:' ? 'https' : 'http',
    }),
    // Every call that moves money carries its own idempotency key, so a retry by the SDK could not double it either;
    // failures surface at once instead of holding the request.
    maxNetworkRetries: 0,
    telemetry: false,
  });
  clients.set(env, client);
  return client;
}

/** A provider timestamp (unix seconds) as ISO text. */
export const fromUnix = (seconds: number | null | undefined): string | null =>
  typeof seconds === 'number' ? new Date(seconds * 1000).toISOString() : null;

/** The id of an expandable field, whether the provider sent the id or the object. */
export const idOf = (value: string | { id: string } | null | undefined): string | null =>
  value === null || value === undefined ? null : typeof value === 'string' ? value : value.id;
