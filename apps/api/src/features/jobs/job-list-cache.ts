import { createHash } from 'node:crypto';

interface Entry {
  version: number;
  /** The answer holds from `from` (inclusive) to `until` (exclusive), epoch ms: its hours in state are time-bound. */
  from: number;
  until: number;
  body: Buffer;
  etag: string;
}

/**
 * Serialized job-list answers keyed by shop, viewer and query, each tagged with the shop's job list version (kept by
 * triggers in the database, so every API instance sees every write). A changed version or a moved clock misses;
 * the least recently used entry goes when the cap is reached, so memory stays bounded.
 */
export class JobListCache {
  private readonly entries = new Map<string, Entry>();

  constructor(private readonly maxEntries = 500) {}

  get(key: string, version: number, now: number): Entry | undefined {
    const entry = this.entries.get(key);
    if (!entry || entry.version !== version || now < entry.from || now >= entry.until) return undefined;
    // Map keeps insertion order: re-inserting marks the entry as the most recently used.
    this.entries.delete(key);
    this.entries.set(key, entry);
    return entry;
  }

  set(key: string, version: number, from: number, until: number, json: string): Entry {
    const body = Buffer.from(json);
    const entry = { version, from, until, body, etag: `W/"${createHash('sha1').update(body).digest('base64url')}"` };
    this.entries.delete(key);
    this.entries.set(key, entry);
    if (this.entries.size > this.maxEntries) this.entries.delete(this.entries.keys().next().value!);
    return entry;
  }

  get size(): number {
    return this.entries.size;
  }
}
