import { describe, expect, it } from 'vitest';
import { newId, nowIso } from '../ids';
import { twoShops } from '../testing/two-shops';
import { findVehicle, insertVehicle, listVehicles, updateVehicle } from './vehicle.repository';

describe('vehicle repository', () => {
  it('never reads, lists or changes another shop’s vehicle', async () => {
    const { db, shopA, shopB, ownerB } = await twoShops();
    const at = nowIso();
    const vehicle = await insertVehicle(db, { id: newId(), shop_id: shopB, owner_user_id: ownerB, vin: '1M8GDM9AXKP042788', model_year: 1989, description: 'Coupe', spec: '{}', created_at: at, updated_at: at });
    expect(await findVehicle(db, shopA, vehicle.id)).toBeUndefined();
    expect(await listVehicles(db, shopA, { kind: 'shop' })).toEqual([]);
    expect(await updateVehicle(db, shopA, vehicle.id, { vin: 'X', model_year: 2000, description: 'x', spec: '{}', updated_at: at })).toBeUndefined();
    expect((await findVehicle(db, shopB, vehicle.id))?.description).toBe('Coupe');
    expect(await listVehicles(db, shopB, { kind: 'owner', userId: 'someone-else' })).toEqual([]);
  });
});
