import { Router } from 'express';
import { findShopById, insertShop, listShopsForPlatform, newId, setShopStatus, type ShopRow } from '@revloop/db';
import { DomainError } from '@revloop/domain';
import { emailSchema } from '@revloop/domain/auth';
import { z } from 'zod';
import type { AppDeps } from '../../context';
import { authorize, requireAuth } from '../../http/auth-context';
import { parseInput } from '../../http/validate';
import { recordAudit } from '../audit/audit.service';
import { platformRevenue } from '../billing/revenue.service';
import { createInvitation } from '../invitations/invitation.service';
import { nameSchema } from '@revloop/domain/text';

const createShopSchema = z.object({
  name: nameSchema(2, 80),
  ownerName: nameSchema(1, 80),
  ownerEmail: emailSchema,
  currency: z.string().length(3).toUpperCase().optional(),
});

const shopRowToShop = (r: ShopRow) => ({ id: r.id, name: r.name, status: r.status, currency: r.currency, createdAt: r.created_at, suspendedAt: r.suspended_at });

export function createAdminRouter(deps: AppDeps): Router {
  const router = Router();
  const { db, clock, env, mailer } = deps;

  router.get('/shops', async (req, res) => {
    const auth = requireAuth(req);
    authorize(auth, 'manage', 'Platform');
    const rows = await listShopsForPlatform(db);
    res.json({
      data: rows.map((r) => ({
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
    const shop = await insertShop(db, {
      id: newId(),
      name: input.name,
      currency: input.currency ?? 'USD',
      created_at: clock.now().toISOString(),
    });
    await createInvitation(db, mailer, env.APP_ORIGIN, { shopId: shop.id, email: input.ownerEmail, role: 'owner', invitedBy: null }, clock.now());
    await recordAudit(db, {
      shopId: shop.id,
      actorUserId: auth.user.id,
      action: 'shop.created',
      subjectType: 'Shop',
      subjectId: shop.id,
      details: { ownerEmail: input.ownerEmail, ownerName: input.ownerName },
      at: clock.now(),
    });
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
      const updated = await setShopStatus(db, shop.id, status, clock.now().toISOString());
      await recordAudit(db, { shopId: shop.id, actorUserId: auth.user.id, action: `shop.${status}`, subjectType: 'Shop', subjectId: shop.id, at: clock.now() });
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
