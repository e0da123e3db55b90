import { Router } from 'express';
import type { Package } from '@revloop/contract';
import { findPackage, listPackages, type PackageRow } from '@revloop/db';
import { packageInputSchema, type PackageModule } from '@revloop/domain/jobs';
import { z } from 'zod';
import type { AppDeps } from '../../context';
import { authorize, authorizeRow, requireShop } from '../../http/auth-context';
import { parseInput } from '../../http/validate';
import { createPackage, editPackage, setPackageActive } from './packages.service';

/** Dealers see their wholesale price; customers never see it. */
function packageRowToPackage(row: PackageRow, role: string | null): Package {
  return {
    id: row.id,
    name: row.name,
    description: row.description,
    modules: JSON.parse(row.modules) as PackageModule[],
    retailPriceMinor: row.retail_price_minor,
    dealerPriceMinor: role === 'customer' ? null : row.dealer_price_minor,
    roundsIncluded: row.rounds_included,
    active: row.active === 1,
    createdAt: row.created_at,
  };
}

const patchSchema = z.object({ active: z.boolean() });

export function createPackagesRouter(deps: AppDeps): Router {
  const { db } = deps;
  const router = Router();

  router.get('/', async (req, res) => {
    const auth = requireShop(req);
    authorize(auth, 'read', 'Package');
    const rows = await listPackages(db, auth.shop.id, { activeOnly: auth.actor.role !== 'owner' });
    res.json({ data: rows.map((r) => packageRowToPackage(r, auth.actor.role)), meta: { total: rows.length, currency: auth.shop.currency } });
  });

  router.post('/', async (req, res) => {
    const auth = requireShop(req);
    authorize(auth, 'create', 'Package');
    const input = parseInput(packageInputSchema, req.body);
    const row = await createPackage(deps, auth, input);
    res.status(201).json({ data: packageRowToPackage(row, auth.actor.role) });
  });

  router.put('/:id', async (req, res) => {
    const auth = requireShop(req);
    const row = await findPackage(db, auth.shop.id, req.params.id);
    authorizeRow(auth, 'update', 'Package', row && { shopId: row.shop_id });
    const input = parseInput(packageInputSchema, req.body);
    const updated = await editPackage(deps, auth.shop.id, row!.id, input);
    res.json({ data: packageRowToPackage(updated!, auth.actor.role) });
  });

  router.patch('/:id', async (req, res) => {
    const auth = requireShop(req);
    const row = await findPackage(db, auth.shop.id, req.params.id);
    authorizeRow(auth, 'update', 'Package', row && { shopId: row.shop_id });
    const { active } = parseInput(patchSchema, req.body);
    const updated = await setPackageActive(deps, auth.shop.id, row!.id, active);
    res.json({ data: packageRowToPackage(updated!, auth.actor.role) });
  });

  return router;
}
