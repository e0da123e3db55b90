import { Router } from 'express';
import type { Invitation, SentInvitation } from '@revloop/contract';
import { findInvitation, listPendingInvitations, outsideShopScope } from '@revloop/db';
import { acceptInvitationSchema, emailSchema, SHOP_ROLES } from '@revloop/domain/auth';
import { z } from 'zod';
import type { AppDeps } from '../../context';
import { authorize, authorizeRow, requireShop } from '../../http/auth-context';
import { parseInput } from '../../http/validate';
import { startSession } from '../auth/start-session';
import { acceptInvitation, lookupInvitation, sendInvitation, withdrawInvitation } from './invitation.service';

const inviteSchema = z.object({
  email: emailSchema,
  role: z.enum(SHOP_ROLES),
  dealerId: z.string().min(1).nullish(),
});
const acceptSchema = acceptInvitationSchema.extend({ token: z.string().min(20).max(200) });

export function createInvitationsRouter(deps: AppDeps): Router {
  const router = Router();
  const { db, clock } = deps;

  // Unscoped: the invitation is to its own shop, which need not be the shop the person is signed in to now.
  router.get('/lookup/:token', async (req, res) => {
    const { view } = await outsideShopScope(db, () => lookupInvitation(db, req.params.token, clock.now()));
    res.json({ data: view });
  });

  router.post('/accept', async (req, res) => {
    const { token, name, password } = parseInput(acceptSchema, req.body);
    await outsideShopScope(db, async () => {
      const { userId, shopId } = await acceptInvitation(deps, token, { name, password });
      await startSession(deps, req, res, userId, shopId, 200);
    });
  });

  router.get('/', async (req, res) => {
    const auth = requireShop(req);
    authorize(auth, 'read', 'Invitation');
    const rows = await listPendingInvitations(db, auth.shop.id, clock.now().toISOString());
    res.json({
      data: rows.map((r): Invitation => ({
        id: r.id,
        email: r.email,
        role: r.role,
        dealer: r.dealer_id ? { id: r.dealer_id, name: r.dealer_name } : null,
        createdAt: r.created_at,
        expiresAt: r.expires_at,
      })),
      meta: { total: rows.length },
    });
  });

  router.post('/', async (req, res) => {
    const auth = requireShop(req);
    authorize(auth, 'create', 'Invitation');
    const input = parseInput(inviteSchema, req.body);
    const invitation = await sendInvitation(deps, { shopId: auth.shop.id, email: input.email, role: input.role, dealerId: input.dealerId, invitedBy: auth.user });
    res.status(201).json({
      data: { id: invitation.id, email: invitation.email, role: invitation.role, expiresAt: invitation.expires_at } satisfies SentInvitation,
    });
  });

  router.delete('/:id', async (req, res) => {
    const auth = requireShop(req);
    const row = await findInvitation(db, auth.shop.id, req.params.id);
    authorizeRow(auth, 'delete', 'Invitation', row && { shopId: row.shop_id });
    await withdrawInvitation(deps, auth.shop.id, auth.user.id, req.params.id);
    res.status(204).end();
  });

  return router;
}
