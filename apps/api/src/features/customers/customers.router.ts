import { Router } from 'express';
import { listMembers } from '@revloop/db';
import { DomainError } from '@revloop/domain';
import type { AppDeps } from '../../context';
import { authorize, requireShop } from '../../http/auth-context';

/** Customers of the shop for pickers and the dealer portal: a dealer sees only its own. */
export function createCustomersRouter({ db }: AppDeps): Router {
  const router = Router();
  router.get('/', async (req, res) => {
    const auth = requireShop(req);
    authorize(auth, 'read', 'Customer');
    if (auth.actor.role === 'dealer' && !auth.actor.dealerId) throw new DomainError('forbidden', 'No dealer account.');
    const rows = await listMembers(db, auth.shop.id, { role: 'customer', ...(auth.actor.role === 'dealer' && { dealerId: auth.actor.dealerId! }) });
    res.json({
      data: rows
        .filter((r) => r.status === 'active')
        .map((r) => ({ id: r.user_id, name: r.name, email: r.email, dealer: r.dealer_id ? { id: r.dealer_id, name: r.dealer_name } : null, since: r.created_at })),
      meta: { total: rows.length },
    });
  });
  return router;
}
