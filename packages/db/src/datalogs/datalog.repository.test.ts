import { describe, expect, it } from 'vitest';
import { newId, nowIso } from '../ids';
import { insertJob } from '../jobs/job.repository';
import { insertPackage } from '../packages/package.repository';
import { twoShops } from '../testing/two-shops';
import { insertVehicle } from '../vehicles/vehicle.repository';
import { findDatalog, findDatalogMapping, insertDatalog, listJobDatalogs, saveDatalogMapping, updateDatalog } from './datalog.repository';

async function logIn(db: Awaited<ReturnType<typeof twoShops>>['db'], shopId: string, userId: string) {
  const at = nowIso();
  const vehicle = await insertVehicle(db, { id: newId(), shop_id: shopId, owner_user_id: userId, vin: '1M8GDM9AXKP042788', model_year: 1989, description: 'Test coupe', spec: '{}', created_at: at, updated_at: at });
  const pkg = await insertPackage(db, { id: newId(), shop_id: shopId, name: 'Stage', modules: '["ECM"]', retail_price_minor: 1, dealer_price_minor: 1, rounds_included: 3, created_at: at });
  const job = await insertJob(db, {
    id: newId(),
    shop_id: shopId,
    number: 1001,
    vehicle_id: vehicle.id,
    customer_user_id: userId,
    package_id: pkg.id,
    assigned_tuner_id: null,
    state: 'with_customer',
    goals: 'More power',
    log_request: '{}',
    cautions_accepted_at: at,
    state_changed_at: at,
    created_at: at,
    updated_at: at,
  });
  const log = await insertDatalog(db, {
    id: newId(),
    shop_id: shopId,
    job_id: job.id,
    round: 1,
    original_name: 'drive.csv',
    sha256: 'a'.repeat(64),
    size_bytes: 10,
    header_signature: 'hdr1-0000000000000000',
    mapping: '{"headers":[],"overrides":{}}',
    fuel: '{"kind":"gasoline"}',
    status: 'processing',
    uploaded_by: userId,
    created_at: at,
  });
  return { job, log };
}

describe('datalog repository', () => {
  it('reads, lists and updates only the shop’s own logs', async () => {
    const { db, shopA, shopB, ownerB } = await twoShops();
    const { job, log } = await logIn(db, shopB, ownerB);
    expect(await findDatalog(db, shopA, log.id)).toBeUndefined();
    expect(await listJobDatalogs(db, shopA, job.id)).toEqual([]);
    expect(await updateDatalog(db, shopA, log.id, { status: 'failed' })).toBeUndefined();
    expect((await findDatalog(db, shopB, log.id))?.status).toBe('processing');
    const listed = await listJobDatalogs(db, shopB, job.id);
    expect(listed.map((l) => [l.id, l.uploaded_by_name])).toEqual([[log.id, 'B']]);
  });

  it('remembers one mapping per shop and header set, and never shows it to another shop', async () => {
    const { db, shopA, shopB } = await twoShops();
    const signature = 'hdr1-00000000000000ff';
    await saveDatalogMapping(db, { shop_id: shopB, header_signature: signature, mapping: '{"rpm":"A"}', updated_at: nowIso() });
    await saveDatalogMapping(db, { shop_id: shopB, header_signature: signature, mapping: '{"rpm":"B"}', updated_at: nowIso() });
    expect((await findDatalogMapping(db, shopB, signature))?.mapping).toBe('{"rpm":"B"}');
    expect(await findDatalogMapping(db, shopA, signature)).toBeUndefined();
  });
});
