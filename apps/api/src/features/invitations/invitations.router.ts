import { Router } from 'express';
import { findInvitation, listPendingInvitations, revokeInvitation } from '@revloop/db';
import { DomainError } from '@revloop/domain';
import { acceptInvitationSchema, emailSchema, SHOP_ROLES } from '@revloop/domain/auth';
import { z } from 'zod';
import type { AppDeps } from '../../context';
import { authorize, authorizeRow, requireShop } from '../../http/auth-context';
import { parseInput } from '../../http/validate';
import { recordAudit } from '../audit/audit.service';
import { startSession } from '../auth/start-session';
import { acceptInvitation, createInvitation, lookupInvitation } from './invitation.service';

const inviteSchema = z.object({
  email: emailSchema,
  role: z.enum(SHOP_ROLES),
  dealerId: z.string().min(1).nullish(),
});
const acceptSchema = acceptInvitationSchema.extend({ token: z.string().min(20).max(200) });

export function createInvitationsRouter(deps: AppDeps): Router {
  const router = Router();
  const { db, clock, env, mailer } = deps;

  router.get('/lookup/:token', async (req, res) => {
    const { view } = await lookupInvitation(db, req.params.token, clock.now());
    res.json({ data: view });
  });

  router.post('/accept', async (req, res) => {
    const { token, name, password } = parseInput(acceptSchema, req.body);
    const { userId, shopId, invitation } = await acceptInvitation(db, token, { name, password }, clock.now());
    await recordAudit(db, {
      shopId,
      actorUserId: userId,
      action: 'invitation.accepted',
      subjectType: 'Invitation',
      subjectId: invitation.id,
      details: { role: invitation.role },
      at: clock.now(),
    });
    await startSession(deps, req, res, userId, shopId, 200);
  });

  router.get('/', async (req, res) => {
    const auth = requireShop(req);
    authorize(auth, 'read', 'Invitation');
    const rows = await listPendingInvitations(db, auth.shop.id, clock.now().toISOString());
    res.json({
      data: rows.map((r) => ({
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
    const invitation = await createInvitation(
      db,
      mailer,
      env.APP_ORIGIN,
      { shopId: auth.shop.id, email: input.email, role: input.role, dealerId: input.dealerId, invitedBy: auth.user },
      clock.now(),
    );
    await recordAudit(db, {
      shopId: auth.shop.id,
      actorUserId: auth.user.id,
      action: 'invitation.sent',
      subjectType: 'Invitation',
      subjectId: invitation.id,
      details: { email: invitation.email, role: invitation.role },
      at: clock.now(),
    });
    res.status(201).json({
      data: { id: invitation.id, email: invitation.email, role: invitation.role, expiresAt: invitation.expires_at },
    });
  });

  router.delete('/:id', async (req, res) => {
    const auth = requireShop(req);
    const row = await findInvitation(db, auth.shop.id, req.params.id);
    authorizeRow(auth, 'delete', 'Invitation', row && { shopId: row.shop_id });
    if (!(await revokeInvitation(db, auth.shop.id, req.params.id, clock.now().toISOString()))) {
      throw new DomainError('conflict', 'This invitation was already used or revoked.');
    }
    await recordAudit(db, { shopId: auth.shop.id, actorUserId: auth.user.id, action: 'invitation.revoked', subjectType: 'Invitation', subjectId: req.params.id, at: clock.now() });
    res.status(204).end();
  });

  return router;
}
