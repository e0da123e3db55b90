import type { AddressRange, CalibrationFormat, DiffRange, HexViewRow } from '@revloop/domain/calibration';
import { PACKAGE_MODULES } from '@revloop/domain/jobs';
import { z } from 'zod';
import { itemOf, listWithMeta, personRefSchema, timestamp } from './envelope';
import { downloadLockSchema } from './billing';
import { readPlausibilitySchema } from './vehicles';

/** A file's control unit: those a package covers (SAE J1930 names), or another one. */
export const CALIBRATION_MODULES = [...PACKAGE_MODULES, 'other'] as const;
export type CalibrationModule = (typeof CALIBRATION_MODULES)[number];

/** What a calibration file is in the job: the car's first read, a tuner's revision, or a read taken after flashing. */
export const FILE_KINDS = ['read', 'revision', 're_read'] as const;
export type CalibrationFileKind = (typeof FILE_KINDS)[number];

export const CALIBRATION_FORMATS = ['raw', 'intel_hex', 'srec'] as const satisfies readonly CalibrationFormat[];

// Leaf shapes the domain computes: parsed here, and the compiler holds them to the domain's types.
export const addressRangeSchema = z.object({ start: z.number(), end: z.number() }) satisfies z.ZodType<AddressRange>;
export const diffRangeSchema = z.object({ start: z.number(), end: z.number(), changedBytes: z.number() }) satisfies z.ZodType<DiffRange>;
export type { DiffRange };
export const hexRowSchema = z.object({
  address: z.number(),
  left: z.array(z.number().nullable()),
  right: z.array(z.number().nullable()),
  changed: z.array(z.boolean()),
  leftText: z.string(),
  rightText: z.string(),
}) satisfies z.ZodType<HexViewRow>;
export type HexRow = z.infer<typeof hexRowSchema>;

/** Multipart fields beside the file of `POST /api/jobs/:id/files`. */
export const uploadJobFileFieldsSchema = z.object({
  module: z.enum(CALIBRATION_MODULES, 'Choose the module: ECM, TCM or other.'),
  // "re-read" is how people write it; the API stores re_read.
  kind: z.preprocess((v) => (v === 're-read' ? 're_read' : v), z.enum(FILE_KINDS, 'Choose the kind: read, revision or re-read.')),
  notes: z.string().trim().max(2000, 'Keep the notes under 2000 characters.').default(''),
});
export type UploadJobFileFields = z.input<typeof uploadJobFileFieldsSchema>;

export const calibrationFileSchema = z.object({
  id: z.string(),
  jobId: z.string(),
  module: z.enum(CALIBRATION_MODULES),
  kind: z.enum(FILE_KINDS),
  label: z.string(),
  revisionNumber: z.number().nullable(),
  forRound: z.number().nullable(),
  parentFileId: z.string().nullable(),
  notes: z.string(),
  originalName: z.string(),
  downloadName: z.string(),
  format: z.enum(CALIBRATION_FORMATS),
  formatLabel: z.string(),
  sha256: z.string(),
  crc32: z.number(),
  crc32Hex: z.string(),
  sizeBytes: z.number(),
  imageBytes: z.number(),
  ranges: z.array(addressRangeSchema),
  uploadedBy: personRefSchema,
  createdAt: timestamp,
  /** A revision not sent yet: only shop staff ever see one. */
  draft: z.boolean(),
  /** The shop asked for a second person's approval of this draft; `approvedBy` is null until someone gives it. */
  approvalRequired: z.boolean(),
  approvedBy: personRefSchema.nullable(),
  approvedAt: timestamp.nullable(),
  /** When Send revision sent it, with the "what changed" note the customer reads beside the download. */
  sentAt: timestamp.nullable(),
  sendNote: z.string().nullable(),
  /** The viewer may approve this draft now (the abilities' File rule: never the uploader). */
  canApprove: z.boolean(),
  /** Reads in the job's file list, for those who revise: the image size against the engine family's expected sizes. */
  plausibility: readPlausibilitySchema.nullable().optional(),
  /** Paid before download, for this viewer: a locked file answers 402 `payment_required` on download. */
  lock: downloadLockSchema,
});
export type CalibrationFile = z.infer<typeof calibrationFileSchema>;

