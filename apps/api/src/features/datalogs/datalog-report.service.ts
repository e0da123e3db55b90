import { findDatalogMapping, type Db } from '@revloop/db';
import { DomainError } from '@revloop/domain';
import {
  CHANNEL_INFO,
  compareReports,
  mapHeaders,
  trimGridToCsv,
  wotTableToCsv,
  type CanonicalChannel,
} from '@revloop/domain/datalog';
import type { AppDeps } from '../../context';
import { mappingOptions, type StoredMapping } from './datalog-mapping';
import { datalogDetailToApi, mappingToApi } from './datalog.presenter';
import { SeriesCache, downsampleChannel } from './datalog-series';
import { sampleAlignedRows } from './datalog-series-rows';
import { datalogAnalyzerOf, loadDatalog, readyReport, type ShopAuth } from './datalog.service';

type ValueChannel = Exclude<CanonicalChannel, 'time'>;

/** One log with its job and report; a "processing" log without an open analysis job gets one (adds nothing otherwise). */
export async function openDatalog(deps: AppDeps, auth: ShopAuth, id: string) {
  const { row, job } = await loadDatalog(deps.db, auth, id);
  const analyzer = datalogAnalyzerOf(deps);
  if (row.status === 'processing') await analyzer.start(row);
  return datalogDetailToApi(row, job, row.status === 'processing' ? await analyzer.progressOf(row.id) : undefined);
}

const seriesCaches = new WeakMap<Db, SeriesCache>();

/** One cache of parsed logs per app (keyed by its database), like the analyzer. */
function seriesCacheOf(deps: AppDeps): SeriesCache {
  let cache = seriesCaches.get(deps.db);
  if (!cache) {
    cache = new SeriesCache();
    seriesCaches.set(deps.db, cache);
  }
  return cache;
}

export interface SeriesQuery {
  channels: ValueChannel[];
  from?: number | undefined;
  to?: number | undefined;
  points: number;
  sampling: 'lttb' | 'rows';
}

/** Chart series of a ready log between two times, thinned to `points`, with the knock events in that window. */
export async function datalogSeries(deps: AppDeps, auth: ShopAuth, id: string, q: SeriesQuery) {
  const { row } = await loadDatalog(deps.db, auth, id);
  const report = readyReport(row);
  const mapping = JSON.parse(row.mapping) as StoredMapping;
  const columns = await seriesCacheOf(deps).get(`${row.sha256}|${row.mapping}|${row.fuel}`, {
    filePath: await deps.blobs.localPath(row.sha256),
    options: { ...mappingOptions(mapping), fuel: JSON.parse(row.fuel) },
  });
  const from = q.from ?? 0;
  const to = q.to ?? report.durationS;
  if (to <= from) throw new DomainError('validation', '"to" must be later than "from".');
  const available = (Object.keys(columns) as CanonicalChannel[]).filter((c) => c !== 'time');
  const logged = q.channels.filter((c) => columns[c] !== undefined);
  const rows = q.sampling === 'rows' ? sampleAlignedRows(columns, logged, from, to, q.points) : null;
  return {
    from,
    to,
    durationS: report.durationS,
    available,
    sampling: q.sampling,
    channels: logged.map((c) => ({
      channel: c,
      label: CHANNEL_INFO[c].label,
      unit: CHANNEL_INFO[c].unit,
      ...(rows ? { t: rows.t, v: rows.values.get(c)! } : downsampleChannel(columns.time, columns[c]!, from, to, q.points)),
    })),
    knock: report.knock.events.filter((e) => e.timeS >= from && e.timeS <= to),
  };
}

/** The log's column mapping as it stands, and whether the shop remembers one for these headers. */
export async function datalogMapping(deps: AppDeps, auth: ShopAuth, id: string) {
  const { row } = await loadDatalog(deps.db, auth, id);
  const stored = JSON.parse(row.mapping) as StoredMapping;
  const proposal = mapHeaders(stored.headers, stored.overrides, stored.units ?? {});
  const remembered = await findDatalogMapping(deps.db, auth.shop.id, row.header_signature);
  return mappingToApi(stored, proposal, remembered !== undefined);
}

export const EXPORT_TABLES = ['trims.csv', 'wot.csv'] as const;
export type ExportTable = (typeof EXPORT_TABLES)[number];

const csvName = (name: string) => name.replace(/\.[^.]*$/, '').replace(/[^\w.-]+/g, '_').slice(0, 80) || 'datalog';

/** A ready log's fuel-trim grid or full-throttle table as CSV, with the file name to save it under. */
export async function exportDatalogTable(deps: AppDeps, auth: ShopAuth, id: string, table: ExportTable) {
  const { row } = await loadDatalog(deps.db, auth, id);
  const report = readyReport(row);
  const trims = table === 'trims.csv';
  return { csv: trims ? trimGridToCsv(report) : wotTableToCsv(report), fileName: `${csvName(row.original_name)}-${trims ? 'fuel-trims' : 'full-throttle'}.csv` };
}

/** Before/after of two ready logs of one job. */
export async function compareDatalogs(deps: AppDeps, auth: ShopAuth, id: string, otherId: string) {
  const base = await loadDatalog(deps.db, auth, id);
  const other = await loadDatalog(deps.db, auth, otherId);
  if (base.row.job_id !== other.row.job_id) throw new DomainError('validation', 'Only two logs of the same job can be compared.');
  const summary = (r: typeof base.row) => ({ id: r.id, round: r.round, originalName: r.original_name, createdAt: r.created_at });
  return { base: summary(base.row), other: summary(other.row), ...compareReports(readyReport(base.row), readyReport(other.row)) };
}
