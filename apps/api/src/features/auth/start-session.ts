import type { Request, Response } from 'express';
import { DomainError } from '@revloop/domain';
import type { AppDeps } from '../../context';
import { loadAuthContext } from '../../http/auth-context';
import { toMe } from '../me/me.service';
import { createSession, sessionCookie } from './session.service';

export const sessionPolicyOf = (env: AppDeps['env']) => ({ idleDays: env.SESSION_IDLE_DAYS, absoluteDays: env.SESSION_ABSOLUTE_DAYS });
export const secureCookiesOf = (env: AppDeps['env']) => env.APP_ORIGIN.startsWith('https:');

/** A new session id at every sign-in, so an old cookie never becomes a signed-in one; answers with `/api/me`. */
export async function startSession(
  deps: AppDeps,
  req: Request,
  res: Response,
  userId: string,
  shopId: string | null,
  status: number,
): Promise<void> {
  const { token, session } = await createSession(deps.db, sessionPolicyOf(deps.env), userId, shopId, deps.clock.now());
  res.append('Set-Cookie', sessionCookie(token, session.expires_at, secureCookiesOf(deps.env)));
  const auth = await loadAuthContext(deps.db, session.id, userId, shopId);
  if (!auth) throw new DomainError('unauthenticated', 'Please sign in.');
  req.auth = auth;
  res.status(status).json(await toMe(deps.db, auth));
}
