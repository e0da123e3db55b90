import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createMember, createShop } from '../../testing/factories';
import { createTestApp, signIn, type TestApp } from '../../testing/test-app';

let t: TestApp;
beforeEach(async () => {
  t = await createTestApp();
});
afterEach(async () => {
  await t.close();
});

describe('PATCH /api/me', () => {
  it('answers 400 when there is nothing to change (empty body or only unknown keys)', async () => {
    const tuner = await createMember(t, await createShop(t), 'tuner');
    const agent = await signIn(t.app, tuner.email);
    for (const body of [{}, { colour: 'red' }, { platformAdmin: true }]) {
      const res = await agent.patch('/api/me').send(body);
      expect(res.status).toBe(400);
      expect(res.body.error).toMatchObject({ code: 'validation', message: expect.stringMatching(/Nothing to change/) });
    }
    const ok = await agent.patch('/api/me').send({ unitSystem: 'imperial' });
    expect(ok.status).toBe(200);
  });
});
