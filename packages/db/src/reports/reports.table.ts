import type { Insertable, Selectable } from 'kysely';

/** One check result of one analysed log, kept by triggers from `datalogs.report` (migration 010); never written by code. */
export interface DatalogCheckTable {
  datalog_id: string;
  shop_id: string;
  /** When the log was uploaded (the datalog's `created_at`). */
  created_at: string;
  check_id: string;
  status: 'pass' | 'warn' | 'fail';
}
export type DatalogCheckRow = Selectable<DatalogCheckTable>;

/**
 * One finished stint of a job in a state: written by the job workflow's one writer of job state in the move's
 * transaction (its id is the move's audit event), never updated.
 */
export interface JobStintTable {
  id: string;
  shop_id: string;
  job_id: string;
  /** The state the job was in. */
  state: string;
  entered_at: string;
  left_at: string;
  /** `left_at` − `entered_at` in hours, written with the row (insertJobStint computes it). */
  hours: number;
  /** The state the move that ended the stint took the job to. */
  to_state: string;
  /** The job's round after that move. */
  round: number;
  /** Who made the move; null for the system actor. */
  left_by_user_id: string | null;
}
export type JobStintRow = Selectable<JobStintTable>;
export type InsertableJobStintRow = Omit<Insertable<JobStintTable>, 'hours'>;

/** Money one customer paid the shop for jobs and got back, kept by the payment writers; never written elsewhere. */
export interface CustomerSummaryTable {
  shop_id: string;
  customer_user_id: string;
  paid_minor: number;
  refunded_minor: number;
  updated_at: string;
}
export type CustomerSummaryRow = Selectable<CustomerSummaryTable>;
