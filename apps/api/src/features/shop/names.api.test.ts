import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createPlatformAdmin, createShop } from '../../testing/factories';
import { createTestApp, signIn, type TestApp } from '../../testing/test-app';
import { TEST_VEHICLE } from '../../testing/test-vehicle';

let t: TestApp;
beforeEach(async () => {
  t = await createTestApp();
});
afterEach(async () => {
  await t.close();
});

// NUL, CR/LF, and U+202E RIGHT-TO-LEFT OVERRIDE (Unicode UAX #9; "Trojan Source", CVE-2021-42574) [STD][3P].
const BAD = { nul: 'Dana\u0000Whitfield', crlf: 'Dana\r\nBcc: x@evil.test', rlo: 'Garage\u202Egpj.exe', lrm: 'Dana\u200eWhitfield' };

describe('names refuse control and text-direction characters with a clear 400', () => {
  const expectRefused = (res: request.Response) => {
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation');
    expect(res.body.error.message).toMatch(/control characters .* text-direction marks/);
  };

  it('people: sign-up and own name; shops: sign-up and rename', async () => {
    for (const bad of Object.values(BAD)) {
      expectRefused(await request(t.app).post('/api/auth/sign-up').send({ shopName: 'Bench Co', name: bad, email: 'x@bench.test', password: 'long-enough-pass' }));
      expectRefused(await request(t.app).post('/api/auth/sign-up').send({ shopName: bad, name: 'Ari', email: 'x@bench.test', password: 'long-enough-pass' }));
    }
    const owner = await signIn(t.app, (await createShop(t)).owner.email);
    for (const bad of Object.values(BAD)) {
      expectRefused(await owner.patch('/api/me').send({ name: bad }));
      expectRefused(await owner.patch('/api/shop').send({ name: bad }));
    }
    expect((await owner.patch('/api/me').send({ name: 'Zoë O’Brien' })).status).toBe(200);
  });

  it('dealers, packages, vehicles and shops created by the platform', async () => {
    const owner = await signIn(t.app, (await createShop(t)).owner.email);
    expectRefused(await owner.post('/api/dealers').send({ name: BAD.rlo, contactName: 'Sam', contactEmail: 'sam@x.test' }));
    expectRefused(await owner.post('/api/dealers').send({ name: 'Ridge Two', contactName: BAD.crlf, contactEmail: 'sam@x.test' }));
    expectRefused(await owner.post('/api/packages').send({ name: BAD.nul, description: '', modules: ['ECM'], retailPriceMinor: 19900, dealerPriceMinor: 14900, roundsIncluded: 2 }));
    expectRefused(await owner.post('/api/vehicles').send({ vehicle: { ...TEST_VEHICLE, description: BAD.rlo } }));
    expectRefused(await owner.post('/api/vehicles').send({ vehicle: { ...TEST_VEHICLE, engine: { ...TEST_VEHICLE.engine, family: BAD.lrm } } }));
    const admin = await signIn(t.app, (await createPlatformAdmin(t)).email);
    expectRefused(await admin.post('/api/admin/shops').send({ name: BAD.rlo, ownerName: 'Kim Ode', ownerEmail: 'kim@summit.test' }));
    expectRefused(await admin.post('/api/admin/shops').send({ name: 'Summit', ownerName: BAD.nul, ownerEmail: 'kim@summit.test' }));
  });
});
