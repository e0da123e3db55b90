import type { Db } from '../client';
import { newId, nowIso } from '../ids';
import { insertJob } from '../jobs/job.repository';
import type { JobRow } from '../jobs/job.table';
import { insertPackage } from '../packages/package.repository';
import { insertShop } from '../shops/shop.repository';
import { insertMembership, insertUser } from '../users/user.repository';
import { insertVehicle } from '../vehicles/vehicle.repository';
import { createTestDb } from './postgres';

/** A fresh database (in-memory SQLite, or PostgreSQL in db-pg) with two shops, each with one owner: the fixture for tenant-isolation tests. */
export async function twoShops(): Promise<{ db: Db; shopA: string; shopB: string; ownerA: string; ownerB: string }> {
  const db = await createTestDb();
  const at = nowIso();
  const [shopA, shopB] = [newId(), newId()];
  await insertShop(db, { id: shopA, name: 'Shop A', created_at: at });
  await insertShop(db, { id: shopB, name: 'Shop B', created_at: at });
  const ownerA = (await insertUser(db, { id: newId(), email: 'a@example.test', name: 'A', created_at: at })).id;
  const ownerB = (await insertUser(db, { id: newId(), email: 'b@example.test', name: 'B', created_at: at })).id;
  await insertMembership(db, { id: newId(), shop_id: shopA, user_id: ownerA, role: 'owner', created_at: at });
  await insertMembership(db, { id: newId(), shop_id: shopB, user_id: ownerB, role: 'owner', created_at: at });
  return { db, shopA, shopB, ownerA, ownerB };
}

export interface TestJobOptions {
  number?: number;
  state?: JobRow['state'];
  tunerId?: string | null;
  goals?: string;
  /** The package's retail price in minor units (its dealer price is 80 % of it). */
  priceMinor?: number;
}

/**
 * A job in `shopId` with its own vehicle and package (the least a job row needs), for repository tests that read jobs
 * raw. Jobs of the API's tests are made by the intake route instead (apps/api/src/testing/factories.ts).
 */
export async function jobIn(db: Db, shopId: string, customerId: string, options: TestJobOptions = {}) {
  const at = nowIso();
  const number = options.number ?? 1001;
  const priceMinor = options.priceMinor ?? 50000;
  const vehicle = await insertVehicle(db, { id: newId(), shop_id: shopId, owner_user_id: customerId, vin: '1M8GDM9AXKP042788', model_year: 1989, description: 'Test coupe', spec: '{}', created_at: at, updated_at: at });
  const pkg = await insertPackage(db, { id: newId(), shop_id: shopId, name: `Stage ${number}`, modules: '["ECM"]', retail_price_minor: priceMinor, dealer_price_minor: Math.round(priceMinor * 0.8), rounds_included: 3, created_at: at });
  return insertJob(db, {
    id: newId(),
    shop_id: shopId,
    number,
    vehicle_id: vehicle.id,
    customer_user_id: customerId,
    package_id: pkg.id,
    assigned_tuner_id: options.tunerId ?? null,
    state: options.state ?? 'ready',
    goals: options.goals ?? 'More power',
    log_request: '{}',
    cautions_accepted_at: at,
    state_changed_at: at,
    created_at: at,
    updated_at: at,
  });
}
