import type { Datalog } from '@revloop/contract';
import type { DatalogListRow, JobListRow } from '@revloop/db';
import { CANONICAL_CHANNELS, CHANNEL_INFO, UNIT_CHOICES, type DatalogReport, type HeaderMapping } from '@revloop/domain/datalog';
import type { StoredMapping } from './datalog-mapping';

/** API shape of a log; `progress` from this process while it runs. */
export function datalogRowToDatalog(row: DatalogListRow, progress: number | undefined): Datalog {
  const report = row.report ? (JSON.parse(row.report) as DatalogReport) : null;
  return {
    id: row.id,
    jobId: row.job_id,
    round: row.round,
    originalName: row.original_name,
    sizeBytes: row.size_bytes,
    sha256: row.sha256,
    status: row.status,
    progress: row.status === 'processing' ? (progress ?? 0) : 1,
    error: row.error,
    checks: report?.checks ?? [],
    uploadedBy: row.uploaded_by ? { id: row.uploaded_by, name: row.uploaded_by_name ?? '' } : null,
    createdAt: row.created_at,
  };
}

/** A single log with its job and, once ready, its report. */
export function datalogDetailToApi(row: DatalogListRow, job: JobListRow, progress: number | undefined) {
  return {
    ...datalogRowToDatalog(row, progress),
    job: { id: job.id, number: job.number, round: job.round, state: job.state, vehicle: job.vehicle_description },
    report: row.status === 'ready' && row.report ? (JSON.parse(row.report) as DatalogReport) : null,
  };
}

/** The mapping dialog: the log's headers, what each channel reads now, and the channels it could read. */
export function mappingToApi(stored: StoredMapping, proposal: HeaderMapping, remembered: boolean) {
  return {
    headers: stored.headers,
    channels: Object.fromEntries(Object.entries(proposal.channels).map(([c, m]) => [c, m.header])),
    // The unit each column is read in now: stated, or read from its header (null = the channel's own unit).
    units: Object.fromEntries(Object.entries(proposal.channels).map(([c, m]) => [c, m.unitText])),
    stated: stored.units ?? {},
    afrScale: stored.afrScale ?? null,
    trimAxis: stored.trimAxis ?? null,
    unmapped: proposal.unmapped,
    canonical: CANONICAL_CHANNELS.map((channel) => ({
      channel,
      label: CHANNEL_INFO[channel].label,
      unit: CHANNEL_INFO[channel].unit,
      unitChoices: UNIT_CHOICES[CHANNEL_INFO[channel].quantity],
    })),
    remembered,
  };
}
