import type { Request, RequestHandler } from 'express';
import {
  dialectOf,
  findMembershipOfUser,
  findSessionContext,
  inShopScope,
  findShopById,
  findShopSubscription,
  findUserById,
  type Db,
  type MembershipRow,
  type SessionContextRows,
  type ShopRow,
  type ShopSubscriptionRow,
  type UserRow,
} from '@revloop/db';
import { DomainError } from '@revloop/domain';
import { defineAbilityFor, type Action, type Actor, type AppAbility, type SubjectName, asSubject } from '@revloop/domain/auth';
import { READ_ONLY_REASON_TEXT } from '@revloop/domain/billing';
import { readCookie } from './cookies';
import type { Clock } from './clock';
import {
  SESSION_COOKIE,
  checkSession,
  hashToken,
  invalidateSession,
  sessionCookie,
  type SessionPolicy,
} from '../features/auth/session.service';

export interface AuthContext {
  sessionId: string;
  /** Why the shop is read-only, in words for the banner; null when it is not. */
  readOnlyReason: string | null;
  user: UserRow;
  shop: ShopRow | null;
  membership: MembershipRow | null;
  actor: Actor;
  ability: AppAbility;
}

declare module 'express-serve-static-core' {
  interface Request {
    auth?: AuthContext;
  }
}

/** A suspended shop, or one whose trial ended or subscription lapsed past its grace period, signs in read-only. */
export const isShopReadOnly = (shop: ShopRow, billing?: Pick<ShopSubscriptionRow, 'read_only_reason'>): boolean =>
  shop.status !== 'active' || Boolean(billing?.read_only_reason);

export function buildActor(user: UserRow, membership: MembershipRow | null, shop: ShopRow | null, billing?: Pick<ShopSubscriptionRow, 'read_only_reason'>): Actor {
  return {
    userId: user.id,
    platformAdmin: user.platform_admin === 1,
    shopId: membership && shop ? shop.id : null,
    role: membership?.role ?? null,
    dealerId: membership?.dealer_id ?? null,
    shopReadOnly: shop ? isShopReadOnly(shop, billing) : false,
  };
}

export async function loadAuthContext(
  db: Db,
  sessionId: string,
  userId: string,
  shopId: string | null,
): Promise<AuthContext | null> {
  const user = await findUserById(db, userId);
  if (!user) return null;
  const membership = shopId ? ((await findMembershipOfUser(db, shopId, userId)) ?? null) : null;
  const shop = shopId && membership ? ((await findShopById(db, shopId)) ?? null) : null;
  const billing = shop ? ((await findShopSubscription(db, shop.id)) ?? null) : null;
  return authContextOf(sessionId, shopId, { user, membership, shop, billing });
}

/** The context of a user in a shop (or none): null when the shop session no longer has an active member or shop. */
function authContextOf(
  sessionId: string,
  shopId: string | null,
  rows: { user: UserRow; membership: MembershipRow | null; shop: ShopRow | null; billing: ShopSubscriptionRow | null },
): AuthContext | null {
  const { user } = rows;
  const membership = shopId ? rows.membership : null;
  const shop = shopId ? rows.shop : null;
  if (shopId && (!membership || membership.status !== 'active' || !shop)) return null;
  const billing = shop ? (rows.billing ?? undefined) : undefined;
  const actor = buildActor(user, membership, shop, billing);
  const readOnlyReason = !shop
    ? null
    : shop.status !== 'active'
      ? 'This shop is suspended by the platform: you can read and download, but not change anything.'
      : billing?.read_only_reason
        ? READ_ONLY_REASON_TEXT[billing.read_only_reason]
        : null;
  return { sessionId, user, shop, membership, actor, readOnlyReason, ability: defineAbilityFor(actor) };
}

const SESSION_SHOP_HINTS = 10_000;

/**
 * Reads a session with its user, membership, shop and billing. On PostgreSQL it first asks in the shop scope the
 * session had last time on this instance (a hint): the pooled connections of a shop's requests usually carry that
 * shop already, so the lookup costs no `set_config` round trip (http/shop-scope.ts). A session seen in that scope is
 * complete there (its rows are that shop's, or have none); one not seen is asked for again unscoped.
 */
