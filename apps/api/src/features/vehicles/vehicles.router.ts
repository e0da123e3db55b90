import type { Vehicle } from '@revloop/contract';
import { Router } from 'express';
import { findMembershipOfUser, findVehicle, listVehicles, type VehicleListRow, type VehicleScope } from '@revloop/db';
import { DomainError } from '@revloop/domain';
import type { Actor } from '@revloop/domain/auth';
import { checkVin, parseTyreSize, rollingCircumference, speedTable, stoichAfr, vehicleFuelSpec, vehicleInputSchema, type VehicleInput } from '@revloop/domain/vehicles';
import { z } from 'zod';
import type { AppDeps } from '../../context';
import { authorize, authorizeRow, requireShop } from '../../http/auth-context';
import { parseInput } from '../../http/validate';
import { vehicleHistory } from './vehicle-history.service';
import { createVehicle, editVehicle } from './vehicles.service';

const scopeOf = (actor: Actor): VehicleScope =>
  actor.role === 'customer' ? { kind: 'owner', userId: actor.userId } : actor.role === 'dealer' && actor.dealerId ? { kind: 'dealer', dealerId: actor.dealerId } : { kind: 'shop' };

const vehicleSubject = (row: VehicleListRow) => ({ shopId: row.shop_id, ownerUserId: row.owner_user_id, dealerId: row.dealer_id });

/** The vehicle with what its numbers mean: road speed per gear and the fuel's stoichiometric ratio. */
function vehicleRowToVehicle(row: VehicleListRow): Vehicle {
  const spec = JSON.parse(row.spec) as VehicleInput;
  let derived: Vehicle['derived'];
  try {
    const tyre = parseTyreSize(spec.tyreSize);
    const rolling = rollingCircumference(spec);
    derived = {
      tyreDiameterMm: tyre.diameterMm,
      tyreCircumferenceMm: tyre.circumferenceMm,
      rollingCircumferenceMm: rolling.circumferenceMm,
      circumferenceSource: rolling.source,
      stoichAfr: stoichAfr(vehicleFuelSpec(spec)),
      speeds: speedTable({ gearRatios: spec.transmission.gearRatios, finalDrive: spec.finalDrive, tyreCircumferenceMm: rolling.circumferenceMm, revLimitRpm: spec.revLimitRpm }),
    };
  } catch {
    derived = null;
  }
  const vin = checkVin(row.vin);
  return {
    id: row.id,
    owner: { id: row.owner_user_id, name: row.owner_name, email: row.owner_email },
    dealerId: row.dealer_id,
    vin: row.vin,
    vinRegion: vin.region,
    vinWarnings: vin.warnings,
    modelYear: row.model_year,
    description: row.description,
    spec,
    derived,
    createdAt: row.created_at,
  };
}

const createSchema = z.object({ ownerUserId: z.string().min(1).optional(), vehicle: vehicleInputSchema });

export function createVehiclesRouter(deps: AppDeps): Router {
  const { db } = deps;
  const router = Router();

  router.get('/', async (req, res) => {
    const auth = requireShop(req);
    authorize(auth, 'read', 'Vehicle');
    const owner = typeof req.query.owner === 'string' ? req.query.owner : undefined;
    const rows = await listVehicles(db, auth.shop.id, scopeOf(auth.actor), owner);
    res.json({ data: rows.map(vehicleRowToVehicle), meta: { total: rows.length } });
  });

  router.get('/:id', async (req, res) => {
    const auth = requireShop(req);
    const row = await findVehicle(db, auth.shop.id, req.params.id);
    authorizeRow(auth, 'read', 'Vehicle', row && vehicleSubject(row));
    res.json({ data: vehicleRowToVehicle(row!) });
  });

  router.get('/:id/history', async (req, res) => {
    const auth = requireShop(req);
    const row = await findVehicle(db, auth.shop.id, req.params.id);
    authorizeRow(auth, 'read', 'Vehicle', row && vehicleSubject(row), 'Vehicle not found.');
    res.json({ data: await vehicleHistory(db, auth, row!.id) });
  });

  router.post('/', async (req, res) => {
    const auth = requireShop(req);
    const { ownerUserId, vehicle } = parseInput(createSchema, req.body);
    const owner = auth.actor.role === 'customer' ? auth.user.id : ownerUserId;
    if (!owner) throw new DomainError('validation', 'Choose the customer who owns the vehicle.');
    const membership = await findMembershipOfUser(db, auth.shop.id, owner);
    if (!membership || membership.role !== 'customer') throw new DomainError('validation', 'The owner must be a customer of this shop.');
    authorizeRow(auth, 'create', 'Vehicle', { shopId: auth.shop.id, ownerUserId: owner, dealerId: membership.dealer_id });
    const id = await createVehicle(deps, auth, { userId: owner, dealerId: membership.dealer_id }, vehicle);
    res.status(201).json({ data: vehicleRowToVehicle((await findVehicle(db, auth.shop.id, id))!) });
  });

  router.put('/:id', async (req, res) => {
    const auth = requireShop(req);
    const row = await findVehicle(db, auth.shop.id, req.params.id);
    authorizeRow(auth, 'update', 'Vehicle', row && vehicleSubject(row));
    const vehicle = parseInput(vehicleInputSchema, req.body);
    await editVehicle(deps, auth.shop.id, row!.id, vehicle);
    res.json({ data: vehicleRowToVehicle((await findVehicle(db, auth.shop.id, row!.id))!) });
  });

  return router;
}
