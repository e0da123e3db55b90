/**
 * Sign-in throttling without locking the real user out:
 * - per address: many failures from one IP block that IP for every account;
 * - per account and address: a few failures block that pair;
 * - per account: many failures across addresses block only addresses that have themselves failed
 *   for it, so the owner signing in from a clean address still gets through.
 * State lives in memory: one process serves the app (see docs/decisions).
 */
export interface ThrottleLimits {
  windowMs: number;
  perIp: number;
  perAccountIp: number;
  perAccount: number;
}

export const DEFAULT_THROTTLE: ThrottleLimits = { windowMs: 15 * 60_000, perIp: 30, perAccountIp: 5, perAccount: 20 };

export class SignInThrottle {
  private readonly failures = new Map<string, number[]>();

  constructor(
    private readonly limits: ThrottleLimits = DEFAULT_THROTTLE,
    private readonly now: () => number = Date.now,
  ) {}

  /** Seconds to wait before another attempt, or 0 when the attempt may go ahead. */
  retryAfter(account: string, ip: string): number {
    const t = this.now();
    const pair = this.recent(`a:${account}|${ip}`, t);
    const checks: Array<[number[], number]> = [
      [this.recent(`i:${ip}`, t), this.limits.perIp],
      [pair, this.limits.perAccountIp],
    ];
    if (pair.length > 0) checks.push([this.recent(`a:${account}`, t), this.limits.perAccount]);
    let wait = 0;
    for (const [times, limit] of checks) {
      if (times.length >= limit) {
        const oldest = times[times.length - limit]!;
        wait = Math.max(wait, Math.ceil((oldest + this.limits.windowMs - t) / 1000));
      }
    }
    return wait;
  }

  recordFailure(account: string, ip: string): void {
    const t = this.now();
    for (const key of [`i:${ip}`, `a:${account}|${ip}`, `a:${account}`]) {
      const times = this.recent(key, t);
      times.push(t);
      this.failures.set(key, times);
    }
  }

  recordSuccess(account: string, ip: string): void {
    this.failures.delete(`a:${account}|${ip}`);
  }

  private recent(key: string, t: number): number[] {
    const times = (this.failures.get(key) ?? []).filter((x) => x > t - this.limits.windowMs);
    if (times.length === 0) this.failures.delete(key);
    return times;
  }
}