/** What the signed-in user may do with this job's files. */
export const jobFilesMetaSchema = z.object({ canUpload: z.boolean(), canUploadRevision: z.boolean(), canVerify: z.boolean() });
export type JobFilesMeta = z.infer<typeof jobFilesMetaSchema>;
export const jobFilesResponseSchema = listWithMeta(calibrationFileSchema, jobFilesMetaSchema);
export type JobFilesResponse = z.infer<typeof jobFilesResponseSchema>;

export const VERIFICATION_STATUSES = ['matches', 'matches_older', 'differs', 'no_reference', 'not_compared'] as const;

/** The proof check of one file (`GET /api/files/:id/verify`). */
export const verificationSchema = z.object({
  fileId: z.string(),
  kind: z.enum(FILE_KINDS),
  module: z.enum(CALIBRATION_MODULES),
  /**
   * matches: equals the revision believed on the car (or, before any revision, the read);
   * matches_older: equals an older revision of the job; differs: equals none, compared with the believed one;
   * no_reference: nothing to compare with; not_compared: reads and revisions are only checked for foreign matches.
   */
  status: z.enum(VERIFICATION_STATUSES),
  matchesRevision: z.number().nullable(),
  /** The file the shop believes is on the car (latest revision sent for the module, else the read). */
  believed: z.object({ fileId: z.string(), label: z.string(), revisionNumber: z.number().nullable() }).nullable(),
  changedBytes: z.number(),
  changedShare: z.number(),
  ranges: z.array(diffRangeSchema),
  totalRanges: z.number(),
  warning: z.boolean(),
  message: z.string(),
  foreignMatch: z.boolean(),
  foreignMatches: z.array(
    z.object({ fileId: z.string(), jobId: z.string(), jobNumber: z.number(), module: z.enum(CALIBRATION_MODULES), revisionNumber: z.number().nullable() }),
  ),
  foreignMessage: z.string().nullable(),
});
export type Verification = z.infer<typeof verificationSchema>;
export const verificationResponseSchema = itemOf(verificationSchema);

export const uploadJobFileResponseSchema = z.object({
  data: calibrationFileSchema,
  meta: z.object({ waitingFor: z.array(z.enum(CALIBRATION_MODULES)), movedTo: z.string().nullable(), verification: verificationSchema.nullable() }),
});
export type UploadJobFileResponse = z.infer<typeof uploadJobFileResponseSchema>;

/** Query string of `GET /api/files/:a/diff/:b`. */
export const fileDiffQuerySchema = z.object({
  gap: z.coerce.number().int().min(0).max(4096).default(16),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
});
export type FileDiffQuery = z.infer<typeof fileDiffQuerySchema>;

export const fileDiffSchema = z.object({
  a: calibrationFileSchema,
  b: calibrationFileSchema,
  gap: z.number(),
  changedBytes: z.number(),
  comparedBytes: z.number(),
  changedShare: z.number(),
  ranges: z.array(diffRangeSchema),
  page: z.number(),
  pageSize: z.number(),
  totalRanges: z.number(),
  pageCount: z.number(),
});
export type FileDiff = z.infer<typeof fileDiffSchema>;
export const fileDiffResponseSchema = itemOf(fileDiffSchema);

export const diffHexSchema = z.object({ range: addressRangeSchema, width: z.number(), rows: z.array(hexRowSchema), truncated: z.boolean() });
export type DiffHex = z.infer<typeof diffHexSchema>;
export const diffHexResponseSchema = itemOf(diffHexSchema);

/** What `GET /api/shop` adds about revision review: drafts need a second person's approval before they are sent. */
export const shopRevisionReviewSchema = z.object({ revisionApproval: z.boolean() });
export type ShopRevisionReview = z.infer<typeof shopRevisionReviewSchema>;
/** The revision-review field of `PATCH /api/shop` (owner). */
export const shopRevisionReviewPatchSchema = shopRevisionReviewSchema.partial();
export type ShopRevisionReviewPatch = z.infer<typeof shopRevisionReviewPatchSchema>;
