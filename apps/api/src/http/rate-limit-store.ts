import type { ClientRateLimitInfo, IncrementResponse, Options, Store } from 'express-rate-limit';
import { decrementRateLimit, findRateLimit, incrementRateLimit, resetRateLimit, type Db } from '@revloop/db';

/**
 * express-rate-limit's counters in the database (rate_limit_counters), so every API instance counts the same
 * requests. Fixed windows like the library's own memory store; one upsert per request.
 */
export class DbRateLimitStore implements Store {
  private windowMs = 60_000;
  readonly localKeys = false;

  constructor(
    private readonly db: Db,
    readonly prefix: string,
    private readonly now: () => number = Date.now,
  ) {}

  init(options: Options): void {
    this.windowMs = options.windowMs;
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const row = await findRateLimit(this.db, this.prefix + key);
    if (!row || row.resetAtMs <= this.now()) return undefined;
    return { totalHits: row.hits, resetTime: new Date(row.resetAtMs) };
  }

  async increment(key: string): Promise<IncrementResponse> {
    const row = await incrementRateLimit(this.db, this.prefix + key, this.now(), this.windowMs);
    return { totalHits: row.hits, resetTime: new Date(row.resetAtMs) };
  }

  async decrement(key: string): Promise<void> {
    await decrementRateLimit(this.db, this.prefix + key);
  }

  async resetKey(key: string): Promise<void> {
    await resetRateLimit(this.db, this.prefix + key);
  }
}
