import type { Selectable } from 'kysely';

export interface SharedSecretTable {
  name: string;
  value: string;
  created_at: string;
}

/** One counted sign-in attempt under one throttle key (address, account, pair or known browser). */
export interface ThrottleHitTable {
  id: string;
  key: string;
  at_ms: number;
}

/** express-rate-limit's fixed-window counter for one client key. */
export interface RateLimitCounterTable {
  key: string;
  hits: number;
  reset_at_ms: number;
}

/** How far a piece of running work has got (0–1), readable by every instance. */
export interface WorkProgressTable {
  key: string;
  fraction: number;
  updated_at: string;
}

export type QueueJobState = 'queued' | 'running' | 'done' | 'failed';

export interface QueueJobTable {
  id: string;
  queue: string;
  key: string;
  payload: string;
  state: QueueJobState;
  attempts: number;
  max_attempts: number;
  run_after: string;
  /** While running: the claim lapses at this time and another worker may take the job over. */
  lease_until: string | null;
  locked_by: string | null;
  last_error: string | null;
  created_at: string;
  updated_at: string;
}
export type QueueJobRow = Selectable<QueueJobTable>;
