import { createHmac, randomBytes, timingSafeEqual } from 'node:crypto';
import { clearThrottleKey, deleteThrottleHits, inTransaction, lockKeys, pruneThrottleHits, recordThrottleHits, throttleHitTimes, type Db } from '@revloop/db';

/**
 * Sign-in throttling that stops guessing without locking an office out (docs/decisions/002):
 * - per account and address: a few failures block that pair;
 * - per account: many failures across addresses block only addresses that have themselves failed for it;
 * - per address: 30 failures block the accounts that failed from it; 100 block every browser it does not know;
 * - a browser that signed in to the account before (a signed device cookie) has its own small budget instead,
 *   so a colleague keeps working while someone guesses from the same office address.
 * An attempt counts before the password is checked, so a parallel burst gets at most the limit checked, and a
 * successful attempt is taken back. Attempts are rows in the database (throttle_hits), so every API instance counts
 * the attempts made on all of them, and the device-cookie key is a shared secret (docs/decisions/014).
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
  succeeded(): Promise<void>;
}

export class SignInThrottle {
  private readonly deviceKey: Buffer;

  /** `deviceKey` signs the device cookies; every instance must share it (server.ts reads it from shared_secrets). */
  constructor(
    private readonly db: Db,
    options: { deviceKey?: string | Buffer; limits?: ThrottleLimits; now?: () => number } = {},
  ) {
    this.deviceKey = options.deviceKey === undefined ? randomBytes(32) : Buffer.from(options.deviceKey);
    this.limits = options.limits ?? DEFAULT_THROTTLE;
    this.now = options.now ?? Date.now;
  }

  private readonly limits: ThrottleLimits;
  private readonly now: () => number;

  /**
   * Checks and counts one attempt in one transaction. The attempt's rows are written first, which takes the write
   * lock (SQLite) or the keys' advisory locks (PostgreSQL), so no parallel attempt on any instance slips between the
   * check and the count; a refused attempt's rows are removed again.
   */
  begin(account: string, ip: string, deviceToken?: string): Promise<SignInAttempt> {
    const t = this.now();
    const since = t - this.limits.windowMs;
    const device = deviceToken ? this.knownDevice(account, deviceToken) : null;
    const keys = device ? [`d:${account}|${device}`] : [`i:${ip}`, `a:${account}|${ip}`, `a:${account}`];
    return inTransaction(this.db, async (trx) => {
      await lockKeys(trx, keys);
      const mine = await recordThrottleHits(trx, keys, t);
      const checks: Array<[string, number]> = [];
      if (device) {
        checks.push([`d:${account}|${device}`, this.limits.perDevice]);
      } else {
        const pairFailed = (await throttleHitTimes(trx, `a:${account}|${ip}`, since, mine)).length > 0;
        checks.push([`i:${ip}`, this.limits.perIp], [`a:${account}|${ip}`, this.limits.perAccountIp]);
        if (pairFailed) checks.push([`i:${ip}`, this.limits.perIpFailedAccounts], [`a:${account}`, this.limits.perAccount]);
      }
      let wait = 0;
      for (const [key, limit] of checks) {
        const times = await throttleHitTimes(trx, key, since, mine);
        if (times.length >= limit) wait = Math.max(wait, Math.ceil((times[times.length - limit]! + this.limits.windowMs - t) / 1000));
      }
      if (wait > 0) {
        await deleteThrottleHits(trx, mine);
        return { retryAfter: wait, succeeded: () => Promise.resolve() };
      }
      // Old hits no longer count anywhere; dropping them here keeps the table small without a sweeper.
      await pruneThrottleHits(trx, since);
      return {
        retryAfter: 0,
        succeeded: () =>
          inTransaction(this.db, async (inner) => {
            await deleteThrottleHits(inner, mine);
            await clearThrottleKey(inner, keys[device ? 0 : 1]!);
          }),
      };
    });
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
}
