import { createHmac, randomBytes, timingSafeEqual } from 'node:crypto';

/**
 * Sign-in throttling that stops guessing without locking an office out (docs/decisions/002):
 * - per account and address: a few failures block that pair;
 * - per account: many failures across addresses block only addresses that have themselves failed for it;
 * - per address: 30 failures block the accounts that failed from it; 100 block every browser it does not know;
 * - a browser that signed in to the account before (a signed device cookie) has its own small budget instead,
 *   so a colleague keeps working while someone guesses from the same office address.
 * An attempt counts before the password is checked, so a parallel burst gets at most the limit checked, and a
 * successful attempt is taken back. State lives in memory: one process serves the app (see docs/decisions).
 */
export interface ThrottleLimits {
  windowMs: number;
  /** Failures from one address after which every browser it does not know waits. */
  perIp: number;
  /** Failures from one address after which the accounts that failed from it wait there. */
  perIpFailedAccounts: number;
  perAccountIp: number;
  perAccount: number;
  /** Failures a known browser may make for its account. */
  perDevice: number;
}

export const DEFAULT_THROTTLE: ThrottleLimits = { windowMs: 15 * 60_000, perIp: 100, perIpFailedAccounts: 30, perAccountIp: 5, perAccount: 20, perDevice: 5 };

/** One counted sign-in attempt: refused (wait > 0, nothing counted) or let through and counted as a failure. */
export interface SignInAttempt {
  /** Seconds to wait before another attempt; 0 when this one may check the password. */
  retryAfter: number;
  /** Takes the attempt back after the password matched, and clears the failures of its pair or browser. */
  succeeded(): void;
}

export class SignInThrottle {
  private readonly failures = new Map<string, number[]>();
  // Device cookies are signed with a key of this process: after a restart they count as unknown until the next sign-in.
  private readonly deviceKey = randomBytes(32);

  constructor(
    private readonly limits: ThrottleLimits = DEFAULT_THROTTLE,
    private readonly now: () => number = Date.now,
  ) {}

  /** Checks and counts one attempt in a single synchronous step, so no parallel request slips between the two. */
  begin(account: string, ip: string, deviceToken?: string): SignInAttempt {
    const t = this.now();
    const device = deviceToken ? this.knownDevice(account, deviceToken) : null;
    const checks: Array<[string, number]> = [];
    if (device) {
      checks.push([`d:${account}|${device}`, this.limits.perDevice]);
    } else {
      const pairFailed = this.recent(`a:${account}|${ip}`, t).length > 0;
      checks.push([`i:${ip}`, this.limits.perIp], [`a:${account}|${ip}`, this.limits.perAccountIp]);
      if (pairFailed) checks.push([`i:${ip}`, this.limits.perIpFailedAccounts], [`a:${account}`, this.limits.perAccount]);
    }
    let wait = 0;
    for (const [key, limit] of checks) {
      const times = this.recent(key, t);
      if (times.length >= limit) wait = Math.max(wait, Math.ceil((times[times.length - limit]! + this.limits.windowMs - t) / 1000));
    }
    if (wait > 0) return { retryAfter: wait, succeeded: () => undefined };
    const keys = device ? [`d:${account}|${device}`] : [`i:${ip}`, `a:${account}|${ip}`, `a:${account}`];
    for (const key of keys) this.failures.set(key, [...this.recent(key, t), t]);
    return {
      retryAfter: 0,
      succeeded: () => {
        for (const key of keys) this.takeBack(key, t);
        this.failures.delete(keys[device ? 0 : 1]!);
      },
    };
  }

  /** A new device cookie value for a browser that has just signed in to `account`. */
  deviceToken(account: string): string {
    const id = randomBytes(16).toString('base64url');
    return `${id}.${this.deviceSignature(account, id).toString('base64url')}`;
  }

  private knownDevice(account: string, token: string): string | null {
    const [id, sig] = token.split('.');
    if (!id || !sig) return null;
    const expected = this.deviceSignature(account, id);
    const given = Buffer.from(sig, 'base64url');
    return given.length === expected.length && timingSafeEqual(given, expected) ? id : null;
  }

  private deviceSignature(account: string, id: string): Buffer {
    return createHmac('sha256', this.deviceKey).update(`sign-in-device:v1:${account}:${id}`).digest();
  }

  private takeBack(key: string, t: number): void {
    const times = this.failures.get(key);
    const at = times?.lastIndexOf(t) ?? -1;
    if (times && at >= 0) times.splice(at, 1);
  }

  private recent(key: string, t: number): number[] {
    const times = (this.failures.get(key) ?? []).filter((x) => x > t - this.limits.windowMs);
    if (times.length === 0) this.failures.delete(key);
    return times;
  }
}
