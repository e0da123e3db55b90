import { Router } from 'express';
import { isSlugTaken, updateShop, type ShopRow } from '@revloop/db';
import { shopFrontDoorPatchSchema } from '@revloop/contract';
import { DomainError } from '@revloop/domain';
import { parseShopSettings, shopSettingsPatchSchema } from '@revloop/domain/shops';
import { z } from 'zod';
import type { AppDeps } from '../../context';
import { authorize, requireShop, type AuthContext } from '../../http/auth-context';
import { parseInput } from '../../http/validate';
import { recordAudit } from '../audit/audit.service';
import { nameSchema } from '@revloop/domain/text';
import { shopSetup } from './shop-setup.service';

const patchSchema = z.object({ name: nameSchema(2, 80).optional(), settings: shopSettingsPatchSchema.optional() }).extend(shopFrontDoorPatchSchema.shape);

const shopView = (shop: ShopRow, auth: AuthContext) => ({
  id: shop.id,
  name: shop.name,
  currency: shop.currency,
  status: shop.status,
  readOnly: auth.actor.shopReadOnly,
  settings: parseShopSettings(shop.settings),
  slug: shop.slug,
  description: shop.description,
  publicPage: shop.public_page === 1,
});

export function createShopRouter({ db, clock }: AppDeps): Router {
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
    const clash = () => new DomainError('conflict', `Another shop already uses the address /s/${slug}. Choose another.`);
    if (slug !== null && slug !== auth.shop.slug && (await isSlugTaken(db, slug, auth.shop.id))) throw clash();
    const shop = await updateShop(db, auth.shop.id, {
      ...(input.name && { name: input.name }),
      settings: JSON.stringify(settings),
      slug,
      public_page: publicPage ? 1 : 0,
      ...(input.description !== undefined && { description: input.description }),
    }).catch((error: unknown) => {
      // Two owners taking the same address at once: the unique index decides, and the loser hears the same 409.
      if (error instanceof Error && /UNIQUE|unique/.test(error.message) && /slug/.test(error.message)) throw clash();
      throw error;
    });
    if (!shop) throw new DomainError('not_found', 'Shop not found.');
    await recordAudit(db, { shopId: shop.id, actorUserId: auth.user.id, action: 'shop.settings_changed', subjectType: 'Shop', subjectId: shop.id, at: clock.now() });
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
