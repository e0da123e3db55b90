import { Router } from 'express';
import { findUserByEmail } from '@revloop/db';
import { DomainError } from '@revloop/domain';
import { resetConfirmSchema, resetRequestSchema, signInSchema, signUpSchema } from '@revloop/domain/auth';
import type { AppDeps } from '../../context';
import { requireAuth } from '../../http/auth-context';
import { readCookie } from '../../http/cookies';
import { parseInput } from '../../http/validate';
import { passwordResetMail, welcomeMail } from '../mail/mail-templates';
import { finishPasswordReset, markSignedIn, signInShopId, signUpShop, startPasswordReset } from './auth.service';
import { verifyPassword } from './password';
import { clearSessionCookie, DEVICE_COOKIE, deviceCookie, invalidateSession } from './session.service';
import { secureCookiesOf, startSession } from './start-session';

export function createAuthRouter(deps: AppDeps): Router {
  const router = Router();
  const { db, clock, env, mailer, throttle } = deps;
  const secure = secureCookiesOf(env);

  router.post('/sign-up', async (req, res) => {
    const input = parseInput(signUpSchema, req.body);
    const { user, shopId } = await signUpShop(deps, input);
    await mailer.send(welcomeMail(user.email, { shopName: input.shopName, url: env.APP_ORIGIN }));
    await startSession(deps, req, res, user.id, shopId, 201);
  });

  router.post('/sign-in', async (req, res) => {
    const input = parseInput(signInSchema, req.body);
    const attempt = await throttle.begin(input.email, req.ip ?? 'unknown', readCookie(req.headers.cookie, DEVICE_COOKIE));
    const wait = attempt.retryAfter;
    if (wait > 0) {
      res.set('Retry-After', String(wait));
      throw new DomainError('rate_limited', `Too many sign-in attempts. Try again in ${wait} seconds.`, { retryAfter: wait });
    }
    const user = await findUserByEmail(db, input.email);
    const ok = await verifyPassword(user?.password_hash ?? null, input.password);
    if (!user || !ok) throw new DomainError('unauthenticated', 'The e-mail or password is wrong.', { reason: 'invalid_credentials' });
    await attempt.succeeded();
    // This browser now has its own sign-in budget for the account (docs/decisions/002).
    res.append('Set-Cookie', deviceCookie(throttle.deviceToken(input.email), secure));
    const shopId = await signInShopId(db, user);
    await markSignedIn(db, user.id, clock.now());
    await startSession(deps, req, res, user.id, shopId, 200);
  });

  router.post('/sign-out', async (req, res) => {
    const auth = requireAuth(req);
    await invalidateSession(db, auth.sessionId);
    res.append('Set-Cookie', clearSessionCookie(secure));
    res.status(204).end();
  });

  router.post('/password-reset', async (req, res) => {
    const { email } = parseInput(resetRequestSchema, req.body);
    const started = await startPasswordReset(db, email, clock.now());
    if (started) {
      const url = `${env.APP_ORIGIN}/reset-password?token=${encodeURIComponent(started.token)}`;
      await mailer.send(passwordResetMail(started.user.email, { url, expiresAt: started.expiresAt }));
    }
    res.status(202).json({ data: { sent: true } });
  });

  router.post('/password-reset/confirm', async (req, res) => {
    const { token, password } = parseInput(resetConfirmSchema, req.body);
    await finishPasswordReset(db, token, password, clock.now());
    res.status(204).end();
  });

  return router;
}
