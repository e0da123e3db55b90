import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { NOT_ENCODED_WARNING } from '@revloop/domain/vehicles';
import { createCustomer, createPackage, createShop, createVehicle, type TestMember, type TestShop } from '../../testing/factories';
import { createTestApp, signIn, type TestApp } from '../../testing/test-app';
import { TEST_VEHICLE } from '../../testing/test-vehicle';
import { datalogVehicleOf } from '../datalogs/datalog.service';

let t: TestApp;
let shop: TestShop;
let customerOfShop: TestMember;
beforeEach(async () => {
  t = await createTestApp();
  shop = await createShop(t);
  customerOfShop = await createCustomer(t, shop);
});
afterEach(async () => {
  await t.close();
});

// One 1.00 gear and a 3.15 final drive, so the REFERENCES.md road-speed case applies [CALC].
const ONE_GEAR = { ...TEST_VEHICLE, transmission: { type: 'manual', gearRatios: [1.0] }, finalDrive: 3.15 };

const columnOf = async (id: string) =>
  (await t.db.selectFrom('vehicles').select('rolling_circumference_mm').where('id', '=', id).executeTakeFirstOrThrow()).rolling_circumference_mm;

describe('measured rolling circumference', () => {
  it('drives the speeds when given, and the tyre size again when cleared', async () => {
    const customer = await signIn(t.app, customerOfShop.email);
    const created = await customer.post('/api/vehicles').send({ vehicle: { ...ONE_GEAR, rollingCircumferenceMm: 2150 } });
    expect(created.status).toBe(201);
    const v = created.body.data;
    expect(v.spec.rollingCircumferenceMm).toBe(2150);
    expect(v.derived).toMatchObject({ rollingCircumferenceMm: 2150, circumferenceSource: 'measured' });
    // the size's own circumference is still shown: C = π·704.0 = 2211.7 mm [CALC]
    expect(v.derived.tyreCircumferenceMm).toBeCloseTo(2211.7, 1);
    // 3000·2.150·60 / (1000·1.00·3.15) = 122.857 km/h [CALC]
    expect(v.derived.speeds[0].kmhPer1000Rpm * 3).toBeCloseTo(122.857, 3);
    expect(await columnOf(v.id)).toBe(2150);

    const cleared = await customer.put(`/api/vehicles/${v.id}`).send({ ...v.spec, rollingCircumferenceMm: null });
    expect(cleared.status).toBe(200);
    expect(cleared.body.data.derived).toMatchObject({ circumferenceSource: 'tyre_size' });
    // back to REFERENCES.md "road speed": 3000 rpm → 126.38 km/h [CALC]
    expect(cleared.body.data.derived.speeds[0].kmhPer1000Rpm * 3).toBeCloseTo(126.38, 2);
    expect(await columnOf(v.id)).toBeNull();

    const measuredAgain = await customer.put(`/api/vehicles/${v.id}`).send({ ...v.spec, rollingCircumferenceMm: 2160 });
    expect((await customer.get(`/api/vehicles/${v.id}`)).body.data.derived.rollingCircumferenceMm).toBe(2160);
    expect(measuredAgain.status).toBe(200);
  });

  it('refuses a measurement far from the tyre size and keeps the old value', async () => {
    await createVehicle(t, customerOfShop);
    const owner = await signIn(t.app, shop.owner.email);
    const v = (await owner.get('/api/vehicles')).body.data[0];
    // 1000 mm is far below any 10 % band around a car tyre's circumference [CALC]
    const res = await owner.put(`/api/vehicles/${v.id}`).send({ ...v.spec, rollingCircumferenceMm: 1000 });
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({ code: 'validation', message: expect.stringMatching(/loaded tyre rolls only a few percent short/) });
    expect(await columnOf(v.id)).toBeNull();
  });

  it('opens a job with a measured circumference from the intake and hands it to the datalog analysis', async () => {
    const customer = await signIn(t.app, customerOfShop.email);
    await createPackage(t, shop);
    const me = (await customer.get('/api/me')).body;
    const packageId = (await customer.get('/api/packages')).body.data[0].id;
    const res = await customer.post('/api/jobs').send({
      customer: { kind: 'existing', customerUserId: me.user.id },
      vehicle: { kind: 'new', vehicle: { ...TEST_VEHICLE, rollingCircumferenceMm: 2150 } },
      packageId,
      goals: 'More torque.',
      cautionsAccepted: true,
    });
    expect(res.status).toBe(201);
    const vehicleId = (await t.db.selectFrom('jobs').select('vehicle_id').where('id', '=', res.body.data.id).executeTakeFirstOrThrow()).vehicle_id;
    expect(await columnOf(vehicleId)).toBe(2150);
    const spec = (await customer.get(`/api/vehicles/${vehicleId}`)).body.data.spec;
    expect(datalogVehicleOf(spec)).toMatchObject({ tyreSize: '245/40R20', rollingCircumferenceMm: 2150 });
  });
});

describe('VINs from outside North America', () => {
  // Synthetic VIN built to the ISO 3779 layout (European WMI, fillers ZZZ and Z), not a real vehicle [CALC].
  const EUROPEAN_VIN = 'WVWZZZ1KZ6W000001';

  it('are kept with a warning and the model year the user gave, without a check-digit confirmation', async () => {
    const customer = await signIn(t.app, customerOfShop.email);
    const res = await customer.post('/api/vehicles').send({ vehicle: { ...TEST_VEHICLE, vin: EUROPEAN_VIN, modelYear: 2006 } });
    expect(res.status).toBe(201);
    expect(res.body.data).toMatchObject({ vin: EUROPEAN_VIN, modelYear: 2006, vinRegion: 'europe', vinWarnings: [NOT_ENCODED_WARNING] });
    expect(res.body.data.spec.vinCheckDigitOverride).toBe(false);
  });

  it('a North American VIN still needs its check digit, or a confirmation [3P]', async () => {
    const customer = await signIn(t.app, customerOfShop.email);
    // 1M8GDM9A?KP042788 → X, so 1 is wrong (widely reproduced example [3P])
    const wrong = await customer.post('/api/vehicles').send({ vehicle: { ...TEST_VEHICLE, vin: '1M8GDM9A1KP042788' } });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.message).toMatch(/Confirm to keep it/);
    const ok = await customer.post('/api/vehicles').send({ vehicle: TEST_VEHICLE });
    expect(ok.body.data).toMatchObject({ vinRegion: 'north_america', vinWarnings: [], modelYear: 1989 });
  });
});
