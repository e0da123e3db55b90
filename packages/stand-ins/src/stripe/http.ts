import type { Request } from 'express';
import { missingParam } from './errors';
import type { FakeCheckoutSession, FakeLineItem, ListObject } from './objects';
import { asParams, type Params } from './params';
import { expand, type FakeState } from './state';

/** What every resource router gets: the shared state, the response shaper and the public origin for hosted pages. */
export interface ApiContext {
  state: FakeState;
  /** Applies the request's `expand[]` to an object before it is answered. */
  send<T extends object>(req: Request, value: T): T;
  publicUrl(req: Request): string;
}

export function params(req: Request): Params {
  return req.method === 'GET' || req.method === 'DELETE' ? (req.query as Params) : asParams(req.body, 'body');
}

export function id(req: Request): string {
  const value = req.params.id;
  if (typeof value !== 'string') throw missingParam('id');
  return value;
}

export function filtered<T extends { id: string }>(items: Iterable<T>, keep: (item: T) => boolean): T[] {
  return [...items].filter(keep);
}

export function matches(query: Params, name: string, value: unknown): boolean {
  const wanted = query[name];
  return wanted === undefined || wanted === value;
}

export function lineItemsOf(state: FakeState, session: FakeCheckoutSession): ListObject<FakeLineItem> {
  return {
    object: 'list',
    data: state.sessionExtras.get(session.id)?.lineItems ?? [],
    has_more: false,
    url: `/v1/checkout/sessions/${session.id}/line_items`,
  };
}

export function apiContext(state: FakeState, publicUrl: (req: Request) => string): ApiContext {
  return {
    state,
    publicUrl,
    // Line items are not stored on the session; `expand[]=line_items` builds them, as the real API does.
    send: (req, value) =>
      expand(state, value, params(req), (field, obj) =>
        field === 'line_items' && 'object' in obj && obj.object === 'checkout.session' ? lineItemsOf(state, obj as FakeCheckoutSession) : undefined,
      ),
  };
}
