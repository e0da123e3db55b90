import { describe, expect, it } from 'vitest';
import { DEFAULT_THROTTLE, SignInThrottle } from './sign-in-throttle';

const setup = () => {
  let t = 1_000_000;
  const throttle = new SignInThrottle(DEFAULT_THROTTLE, () => t);
  return { throttle, advance: (ms: number) => (t += ms) };
};
const IP = '203.0.113.50';

describe('SignInThrottle', () => {
  it('counts an attempt before its password is checked: 40 begun at once, 5 let through', () => {
    const { throttle } = setup();
    const attempts = Array.from({ length: 40 }, () => throttle.begin('a@x.test', IP));
    expect(attempts.filter((a) => a.retryAfter === 0)).toHaveLength(DEFAULT_THROTTLE.perAccountIp);
  });

  it('takes a successful attempt back, so signing in never uses up the address', () => {
    const { throttle } = setup();
    for (let i = 0; i < 500; i++) {
      const attempt = throttle.begin(`user${i % 50}@x.test`, IP);
      expect(attempt.retryAfter).toBe(0);
      attempt.succeeded();
    }
  });

  it('after 100 failures the address waits for every browser it does not know; a known browser keeps 5 tries', () => {
    const { throttle, advance } = setup();
    const device = throttle.deviceToken('owner@x.test');
    for (let i = 0; i < DEFAULT_THROTTLE.perIp; i++) expect(throttle.begin(`spray${i}@x.test`, IP).retryAfter).toBe(0);
    expect(throttle.begin('fresh@x.test', IP).retryAfter).toBeGreaterThan(0);
    expect(throttle.begin('owner@x.test', IP).retryAfter).toBeGreaterThan(0);
    expect(throttle.begin('owner@x.test', IP, 'forged.c2lnbmF0dXJl').retryAfter).toBeGreaterThan(0);
    expect(throttle.begin('other@x.test', IP, device).retryAfter).toBeGreaterThan(0);
    for (let i = 0; i < DEFAULT_THROTTLE.perDevice; i++) expect(throttle.begin('owner@x.test', IP, device).retryAfter).toBe(0);
    expect(throttle.begin('owner@x.test', IP, device).retryAfter).toBeGreaterThan(0);
    advance(DEFAULT_THROTTLE.windowMs + 1);
    expect(throttle.begin('fresh@x.test', IP).retryAfter).toBe(0);
  });
});
