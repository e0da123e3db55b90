import type { ColumnType, Generated, Insertable, Selectable, Updateable } from 'kysely';
import type { JobState } from '@revloop/domain/jobs';

export interface JobTable {
  id: string;
  shop_id: string;
  /** Per-shop running number people use on the phone ("job 1042"). */
  number: number;
  vehicle_id: string;
  customer_user_id: string;
  dealer_id: string | null;
  package_id: string;
  assigned_tuner_id: string | null;
  state: JobState;
  held_from: JobState | null;
  round: Generated<number>;
  has_stock_read: Generated<number>;
  has_revision_for_round: Generated<number>;
  has_log_for_round: Generated<number>;
  /** Revision drafts of the coming round still waiting for a second person's approval (migration 013). */
  drafts_awaiting_approval: Generated<number>;
  /** The owner waived the paid-before-download lock for this job: when and who (migration 014); null while not waived. */
  payment_lock_waived_at: string | null;
  payment_lock_waived_by_user_id: string | null;
  goals: string;
  special_requests: Generated<string>;
  log_request: string;
  cautions_accepted_at: string;
  state_changed_at: string;
  created_by_user_id: string | null;
  created_at: string;
  updated_at: string;
  /** 1 while the job is in an open state; computed by SQLite from `state` (migration 006), never written. */
  is_open: ColumnType<number, never, never>;
}
export type JobRow = Selectable<JobTable>;
export type InsertableJobRow = Insertable<JobTable>;
export type UpdateableJobRow = Updateable<JobTable>;

export interface JobMessageTable {
  id: string;
  shop_id: string;
  job_id: string;
  author_user_id: string;
  body: string;
  created_at: string;
}
export type JobMessageRow = Selectable<JobMessageTable>;

/** How many jobs a shop has in each state, kept by triggers on `jobs` (migration 006). */
export interface JobStateCountTable {
  shop_id: string;
  state: JobState;
  n: number;
}

/** A per-shop counter bumped by triggers on every write a job list shows (migration 012): equal versions, equal lists. */
export interface JobListVersionTable {
  shop_id: string;
  version: number;
}
