import { AsyncLocalStorage } from 'node:async_hooks';
import { randomBytes } from 'node:crypto';
import Stripe from 'stripe';
import { invalidRequest, noSuch } from './errors';
import type {
  FakeCard,
  FakeCharge,
  FakeCheckoutSession,
  FakeCustomer,
  FakeEvent,
  FakeEventType,
  Decline,
  FakeInvoice,
  FakeLineItem,
  FakeObject,
  FakePaymentIntent,
  FakePaymentMethod,
  FakePrice,
  FakeProduct,
  FakeRefund,
  FakeSetupIntent,
  FakeSubscription,
  ListObject,
} from './objects';
import { stringList, type Params } from './params';

const ALPHABET = '0123456789ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz';

export function newId(prefix: string, length = 24): string {
  const bytes = randomBytes(length);
  let out = prefix;
  for (const byte of bytes) out += ALPHABET[byte % ALPHABET.length];
  return out;
}

export interface RequestContext {
  id: string;
  idempotencyKey: string | null;
}

/** Lets events record the API request that caused them without threading it through every call. */
export const requestContext = new AsyncLocalStorage<RequestContext>();

export interface SessionExtras {
  lineItems: FakeLineItem[];
  trialPeriodDays: number | null;
  subscriptionMetadata: Record<string, string>;
  paymentIntentMetadata: Record<string, string>;
  paymentIntentDescription: string | null;
  paymentIntentCaptureMethod: 'automatic_async' | 'manual';
  setupIntentMetadata: Record<string, string>;
}

export interface SubscriptionExtras {
  /** Count of whole periods since the billing anchor; period ends are computed from the anchor to avoid month drift. */
  periodIndex: number;
  trialWillEndSent: boolean;
}

export interface SavedResponse {
  fingerprint: string;
  status: number;
  body: unknown;
  created: number;
}

export type Dunning = 'cancel' | 'mark_unpaid';

export interface StateOptions {
  now: () => number;
  dunning: Dunning;
  onEvent: (event: FakeEvent) => void;
}

export class FakeState {
  customers = new Map<string, FakeCustomer>();
  products = new Map<string, FakeProduct>();
  prices = new Map<string, FakePrice>();
  sessions = new Map<string, FakeCheckoutSession>();
  sessionExtras = new Map<string, SessionExtras>();
  paymentIntents = new Map<string, FakePaymentIntent>();
  charges = new Map<string, FakeCharge>();
  refunds = new Map<string, FakeRefund>();
  subscriptions = new Map<string, FakeSubscription>();
  subscriptionExtras = new Map<string, SubscriptionExtras>();
  invoices = new Map<string, FakeInvoice>();
  setupIntents = new Map<string, FakeSetupIntent>();
  paymentMethods = new Map<string, FakePaymentMethod>();
  /** Payment methods made from a declining test card: every charge on them fails this way. */
  paymentMethodDeclines = new Map<string, Decline>();
  events = new Map<string, FakeEvent>();
  /** The card a customer last paid with; renewals charge it. */
  cardsOnFile = new Map<string, { paymentMethod: string; card: FakeCard }>();
  /** Customer or subscription ids whose next payment attempt is declined. */
  failNext = new Set<string>();
  idempotencyKeys = new Map<string, SavedResponse>();
  private offsetSeconds = 0;

  constructor(readonly options: StateOptions) {}

  reset(): void {
    for (const value of Object.values(this)) {
      if (value instanceof Map || value instanceof Set) value.clear();
    }
    this.offsetSeconds = 0;
  }

  /** Fake time in unix seconds: the injected clock plus whatever the test clock has advanced. */
  now(): number {
    return Math.floor(this.options.now() / 1000) + this.offsetSeconds;
  }

  setNow(seconds: number): void {
    this.offsetSeconds += seconds - this.now();
  }

