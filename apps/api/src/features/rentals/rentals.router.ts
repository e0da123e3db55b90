import { Router } from 'express';
import { listRentals } from '@revloop/db';
import { dayRangeQuerySchema, rentalCreateSchema, rentalListQuerySchema, rentalTermsSchema, rentalTransitionSchema } from '@revloop/contract';
import { rentalScopeFor } from '@revloop/domain/auth';
import { localDay } from '@revloop/domain/rentals';
import type { AppDeps } from '../../context';
import { authorize, requireShop } from '../../http/auth-context';
import { parseInput } from '../../http/validate';
import { startDepositCheckout, startFeeCheckout } from './rental-money';
import { rentalMoneyCsv } from './rental-money-export';
import { loadRental, shopRentalSettings } from './rental-records';
import { acceptTerms, createRental, moveRental, presentRental, summaryOf } from './rental.service';

export function createRentalsRouter(deps: AppDeps): Router {
  const router = Router();

  router.get('/', async (req, res) => {
    const auth = requireShop(req);
    authorize(auth, 'read', 'Rental');
    const filter = parseInput(rentalListQuerySchema, req.query);
    const rows = await listRentals(deps.db, auth.shop.id, rentalScopeFor(auth.actor), filter);
    const today = localDay(deps.clock.now(), shopRentalSettings(auth.shop.settings).timeZone);
    res.json({ data: rows.map((r) => summaryOf(r, today)), meta: { total: rows.length } });
  });

  router.post('/', async (req, res) => {
    const auth = requireShop(req);
    const row = await createRental(deps, auth, parseInput(rentalCreateSchema, req.body));
    res.status(201).json({ data: await presentRental(deps, auth, row) });
  });

  router.get('/money.csv', async (req, res) => {
    const auth = requireShop(req);
    const { csv, fileName } = await rentalMoneyCsv(deps, auth, parseInput(dayRangeQuerySchema, req.query));
    res.type('text/csv; charset=utf-8').attachment(fileName).send(csv);
  });

  router.get('/:id', async (req, res) => {
    const auth = requireShop(req);
    res.json({ data: await presentRental(deps, auth, await loadRental(deps.db, auth, req.params.id)) });
  });

  router.post('/:id/transitions', async (req, res) => {
    const auth = requireShop(req);
    const row = await moveRental(deps, auth, req.params.id, parseInput(rentalTransitionSchema, req.body));
    res.json({ data: await presentRental(deps, auth, row) });
  });

  router.post('/:id/terms', async (req, res) => {
    const auth = requireShop(req);
    parseInput(rentalTermsSchema, req.body);
    res.json({ data: await presentRental(deps, auth, await acceptTerms(deps, auth, req.params.id)) });
  });

  router.post('/:id/fee/checkout', async (req, res) => {
    const auth = requireShop(req);
    res.json({ data: await startFeeCheckout(deps, auth, req.params.id) });
  });

  router.post('/:id/deposit/checkout', async (req, res) => {
    const auth = requireShop(req);
    res.json({ data: await startDepositCheckout(deps, auth, req.params.id) });
  });

  return router;
}
