import { Router } from 'express';
import { publicStartSchema, publicVerifySchema } from '@revloop/contract';
import type { AppDeps } from '../../context';
import { parseInput } from '../../http/validate';
import { sessionCookie } from '../auth/session.service';
import { secureCookiesOf } from '../auth/start-session';
import { finishStartTune, publicShopView, requirePublicShop, startTune } from './public.service';

/** A shop's public page and its "Start a tune" flow: no sign-in; app.ts throttles the two POSTs like sign-up. */
export function createPublicRouter(deps: AppDeps): Router {
  const router = Router();

  router.get('/shops/:slug', async (req, res) => {
    const shop = await requirePublicShop(deps, req.params.slug);
    res.json({ data: await publicShopView(deps, shop) });
  });

  router.post('/shops/:slug/start', async (req, res) => {
    const shop = await requirePublicShop(deps, req.params.slug);
    const input = parseInput(publicStartSchema, req.body);
    const { email } = await startTune(deps, shop, input);
    res.status(202).json({ data: { sent: true, email } });
  });

  // The link's token names the sign-up and its shop; the slug in the path is only the address it was sent from.
  router.post('/shops/:slug/verify', async (req, res) => {
    const { token } = parseInput(publicVerifySchema, req.body);
    const { sessionToken, expiresAt, jobId } = await finishStartTune(deps, token);
    res.append('Set-Cookie', sessionCookie(sessionToken, expiresAt, secureCookiesOf(deps.env)));
    res.status(201).json({ data: { jobId } });
  });

  return router;
}
