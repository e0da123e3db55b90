import { Router } from 'express';
import { updateShop } from '@revloop/db';
import { parseShopSettings, shopSettingsPatchSchema } from '@revloop/domain/shops';
import { z } from 'zod';
import type { AppDeps } from '../../context';
import { authorize, requireShop } from '../../http/auth-context';
import { parseInput } from '../../http/validate';
import { recordAudit } from '../audit/audit.service';
import { nameSchema } from '@revloop/domain/text';

const patchSchema = z.object({ name: nameSchema(2, 80).optional(), settings: shopSettingsPatchSchema.optional() });

export function createShopRouter({ db, clock }: AppDeps): Router {
  const router = Router();

  router.get('/', (req, res) => {
    const auth = requireShop(req);
    const { shop } = auth;
    res.json({ data: { id: shop.id, name: shop.name, currency: shop.currency, status: shop.status, readOnly: auth.actor.shopReadOnly, settings: parseShopSettings(shop.settings) } });
  });

  router.patch('/', async (req, res) => {
    const auth = requireShop(req);
    authorize(auth, 'update', 'ShopSettings');
    const input = parseInput(patchSchema, req.body);
    const settings = { ...parseShopSettings(auth.shop.settings), ...input.settings };
    const shop = (await updateShop(db, auth.shop.id, { ...(input.name && { name: input.name }), settings: JSON.stringify(settings) }))!;
    await recordAudit(db, { shopId: shop.id, actorUserId: auth.user.id, action: 'shop.settings_changed', subjectType: 'Shop', subjectId: shop.id, at: clock.now() });
    res.json({ data: { id: shop.id, name: shop.name, currency: shop.currency, status: shop.status, readOnly: auth.actor.shopReadOnly, settings } });
  });

  return router;
}
