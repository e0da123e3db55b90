import type { Insertable, Selectable, Updateable } from 'kysely';

export type DatalogStatus = 'processing' | 'ready' | 'failed';

export interface DatalogTable {
  id: string;
  shop_id: string;
  job_id: string;
  /** The revision on the car when the log was recorded (the job's round at upload). */
  round: number;
  original_name: string;
  /** Content hash: the file lives in the blob store under it. */
  sha256: string;
  size_bytes: number;
  header_signature: string;
  /** JSON `{ headers, overrides: Record<channel, header>, units?, afrScale?, trimAxis? }`: the columns and the mapping the analysis used. */
  mapping: string;
  /** JSON domain FuelSpec the AFR columns were converted with. */
  fuel: string;
  status: DatalogStatus;
  error: string | null;
  /** JSON DatalogReport once ready. */
  report: string | null;
  uploaded_by: string | null;
  created_at: string;
}
export type DatalogRow = Selectable<DatalogTable>;
export type InsertableDatalogRow = Insertable<DatalogTable>;
export type UpdateableDatalogRow = Updateable<DatalogTable>;

export interface DatalogMappingTable {
  shop_id: string;
  header_signature: string;
  /** JSON `{ channels, units?, afrScale?, trimAxis? }` a member confirmed for this header set (older rows: a bare channel → header object). */
  mapping: string;
  updated_at: string;
}
export type DatalogMappingRow = Selectable<DatalogMappingTable>;
