import type { Generated, Insertable, Selectable } from 'kysely';

export type CalibrationModule = 'ECM' | 'TCM' | 'other';
export type CalibrationFileKind = 'read' | 'revision' | 're_read';
export type CalibrationFileFormat = 'raw' | 'intel_hex' | 'srec';

export interface CalibrationFileTable {
  id: string;
  shop_id: string;
  job_id: string;
  module: CalibrationModule;
  kind: CalibrationFileKind;
  /** Rev N per job and module; null for reads and re-reads. */
  revision_number: number | null;
  /** The job round a revision was made for (the round it starts when sent); null for reads. */
  for_round: number | null;
  /** A revision's parent: the previous revision of the module, or the read it started from. */
  parent_file_id: string | null;
  notes: Generated<string>;
  original_name: string;
  format: CalibrationFileFormat;
  /** SHA-256 of the stored file, also its name in the blob store. */
  sha256: string;
  /** CRC-32 of the memory image (not of the file). */
  crc32: number;
  /** Size of the stored file. */
  size_bytes: number;
  /** Data bytes in the memory image. */
  image_bytes: number;
  /** JSON `[{start,end}]`, end exclusive. */
  ranges: string;
  uploaded_by_user_id: string;
  created_at: string;
  /** 1 when the shop asked for a second person's approval at upload (revisions only). */
  approval_required: Generated<number>;
  approved_by_user_id: Generated<string | null>;
  approved_at: Generated<string | null>;
  /** When "Send revision" sent it, and the "what changed" note sent with it; null while a draft. */
  sent_at: Generated<string | null>;
  send_note: Generated<string | null>;
}
export type CalibrationFileRow = Selectable<CalibrationFileTable>;
export type InsertableCalibrationFileRow = Insertable<CalibrationFileTable>;
