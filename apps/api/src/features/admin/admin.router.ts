import { Router } from 'express';
import type { PlatformShop, PlatformShopListItem } from '@revloop/contract';
import { findShopById, listShopsForPlatform, type ShopRow } from '@revloop/db';
import { DomainError } from '@revloop/domain';
import { emailSchema } from '@revloop/domain/auth';
import { z } from 'zod';
import type { AppDeps } from '../../context';
import { authorize, requireAuth } from '../../http/auth-context';
import { parseInput } from '../../http/validate';
import { platformRevenue } from '../billing/revenue.service';
import { nameSchema } from '@revloop/domain/text';
import { changeShopStatus, createShop } from './admin.service';

const createShopSchema = z.object({
  name: nameSchema(2, 80),
  ownerName: nameSchema(1, 80),
  ownerEmail: emailSchema,
  currency: z.string().length(3).toUpperCase().optional(),
});

const shopRowToShop = (r: ShopRow): PlatformShop => ({ id: r.id, name: r.name, status: r.status, currency: r.currency, createdAt: r.created_at, suspendedAt: r.suspended_at });

export function createAdminRouter(deps: AppDeps): Router {
  const router = Router();
  const { db } = deps;

  router.get('/shops', async (req, res) => {
    const auth = requireAuth(req);
    authorize(auth, 'manage', 'Platform');
    const rows = await listShopsForPlatform(db);
    res.json({
      data: rows.map((r): PlatformShopListItem => ({
        ...shopRowToShop(r),
        owner: r.owner_email ? { name: r.owner_name, email: r.owner_email } : null,
        memberCount: Number(r.member_count),
      })),
      meta: { total: rows.length },
    });
  });

  router.post('/shops', async (req, res) => {
    const auth = requireAuth(req);
    authorize(auth, 'create', 'Shop');
    const input = parseInput(createShopSchema, req.body);
    const shop = await createShop(deps, auth, input);
    res.status(201).json({ data: shopRowToShop(shop) });
  });

  for (const [path, status] of [
    ['suspend', 'suspended'],
    ['reactivate', 'active'],
  ] as const) {
    router.post(`/shops/:id/${path}`, async (req, res) => {
      const auth = requireAuth(req);
      authorize(auth, 'suspend', 'Shop');
      const shop = await findShopById(db, req.params.id);
      if (!shop) throw new DomainError('not_found', 'Shop not found.');
      const updated = await changeShopStatus(deps, auth, shop.id, status);
      res.json({ data: shopRowToShop(updated!) });
    });
  }

  // The platform's subscription revenue, from billing's revenue service.
  router.get('/revenue', async (req, res) => {
    const auth = requireAuth(req);
    authorize(auth, 'manage', 'Platform');
    res.json({ data: await platformRevenue(deps) });
  });

  return router;
}
