import { Router } from 'express';
import type { ShopRow } from '@revloop/db';
import { shopFrontDoorPatchSchema, shopPaymentLockPatchSchema, shopRevisionReviewPatchSchema, type Shop } from '@revloop/contract';
import { DomainError } from '@revloop/domain';
import { parseShopSettings, shopSettingsPatchSchema } from '@revloop/domain/shops';
import { z } from 'zod';
import type { AppDeps } from '../../context';
import { authorize, requireShop, type AuthContext } from '../../http/auth-context';
import { parseInput } from '../../http/validate';
import { nameSchema } from '@revloop/domain/text';
import { shopSetup } from './shop-setup.service';
import { changeShop } from './shop.service';

const patchSchema = z.object({ name: nameSchema(2, 80).optional(), settings: shopSettingsPatchSchema.optional() }).extend(shopFrontDoorPatchSchema.shape).extend(shopRevisionReviewPatchSchema.shape).extend(shopPaymentLockPatchSchema.shape);

const shopView = (shop: ShopRow, auth: AuthContext): Shop => ({
  id: shop.id,
  name: shop.name,
  currency: shop.currency,
  status: shop.status,
  readOnly: auth.actor.shopReadOnly,
  settings: parseShopSettings(shop.settings),
  slug: shop.slug,
  description: shop.description,
  publicPage: shop.public_page === 1,
  revisionApproval: shop.revision_approval === 1,
  paidBeforeDownload: shop.paid_before_download === 1,
});

export function createShopRouter(deps: AppDeps): Router {
  const { db, clock } = deps;
  const router = Router();

  router.get('/', (req, res) => {
    const auth = requireShop(req);
    res.json({ data: shopView(auth.shop, auth) });
  });

  router.patch('/', async (req, res) => {
    const auth = requireShop(req);
    authorize(auth, 'update', 'ShopSettings');
    const input = parseInput(patchSchema, req.body);
    const settings = { ...parseShopSettings(auth.shop.settings), ...input.settings };
    const slug = input.slug === undefined ? auth.shop.slug : input.slug;
    const publicPage = slug !== null && (input.publicPage ?? auth.shop.public_page === 1);
    if (input.publicPage && slug === null) throw new DomainError('validation', 'Choose the page address before turning the public page on.');
    const shop = await changeShop(deps, auth, { name: input.name, settings, slug, publicPage, description: input.description, revisionApproval: input.revisionApproval, paidBeforeDownload: input.paidBeforeDownload });
    res.json({ data: shopView(shop, auth) });
  });

  router.get('/setup', async (req, res) => {
    const auth = requireShop(req);
    // The checklist is for whoever may see the shop's settings (the owner), read-only shops included.
    authorize(auth, 'read', 'ShopSettings');
    res.json({ data: await shopSetup(db, auth.shop, clock.now()) });
  });

  return router;
}
