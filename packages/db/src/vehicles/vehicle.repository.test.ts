import { describe, expect, it } from 'vitest';
import { newId, nowIso } from '../ids';
import { twoShops } from '../testing/two-shops';
import { findVehicle, insertVehicle, listVehicles, updateVehicle, vehicleColumns } from './vehicle.repository';

describe('vehicle repository', () => {
  it('never reads, lists or changes another shop’s vehicle', async () => {
    const { db, shopA, shopB, ownerB } = await twoShops();
    const at = nowIso();
    const vehicle = await insertVehicle(db, { id: newId(), shop_id: shopB, owner_user_id: ownerB, vin: '1M8GDM9AXKP042788', model_year: 1989, description: 'Coupe', spec: '{}', created_at: at, updated_at: at });
    expect(await findVehicle(db, shopA, vehicle.id)).toBeUndefined();
    expect(await listVehicles(db, shopA, { kind: 'shop' })).toEqual([]);
    expect(await updateVehicle(db, shopA, vehicle.id, { vin: 'X', model_year: 2000, description: 'x', spec: '{}', rolling_circumference_mm: 2000, updated_at: at })).toBeUndefined();
    expect((await findVehicle(db, shopB, vehicle.id))?.description).toBe('Coupe');
    expect(await listVehicles(db, shopB, { kind: 'owner', userId: 'someone-else' })).toEqual([]);
  });

  it('keeps a measured rolling circumference beside the spec, and clears it', async () => {
    const { db, shopB, ownerB } = await twoShops();
    const at = nowIso();
    const spec = { vin: '1M8GDM9AXKP042788', modelYear: 1989, description: 'Coupe', tyreSize: '245/40R20', rollingCircumferenceMm: 2150 } as Parameters<typeof vehicleColumns>[0];
    const vehicle = await insertVehicle(db, { id: newId(), shop_id: shopB, owner_user_id: ownerB, ...vehicleColumns(spec), created_at: at, updated_at: at });
    expect((await findVehicle(db, shopB, vehicle.id))?.rolling_circumference_mm).toBe(2150);
    expect(JSON.parse(vehicle.spec).rollingCircumferenceMm).toBe(2150);
    await updateVehicle(db, shopB, vehicle.id, { ...vehicleColumns({ ...spec, rollingCircumferenceMm: undefined }), updated_at: at });
    expect((await findVehicle(db, shopB, vehicle.id))?.rolling_circumference_mm).toBeNull();
  });
});
