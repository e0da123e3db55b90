import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createPlatformAdmin, createTwoShops } from '../../testing/factories';
import { createTestApp, signIn, type TestApp } from '../../testing/test-app';

let t: TestApp;
beforeEach(async () => {
  t = await createTestApp();
});
afterEach(async () => {
  await t.close();
});

describe('the development mailbox', () => {
  it('answers 404 to everyone but a signed-in platform admin, and nobody else can wipe it', async () => {
    const { people, other } = await createTwoShops(t);
    const platformAdmin = await createPlatformAdmin(t);
    await request(t.app).post('/api/auth/password-reset').send({ email: people.owner.email });
    await expect.poll(() => t.mailbox.list().length).toBeGreaterThan(0);
    const anonymous = await request(t.app).get('/api/dev/mailbox');
    expect(anonymous.status).toBe(404);
    expect(JSON.stringify(anonymous.body)).not.toMatch(/reset-password/);
    expect((await request(t.app).delete('/api/dev/mailbox')).status).toBe(404);
    for (const { email } of [people.owner, people.tuner, people.dealer, people.customer, other.owner]) {
      const agent = await signIn(t.app, email);
      expect((await agent.get('/api/dev/mailbox')).status).toBe(404);
      expect((await agent.delete('/api/dev/mailbox')).status).toBe(404);
    }
    expect(t.mailbox.list().length).toBeGreaterThan(0);

    const admin = await signIn(t.app, platformAdmin.email);
    const read = await admin.get('/api/dev/mailbox');
    expect(read.status).toBe(200);
    expect(read.body.data.some((m: { to: string }) => m.to.includes(people.owner.email))).toBe(true);
    expect((await admin.delete('/api/dev/mailbox')).status).toBe(204);
    expect(t.mailbox.list()).toEqual([]);
  });
});
