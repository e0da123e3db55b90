import { sha256 } from '@oslojs/crypto/sha2';
import { encodeBase32LowerCaseNoPadding, encodeHexLowerCase } from '@oslojs/encoding';
import { randomBytes } from 'node:crypto';
import {
  deleteSession,
  deleteUserSessions,
  extendSession,
  insertSession,
  type Db,
  type SessionRow,
} from '@revloop/db';

/** Session handling after Lucia's current guide: a random secret in the cookie, only its SHA-256 in the table. */
export const SESSION_COOKIE = 'revloop_session';
const DAY_MS = 86_400_000;

export interface SessionPolicy {
  idleDays: number;
  absoluteDays: number;
}

export const generateToken = (): string => encodeBase32LowerCaseNoPadding(randomBytes(32));
export const hashToken = (token: string): string => encodeHexLowerCase(sha256(new TextEncoder().encode(token)));

export async function createSession(
  db: Db,
  policy: SessionPolicy,
  userId: string,
  shopId: string | null,
  now: Date,
): Promise<{ token: string; session: SessionRow }> {
  const token = generateToken();
  const t = now.getTime();
  const session: SessionRow = {
    id: hashToken(token),
    user_id: userId,
    shop_id: shopId,
    created_at: t,
    expires_at: t + policy.idleDays * DAY_MS,
    absolute_expires_at: t + policy.absoluteDays * DAY_MS,
  };
  await insertSession(db, session);
  return { token, session };
}

/** Ends an expired session, or slides a live one's idle expiry forward once half of it has passed. */
export async function checkSession(
  db: Db,
  policy: SessionPolicy,
  session: SessionRow,
  now: Date,
): Promise<{ session: SessionRow; renewed: boolean } | null> {
  const t = now.getTime();
  if (t >= session.expires_at || t >= session.absolute_expires_at) {
    await deleteSession(db, session.id);
    return null;
  }
  const idleMs = policy.idleDays * DAY_MS;
  if (session.expires_at - t < idleMs / 2) {
    const expiresAt = Math.min(t + idleMs, session.absolute_expires_at);
    if (expiresAt > session.expires_at) {
      await extendSession(db, session.id, expiresAt);
      return { session: { ...session, expires_at: expiresAt }, renewed: true };
    }
  }
  return { session, renewed: false };
}

export const invalidateSession = (db: Db, id: string) => deleteSession(db, id);
export const invalidateUserSessions = (db: Db, userId: string, shopId?: string) => deleteUserSessions(db, userId, shopId);

export function sessionCookie(token: string, expiresAt: number, secure: boolean): string {
  const parts = [
    `${SESSION_COOKIE}=${token}`,
    'Path=/',
    'HttpOnly',
    'SameSite=Lax',
    `Expires=${new Date(expiresAt).toUTCString()}`,
  ];
  if (secure) parts.push('Secure');
  return parts.join('; ');
}

export const DEVICE_COOKIE = 'revloop_device';

/** Marks a browser that signed in before; sent only to the auth routes, where the sign-in throttle reads it. */
export function deviceCookie(value: string, secure: boolean): string {
  return `${DEVICE_COOKIE}=${value}; Path=/api/auth; HttpOnly; SameSite=Lax; Max-Age=${180 * 86_400}${secure ? '; Secure' : ''}`;
}

export function clearSessionCookie(secure: boolean): string {
  return `${SESSION_COOKIE}=; Path=/; HttpOnly; SameSite=Lax; Max-Age=0${secure ? '; Secure' : ''}`;
}
