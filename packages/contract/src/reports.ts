import { z } from 'zod';
import { JOB_STATES } from '@revloop/domain/jobs';
import { daysBetween } from '@revloop/domain/reports';

/** The longest range one report covers: three years of days, so a week chart stays a few hundred bars at most. */
export const REPORT_MAX_DAYS = 3 * 366;

const isoDay = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'Give dates as YYYY-MM-DD.')
  .refine((day) => !Number.isNaN(Date.parse(`${day}T00:00:00Z`)) && new Date(`${day}T00:00:00Z`).toISOString().startsWith(day), 'That date does not exist.');

/** `?from&to` (calendar days in the shop's time zone, both included) and `format=csv` for the table as a file. */
export const reportQuerySchema = z
  .object({ from: isoDay, to: isoDay, format: z.enum(['json', 'csv']).default('json') })
  .refine((q) => q.from <= q.to, { message: 'The start date must not be after the end date.', path: ['to'] })
  .refine((q) => daysBetween(q.from, q.to) <= REPORT_MAX_DAYS, { message: `A report covers at most ${REPORT_MAX_DAYS} days.`, path: ['from'] });
export type ReportQuery = z.infer<typeof reportQuerySchema>;

export const REVENUE_GROUPINGS = ['month', 'package', 'dealer'] as const;
export const revenueQuerySchema = z.object({ by: z.enum(REVENUE_GROUPINGS).default('month') });

/** What every report answers besides its rows: the days it covers and the zone they were read in. */
const reportMeta = { from: z.string(), to: z.string(), timeZone: z.string() };

export const turnaroundReportSchema = z.object({
  ...reportMeta,
  rows: z.array(z.object({ state: z.enum(JOB_STATES), stateLabel: z.string(), stints: z.number().int(), medianHours: z.number(), p90Hours: z.number() })),
});
export type TurnaroundReport = z.infer<typeof turnaroundReportSchema>;

export const roundsReportSchema = z.object({
  ...reportMeta,
  jobs: z.number().int(),
  rows: z.array(z.object({ rounds: z.number().int(), jobs: z.number().int() })),
});
export type RoundsReport = z.infer<typeof roundsReportSchema>;

export const weeklyJobsReportSchema = z.object({
  ...reportMeta,
  rows: z.array(z.object({ weekStart: z.string(), opened: z.number().int(), dialedIn: z.number().int() })),
});
export type WeeklyJobsReport = z.infer<typeof weeklyJobsReportSchema>;

export const tunerLoadReportSchema = z.object({
  ...reportMeta,
  rows: z.array(
    z.object({
      userId: z.string(),
      name: z.string(),
      role: z.enum(['owner', 'tuner']),
      openJobs: z.number().int(),
      dialedIn: z.number().int(),
      reviews: z.number().int(),
      medianReviewHours: z.number().nullable(),
    }),
  ),
});
export type TunerLoadReport = z.infer<typeof tunerLoadReportSchema>;

export const revenueReportSchema = z.object({
  ...reportMeta,
  by: z.enum(REVENUE_GROUPINGS),
  currency: z.string(),
  rows: z.array(
    z.object({
      key: z.string().nullable(),
      label: z.string(),
      paymentsMinor: z.number().int(),
      refundsMinor: z.number().int(),
      dealerDebitsMinor: z.number().int(),
      netMinor: z.number().int(),
    }),
  ),
  totals: z.object({ paymentsMinor: z.number().int(), refundsMinor: z.number().int(), dealerDebitsMinor: z.number().int(), netMinor: z.number().int() }),
});
export type RevenueReport = z.infer<typeof revenueReportSchema>;

export const logQualityReportSchema = z.object({
  ...reportMeta,
  logs: z.number().int(),
  rows: z.array(
    z.object({
      checkId: z.string(),
      label: z.string(),
      logs: z.number().int(),
      failed: z.number().int(),
      warned: z.number().int(),
      /** Shares of the logs this check judged, 0…1. */
      failedShare: z.number(),
      warnedShare: z.number(),
    }),
  ),
});
export type LogQualityReport = z.infer<typeof logQualityReportSchema>;
