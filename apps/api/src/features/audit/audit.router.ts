import { Router } from 'express';
import { listAuditEvents } from '@revloop/db';
import { z } from 'zod';
import type { AppDeps } from '../../context';
import { authorize, requireShop } from '../../http/auth-context';
import { parseInput } from '../../http/validate';

const querySchema = z.object({ limit: z.coerce.number().int().min(1).max(500).default(100) });

export function createAuditRouter({ db }: AppDeps): Router {
  const router = Router();
  router.get('/', async (req, res) => {
    const auth = requireShop(req);
    authorize(auth, 'read', 'AuditEvent');
    const { limit } = parseInput(querySchema, req.query);
    const rows = await listAuditEvents(db, auth.shop.id, { limit });
    res.json({
      data: rows.map((r) => ({
        id: r.id,
        at: r.created_at,
        actor: r.actor_user_id ? { id: r.actor_user_id, name: r.actor_name } : null,
        action: r.action,
        subjectType: r.subject_type,
        subjectId: r.subject_id,
        details: JSON.parse(r.details) as unknown,
      })),
      meta: { total: rows.length },
    });
  });
  return router;
}
