import { Router } from 'express';
import type { Dealer, DealerDetail, DealerListItem } from '@revloop/contract';
import { countJobs, dealerBalance, findDealer, listDealers, listMembers, type DealerRow } from '@revloop/db';
import { asSubject, emailSchema, jobScopeFor } from '@revloop/domain/auth';
import { z } from 'zod';
import type { AppDeps } from '../../context';
import { authorize, authorizeRow, requireShop } from '../../http/auth-context';
import { parseInput } from '../../http/validate';
import { dealerLedger, dealerStatementCsv } from '../billing/ledger.service';
import { nameSchema } from '@revloop/domain/text';
import { createDealer } from './dealers.service';

const dealerInputSchema = z.object({
  name: nameSchema(2, 100),
  contactName: nameSchema(1, 100),
  contactEmail: emailSchema,
  phone: z.string().trim().max(40).nullish(),
});

const dealerRowToDealer = (r: DealerRow): Dealer => ({
  id: r.id,
  name: r.name,
  contactName: r.contact_name,
  contactEmail: r.contact_email,
  phone: r.phone,
  createdAt: r.created_at,
});

export function createDealersRouter(deps: AppDeps): Router {
  const router = Router();
  const { db } = deps;

  router.get('/', async (req, res) => {
    const auth = requireShop(req);
    authorize(auth, 'read', 'Dealer');
    const rows = (await listDealers(db, auth.shop.id)).filter((r) =>
      auth.ability.can('read', asSubject('Dealer', { id: r.id, shopId: r.shop_id })),
    );
    res.json({
      data: rows.map((r): DealerListItem => ({ ...dealerRowToDealer(r), userCount: Number(r.user_count), customerCount: Number(r.customer_count) })),
      meta: { total: rows.length },
    });
  });

  router.post('/', async (req, res) => {
    const auth = requireShop(req);
    authorize(auth, 'create', 'Dealer');
    const input = parseInput(dealerInputSchema, req.body);
    const dealer = await createDealer(deps, auth, input);
    res.status(201).json({ data: dealerRowToDealer(dealer) });
  });

  router.get('/:id', async (req, res) => {
    const auth = requireShop(req);
    const dealer = await findDealer(db, auth.shop.id, req.params.id);
    authorizeRow(auth, 'read', 'Dealer', dealer && { id: dealer.id, shopId: dealer.shop_id });
    const users = await listMembers(db, auth.shop.id, { role: 'dealer', dealerId: dealer!.id });
    const scope = jobScopeFor(auth.actor);
    const canReadLedger = auth.ability.can('read', asSubject('Ledger', { shopId: auth.shop.id, dealerId: dealer!.id }));
    res.json({
      data: {
        ...dealerRowToDealer(dealer!),
        users: users.map((u) => ({ id: u.id, name: u.name, email: u.email, status: u.status })),
        // The statement itself is GET /api/dealers/:id/ledger; the jobs are GET /api/jobs?dealer=:id.
        balance: canReadLedger ? { balanceMinor: await dealerBalance(db, auth.shop.id, dealer!.id), currency: auth.shop.currency } : null,
        jobs: {
          open: await countJobs(db, auth.shop.id, scope, { dealerId: dealer!.id, open: true }),
          total: await countJobs(db, auth.shop.id, scope, { dealerId: dealer!.id }),
        },
      } satisfies DealerDetail,
    });
  });

  // The dealer's prepaid-balance statement, from billing's ledger service (JSON, or CSV with ?format=csv).
  router.get('/:dealerId/ledger', async (req, res) => {
    const auth = requireShop(req);
    if (req.query.format === 'csv') {
      const { fileName, csv } = await dealerStatementCsv(deps, auth, req.params.dealerId);
      res.type('text/csv; charset=utf-8').attachment(fileName).send(csv);
      return;
    }
    res.json({ data: await dealerLedger(deps, auth, req.params.dealerId) });
  });

  return router;
}
