import { Router } from 'express';
import { listKits } from '@revloop/db';
import { dayRangeQuerySchema, kitCreateSchema, kitPatchSchema } from '@revloop/contract';
import type { AppDeps } from '../../context';
import { authorize, requireShop } from '../../http/auth-context';
import { parseInput } from '../../http/validate';
import { createKit, kitCalendar, kitDetail, kitOverview, patchKit, presentKit } from './kit.service';

export function createKitsRouter(deps: AppDeps): Router {
  const router = Router();

  router.get('/', async (req, res) => {
    const auth = requireShop(req);
    authorize(auth, 'read', 'Kit');
    const rows = await listKits(deps.db, auth.shop.id, { includeRetired: auth.ability.can('book', 'Rental') });
    res.json({ data: rows.map((r) => presentKit(r, auth.shop.currency)), meta: { total: rows.length } });
  });

  router.post('/', async (req, res) => {
    const auth = requireShop(req);
    const row = await createKit(deps, auth, parseInput(kitCreateSchema, req.body));
    res.status(201).json({ data: presentKit(row, auth.shop.currency) });
  });

  router.get('/overview', async (req, res) => {
    const auth = requireShop(req);
    res.json({ data: await kitOverview(deps, auth, parseInput(dayRangeQuerySchema, req.query)) });
  });

  router.get('/:id', async (req, res) => {
    const auth = requireShop(req);
    res.json({ data: await kitDetail(deps, auth, req.params.id) });
  });

  router.patch('/:id', async (req, res) => {
    const auth = requireShop(req);
    const row = await patchKit(deps, auth, req.params.id, parseInput(kitPatchSchema, req.body));
    res.json({ data: presentKit(row, auth.shop.currency) });
  });

  router.get('/:id/bookings', async (req, res) => {
    const auth = requireShop(req);
    res.json({ data: await kitCalendar(deps, auth, req.params.id, parseInput(dayRangeQuerySchema, req.query)) });
  });

  return router;
}
