import type { AfrScale, CanonicalChannel, CheckId, CheckStatus, DatalogMappingInput, DatalogReport, KnockEvent, Range } from '@revloop/domain/datalog';
import { JOB_STATES } from '@revloop/domain/jobs';
import { z } from 'zod';
import { itemOf, listOf, personRefSchema, timestamp } from './envelope';

// The report and its parts are computed by the domain and typed there; the contract carries them without a second
// runtime copy of their many fields (a report holds thousands of cells).
const report = z.custom<DatalogReport>((v) => typeof v === 'object' && v !== null);
const checks = z.custom<DatalogReport['checks']>((v) => Array.isArray(v));
const channel = z.custom<CanonicalChannel>((v) => typeof v === 'string');
const range = z.custom<Range>((v) => Array.isArray(v) && v.length === 2);

export const DATALOG_STATUSES = ['processing', 'ready', 'failed'] as const;
export type DatalogStatus = (typeof DATALOG_STATUSES)[number];

/** A log as the API lists it (`datalogRowToDatalog`); the report comes with the single log only. */
export const datalogSchema = z.object({
  id: z.string(),
  jobId: z.string(),
  /** The revision on the car when it was logged; 0 is the calibration the car came with. */
  round: z.number(),
  originalName: z.string(),
  sizeBytes: z.number(),
  sha256: z.string(),
  status: z.enum(DATALOG_STATUSES),
  /** 0–1 while the analysis runs. */
  progress: z.number(),
  error: z.string().nullable(),
  checks,
  uploadedBy: personRefSchema.nullable(),
  createdAt: timestamp,
});
export type Datalog = z.infer<typeof datalogSchema>;
export const jobDatalogsResponseSchema = listOf(datalogSchema);

export const datalogDetailSchema = datalogSchema.extend({
  job: z.object({ id: z.string(), number: z.number(), round: z.number(), state: z.enum(JOB_STATES), vehicle: z.string() }),
  report: report.nullable(),
});
export type DatalogDetail = z.infer<typeof datalogDetailSchema>;
export const datalogDetailResponseSchema = itemOf(datalogDetailSchema);

/** `lttb` keeps each channel's shape on its own; `rows` gives every channel the same time stamps (scatter plots). */
export const SERIES_SAMPLINGS = ['lttb', 'rows'] as const;
export type SeriesSampling = (typeof SERIES_SAMPLINGS)[number];

export const seriesChannelSchema = z.object({
  channel,
  label: z.string(),
  unit: z.string(),
  /** Seconds from the start of the log, and the values at those times (at most `points` of them). */
  t: z.array(z.number()),
  v: z.array(z.number()),
});
export type SeriesChannel = z.infer<typeof seriesChannelSchema>;

/** `GET /api/datalogs/:id/series`. */
export const datalogSeriesSchema = z.object({
  from: z.number(),
  to: z.number(),
  durationS: z.number(),
  available: z.array(channel),
  sampling: z.enum(SERIES_SAMPLINGS),
  channels: z.array(seriesChannelSchema),
  knock: z.array(z.custom<KnockEvent>()),
});
export type DatalogSeries = z.infer<typeof datalogSeriesSchema>;
export const datalogSeriesResponseSchema = itemOf(datalogSeriesSchema);

export const comparedLogSchema = z.object({ id: z.string(), round: z.number(), originalName: z.string(), createdAt: timestamp });
export type ComparedLog = z.infer<typeof comparedLogSchema>;

/** `GET /api/datalogs/:a/compare/:b`. */
export const datalogComparisonSchema = z.object({
  base: comparedLogSchema,
  other: comparedLogSchema,
  checks: z.array(z.object({ id: z.custom<CheckId>(), base: z.custom<CheckStatus>().nullable(), other: z.custom<CheckStatus>().nullable() })),
  /** Cells present in either log; a side without enough samples there is null. */
  fuelTrim: z.array(
    z.object({ rpm: range, map: range, baseTrimPct: z.number().nullable(), otherTrimPct: z.number().nullable(), deltaPct: z.number().nullable() }),
  ),
  /** Full-throttle lambda error per rpm bin, all pulls of a log pooled by samples. */
  lambdaError: z.array(z.object({ rpm: range, baseErrorPct: z.number().nullable(), otherErrorPct: z.number().nullable(), deltaPct: z.number().nullable() })),
});
export type DatalogComparison = z.infer<typeof datalogComparisonSchema>;
export const datalogComparisonResponseSchema = itemOf(datalogComparisonSchema);

/** `GET /api/datalogs/:id/mapping`. */
export const datalogMappingSchema = z.object({
  /** The log's column headers, in order. */
  headers: z.array(z.string()),
  /** Canonical channel → the header feeding it now (absent = not logged). */
  channels: z.custom<Partial<Record<CanonicalChannel, string>>>(),
  /** Canonical channel → the unit its column is read in now (stated or from the header); null = the channel's own unit. */
  units: z.custom<Partial<Record<CanonicalChannel, string | null>>>(),
  /** Channel → unit the user stated. */
  stated: z.custom<Partial<Record<CanonicalChannel, string>>>(),
  /** Scale of the AFR columns as stated; null = the fuel's, checked against cruise. */
  afrScale: z.custom<AfrScale>().nullable(),
  trimAxis: z.custom<NonNullable<DatalogMappingInput['trimAxis']>>().nullable(),
  /** Headers no channel takes now. */
  unmapped: z.array(z.string()),
  /** The channels a log can hold, with plain names and the units a user may state, in display order. */
  canonical: z.array(
    z.object({ channel, label: z.string(), unit: z.string(), unitChoices: z.array(z.object({ value: z.string(), label: z.string() })) }),
  ),
  /** Whether this shop has a confirmed mapping for this header set. */
  remembered: z.boolean(),
});
export type DatalogMapping = z.infer<typeof datalogMappingSchema>;
export const datalogMappingResponseSchema = itemOf(datalogMappingSchema);