async function lookUpSession(db: Db, id: string, hints: Map<string, string> | null): Promise<SessionContextRows | undefined> {
  const hint = hints?.get(id);
  const rows = (hint ? await inShopScope(db, hint, () => findSessionContext(db, id)) : undefined) ?? (await findSessionContext(db, id));
  if (hints) {
    hints.delete(id);
    if (rows?.session.shop_id) hints.set(id, rows.session.shop_id);
    if (hints.size > SESSION_SHOP_HINTS) hints.delete(hints.keys().next().value!);
  }
  return rows;
}

/** Reads the session cookie on every request (one joined query); a renewed session gets a fresh cookie. */
export function sessionMiddleware(deps: { db: Db; clock: Clock; policy: SessionPolicy; secureCookies: boolean }): RequestHandler {
  const hints = dialectOf(deps.db) === 'postgres' ? new Map<string, string>() : null;
  return async (req, res, next) => {
    const token = readCookie(req.headers.cookie, SESSION_COOKIE);
    if (!token) return next();
    const rows = await lookUpSession(deps.db, hashToken(token), hints);
    if (!rows) return next();
    // The session's own row: written in its shop's scope, which the connection most likely carries already.
    const inItsShop = <T>(work: () => Promise<T>) => (rows.session.shop_id ? inShopScope(deps.db, rows.session.shop_id, work) : work());
    const result = await inItsShop(() => checkSession(deps.db, deps.policy, rows.session, deps.clock.now()));
    if (!result) return next();
    const auth = authContextOf(result.session.id, result.session.shop_id, rows);
    if (!auth) {
      await inItsShop(() => invalidateSession(deps.db, result.session.id));
      return next();
    }
    req.auth = auth;
    if (result.renewed) res.append('Set-Cookie', sessionCookie(token, result.session.expires_at, deps.secureCookies));
    next();
  };
}

export function requireAuth(req: Request): AuthContext {
  if (!req.auth) throw new DomainError('unauthenticated', 'Please sign in.');
  return req.auth;
}

/** The signed-in member's shop: every tenant query takes its id from here, never from the request. */
export function requireShop(req: Request): AuthContext & { shop: ShopRow; membership: MembershipRow } {
  const auth = requireAuth(req);
  if (!auth.shop || !auth.membership) throw new DomainError('forbidden', 'This needs a shop account.');
  return auth as AuthContext & { shop: ShopRow; membership: MembershipRow };
}

const WRITES = new Set<Action>(['create', 'update', 'delete', 'invite', 'assign', 'take', 'transition', 'upload', 'upload_revision', 'refund', 'approve']);

function deny(auth: AuthContext, action: Action): never {
  if (auth.actor.shopReadOnly && WRITES.has(action)) {
    throw new DomainError('shop_read_only', 'This shop is read-only for now: you can read and download, but not change anything.');
  }
  throw new DomainError('forbidden', 'Your role does not allow this.');
}

/** Class-level check: may this user do `action` on some `subject`? */
export function authorize(auth: AuthContext, action: Action, subject: SubjectName): void {
  if (!auth.ability.can(action, subject)) deny(auth, action);
}

/**
 * Row-level check. A row the user may not even read answers 404, exactly like a row of another shop,
 * so ids leak nothing; a readable row with a forbidden action answers 403.
 */
export function authorizeRow(
  auth: AuthContext,
  action: Action,
  subject: SubjectName,
  row: Record<string, unknown> | undefined,
  notFoundMessage = 'Not found.',
): asserts row is Record<string, unknown> {
  if (!row) throw new DomainError('not_found', notFoundMessage);
  const tagged = asSubject(subject, row);
  if (!auth.ability.can('read', tagged)) throw new DomainError('not_found', notFoundMessage);
  if (action !== 'read' && !auth.ability.can(action, tagged)) deny(auth, action);
}
