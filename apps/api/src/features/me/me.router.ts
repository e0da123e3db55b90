import { Router } from 'express';
import { z } from 'zod';
import type { AppDeps } from '../../context';
import { loadAuthContext, requireAuth } from '../../http/auth-context';
import { parseInput } from '../../http/validate';
import { outsideShopScope } from '@revloop/db';
import { toMe, updateMe } from './me.service';
import { nameSchema } from '@revloop/domain/text';

const updateMeSchema = z.object({
  name: nameSchema(1, 80).optional(),
  unitSystem: z.enum(['metric', 'imperial']).optional(),
}).refine((input) => input.name !== undefined || input.unitSystem !== undefined, 'Nothing to change: send "name" or "unitSystem".');

export function createMeRouter({ db }: AppDeps): Router {
  const router = Router();

  router.get('/', async (req, res) => {
    res.json(await toMe(db, requireAuth(req)));
  });

  // The web app's start-up probe: signed out is an expected answer there, so it is a 200 with null, not a 401.
  router.get('/session', async (req, res) => {
    res.json({ data: req.auth ? await toMe(db, req.auth) : null });
  });

  router.patch('/', async (req, res) => {
    const auth = requireAuth(req);
    const input = parseInput(updateMeSchema, req.body);
    // Unscoped: the person's name shows on the jobs of every shop they belong to, whose job lists it marks changed.
    await outsideShopScope(db, () => updateMe(db, auth.user.id, input));
    const fresh = await loadAuthContext(db, auth.sessionId, auth.user.id, auth.shop?.id ?? null);
    res.json(await toMe(db, fresh ?? auth));
  });

  return router;
}