  emit(type: FakeEventType, object: FakeObject, previousAttributes?: Record<string, unknown>): FakeEvent {
    const request = requestContext.getStore();
    const event: FakeEvent = {
      id: newId('evt_'),
      object: 'event',
      api_version: Stripe.API_VERSION,
      created: this.now(),
      data: { object: structuredClone(object), ...(previousAttributes ? { previous_attributes: structuredClone(previousAttributes) } : {}) },
      livemode: false,
      pending_webhooks: 0,
      request: { id: request?.id ?? null, idempotency_key: request?.idempotencyKey ?? null },
      type,
    };
    this.events.set(event.id, event);
    this.options.onEvent(event);
    return event;
  }

  /** Any object by id, for `expand[]` and pagination cursors. */
  lookup(id: string): FakeObject | undefined {
    const maps: Map<string, FakeObject>[] = [
      this.customers,
      this.products,
      this.prices,
      this.sessions,
      this.paymentIntents,
      this.charges,
      this.refunds,
      this.subscriptions,
      this.invoices,
      this.setupIntents,
      this.paymentMethods,
    ];
    for (const map of maps) {
      const found = map.get(id);
      if (found) return found;
    }
    return undefined;
  }

  get<T>(map: Map<string, T>, noun: string, id: string, param = 'id'): T {
    const found = map.get(id);
    if (!found) throw noSuch(noun, id, param);
    return found;
  }
}

/** Stripe lists newest first and pages with `limit`, `starting_after` and `ending_before`. */
export function paginate<T extends { id: string }>(items: Iterable<T>, query: Params, url: string): ListObject<T> {
  const all = [...items].reverse();
  const limitRaw = typeof query.limit === 'string' ? query.limit : '10';
  const limit = Number(limitRaw);
  if (!Number.isInteger(limit) || limit < 1 || limit > 100) {
    throw invalidRequest('This value must be greater than or equal to 1 and less than or equal to 100.', 'limit');
  }
  const after = typeof query.starting_after === 'string' ? query.starting_after : undefined;
  const before = typeof query.ending_before === 'string' ? query.ending_before : undefined;
  const cursor = after ?? before;
  if (cursor !== undefined) {
    const index = all.findIndex((item) => item.id === cursor);
    if (index < 0) throw invalidRequest(`No such object: '${cursor}'`, after ? 'starting_after' : 'ending_before', 'resource_missing');
    if (after) {
      const rest = all.slice(index + 1);
      return { object: 'list', data: rest.slice(0, limit), has_more: rest.length > limit, url };
    }
    const head = all.slice(0, index);
    return { object: 'list', data: head.slice(Math.max(0, head.length - limit)), has_more: head.length > limit, url };
  }
  return { object: 'list', data: all.slice(0, limit), has_more: all.length > limit, url };
}

/** Replaces id strings with their objects for each `expand[]` path, one or two levels deep (`a.b`, `data.a`). */
export function expand<T extends object>(state: FakeState, value: T, query: Params, extra?: (path: string, obj: object) => unknown): T {
  const paths = stringList(query.expand);
  if (paths.length === 0) return value;
  const copy = structuredClone(value);
  for (const path of paths) expandPath(state, copy as Record<string, unknown>, path.split('.'), extra);
  return copy;
}

function expandPath(state: FakeState, obj: Record<string, unknown>, parts: string[], extra?: (path: string, obj: object) => unknown): void {
  const [head, ...rest] = parts;
  if (head === undefined) return;
  if (head === 'data' && Array.isArray(obj.data)) {
    for (const item of obj.data as Record<string, unknown>[]) expandPath(state, item, rest, extra);
    return;
  }
  const current = obj[head];
  const custom = extra?.(head, obj);
  if (custom !== undefined) obj[head] = custom;
  else if (typeof current === 'string') {
    const found = state.lookup(current);
    if (!found) return;
    obj[head] = structuredClone(found);
  }
  const next = obj[head];
  if (rest.length > 0 && typeof next === 'object' && next !== null) expandPath(state, next as Record<string, unknown>, rest, extra);
}
/** Previous values of the top-level fields that changed, as Stripe sends in `*.updated` events. */
export function changedFields<T extends object>(before: T, after: T): Record<string, unknown> {
  const prev: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(before)) {
    if (JSON.stringify(value) !== JSON.stringify((after as Record<string, unknown>)[key])) prev[key] = value;
  }
  return prev;
}

