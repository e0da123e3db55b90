import { describe, expect, it } from 'vitest';
import { createDb, migrateToLatest } from '@revloop/db';
import { DEFAULT_THROTTLE, SignInThrottle } from './sign-in-throttle';

const setup = async () => {
  let t = 1_000_000;
  const db = createDb(':memory:');
  await migrateToLatest(db);
  const throttle = new SignInThrottle(db, { limits: DEFAULT_THROTTLE, now: () => t });
  return { throttle, db, advance: (ms: number) => (t += ms) };
};
const IP = '203.0.113.50';

describe('SignInThrottle', () => {
  it('counts an attempt before its password is checked: 40 begun at once, 5 let through', async () => {
    const { throttle } = await setup();
    const attempts = await Promise.all(Array.from({ length: 40 }, () => throttle.begin('a@x.test', IP)));
    expect(attempts.filter((a) => a.retryAfter === 0)).toHaveLength(DEFAULT_THROTTLE.perAccountIp);
  });

  it('takes a successful attempt back, so signing in never uses up the address', async () => {
    const { throttle } = await setup();
    for (let i = 0; i < 500; i++) {
      const attempt = await throttle.begin(`user${i % 50}@x.test`, IP);
      expect(attempt.retryAfter).toBe(0);
      await attempt.succeeded();
    }
  });

  it('after 100 failures the address waits for every browser it does not know; a known browser keeps 5 tries', async () => {
    const { throttle, advance } = await setup();
    const device = throttle.deviceToken('owner@x.test');
    for (let i = 0; i < DEFAULT_THROTTLE.perIp; i++) expect((await throttle.begin(`spray${i}@x.test`, IP)).retryAfter).toBe(0);
    expect((await throttle.begin('fresh@x.test', IP)).retryAfter).toBeGreaterThan(0);
    expect((await throttle.begin('owner@x.test', IP)).retryAfter).toBeGreaterThan(0);
    expect((await throttle.begin('owner@x.test', IP, 'forged.c2lnbmF0dXJl')).retryAfter).toBeGreaterThan(0);
    expect((await throttle.begin('other@x.test', IP, device)).retryAfter).toBeGreaterThan(0);
    for (let i = 0; i < DEFAULT_THROTTLE.perDevice; i++) expect((await throttle.begin('owner@x.test', IP, device)).retryAfter).toBe(0);
    expect((await throttle.begin('owner@x.test', IP, device)).retryAfter).toBeGreaterThan(0);
    advance(DEFAULT_THROTTLE.windowMs + 1);
    expect((await throttle.begin('fresh@x.test', IP)).retryAfter).toBe(0);
  });
});
