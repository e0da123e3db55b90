import type { Selectable } from 'kysely';

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
