import fsp from 'node:fs/promises';
import {
  findDatalog,
  findDatalogMapping,
  findJob,
  findVehicle,
  updateDatalog,
  type DatalogRow,
  type DatalogListRow,
  type Db,
  type JobListRow,
  type ShopRow,
} from '@revloop/db';
import type { Datalog } from '@revloop/contract';
import { DomainError, isDomainError } from '@revloop/domain';
import {
  datalogMappingInputSchema,
  detectCsvLayout,
  logRequestSchema,
  mapHeaders,
  trimCellLoad,
  type AnalyzeOptions,
  type DatalogMappingInput,
  type DatalogReport,
  type DatalogVehicle,
  type LambdaErrorBin,
  type LogRequest,
} from '@revloop/domain/datalog';
import { defaultLogRequest } from '@revloop/domain/datalog';
import { vehicleFuelSpec, type FuelSpec, type VehicleInput } from '@revloop/domain/vehicles';
import type { AppDeps } from '../../context';
import type { AuthContext } from '../../http/auth-context';
import { parseShopSettings } from '@revloop/domain/shops';
import { analyzeFileInWorker } from '../../workers/datalog/analyze-file';
import { recordAudit } from '../audit/audit.service';
import { loadJob, moveJob, setJobFacts } from '../jobs/job.service';

export type ShopAuth = AuthContext & { shop: ShopRow };

/** What the datalogs.mapping column holds. */
export interface StoredMapping {
  headers: string[];
  /** Channel → header; '' = not logged. Empty when the synonyms' proposal was used as is. */
  overrides: Record<string, string>;
  /** Channel → unit the user stated (absent in rows written before units could be stated). */
  units?: Record<string, string>;
  afrScale?: DatalogMappingInput['afrScale'];
  trimAxis?: DatalogMappingInput['trimAxis'];
}

/** The analysis options a stored mapping decides. */
export function mappingOptions(mapping: StoredMapping): Pick<AnalyzeOptions, 'map' | 'units' | 'afrScale' | 'trimAxis'> {
  return {
    map: mapping.overrides,
    units: mapping.units ?? {},
    ...(mapping.afrScale && { afrScale: mapping.afrScale }),
    ...(mapping.trimAxis && { trimAxis: mapping.trimAxis }),
  };
}

/** A shop's remembered mapping: the full input since units could be stated, a bare channel → header object before. */
function parseRemembered(json: string): DatalogMappingInput {
  const raw: unknown = JSON.parse(json);
  const full = datalogMappingInputSchema.safeParse(raw);
  if (full.success) return full.data;
  const legacy = datalogMappingInputSchema.shape.channels.safeParse(raw);
  return { channels: legacy.success ? legacy.data : {} };
}

/** Enough of the file to find the header row, whatever the logger's preamble (see detectCsvLayout). */
const HEAD_BYTES = 256 * 1024;

/** Reads the column headers from the start of a log; bad input (binary, empty, header only) throws invalid_datalog. */
export async function readLogHeaders(filePath: string): Promise<string[]> {
  const handle = await fsp.open(filePath, 'r');
  try {
    const buffer = Buffer.alloc(HEAD_BYTES);
    const { bytesRead } = await handle.read(buffer, 0, HEAD_BYTES, 0);
    return detectCsvLayout(new Uint8Array(buffer.buffer, buffer.byteOffset, bytesRead)).headers;
  } finally {
    await handle.close();
  }
}

/** The drivetrain facts for gear detection; a CVT has no fixed ratios, so the gear is then not worked out. */
export function datalogVehicleOf(spec: VehicleInput): DatalogVehicle | undefined {
  if (spec.transmission.gearRatios.length === 0) return undefined;
  return { gearRatios: spec.transmission.gearRatios, finalDrive: spec.finalDrive, tyreSize: spec.tyreSize, rollingCircumferenceMm: spec.rollingCircumferenceMm };
}

export async function vehicleSpecOf(db: Db, job: JobListRow): Promise<VehicleInput> {
  const vehicle = await findVehicle(db, job.shop_id, job.vehicle_id);
  if (!vehicle) throw new DomainError('not_found', 'The job’s vehicle was not found.');
  return JSON.parse(vehicle.spec) as VehicleInput;
}

export const fuelOf = (spec: VehicleInput): FuelSpec => vehicleFuelSpec(spec);

export function logRequestOf(job: JobListRow, spec: VehicleInput): LogRequest {
  const parsed = logRequestSchema.safeParse(JSON.parse(job.log_request));
  return parsed.success ? parsed.data : defaultLogRequest(spec.engine.family, Math.max(1, job.round));
}

/** The shop's remembered mapping for this header set, then the uploader's own choices, checked against the headers. */
export async function resolveMapping(
  db: Db,
  shopId: string,
  headers: string[],
  signature: string,
  own: Partial<DatalogMappingInput>,
): Promise<StoredMapping> {
  const found = await findDatalogMapping(db, shopId, signature);
  const remembered = found ? parseRemembered(found.mapping) : undefined;
  const mapping: StoredMapping = {
    headers,
    overrides: { ...remembered?.channels, ...own.channels },
    units: { ...remembered?.units, ...own.units },
  };
  const afrScale = own.afrScale ?? remembered?.afrScale;
  const trimAxis = own.trimAxis ?? remembered?.trimAxis;
  if (afrScale) mapping.afrScale = afrScale;
  if (trimAxis) mapping.trimAxis = trimAxis;
  mapHeaders(headers, mapping.overrides, mapping.units);
  return mapping;
}

/** Per-process analysis runs: progress lives here (0–1), the status in the row. */
export class DatalogAnalyzer {
  private readonly running = new Map<string, number>();

  constructor(private readonly deps: AppDeps) {}

  progressOf(id: string): number | undefined {
    return this.running.get(id);
  }

  isRunning(id: string): boolean {
    return this.running.has(id);
  }

  /** Starts the analysis off the request thread; the promise settles when the row is updated (tests await it). */
  start(auth: ShopAuth, row: DatalogRow): Promise<void> {
    if (this.running.has(row.id)) return Promise.resolve();
    this.running.set(row.id, 0);
    return this.run(auth, row)
      .catch((error: unknown) => this.deps.logger.error({ err: error, datalogId: row.id }, 'datalog analysis could not be recorded'))
      .finally(() => this.running.delete(row.id));
  }

  private async run(auth: ShopAuth, row: DatalogRow): Promise<void> {
    const { db, clock, blobs } = this.deps;
    const job = await findJob(db, row.shop_id, row.job_id);
    if (!job) return;
    const spec = await vehicleSpecOf(db, job);
    const mapping = JSON.parse(row.mapping) as StoredMapping;
    const vehicle = datalogVehicleOf(spec);
    const options: Omit<AnalyzeOptions, 'onProgress'> = {
      fuel: JSON.parse(row.fuel) as FuelSpec,
      ...mappingOptions(mapping),
      logRequest: logRequestOf(job, spec),
      settings: parseShopSettings(auth.shop.settings).analysis,
      ...(vehicle && { vehicle }),
    };
    let report: DatalogReport;
    try {
      report = await analyzeFileInWorker(blobs.pathOf(row.sha256), options, (f) => this.running.set(row.id, f));
    } catch (error) {
      const message = isDomainError(error) ? error.message : 'The log could not be analysed.';
      if (!isDomainError(error)) this.deps.logger.error({ err: error, datalogId: row.id }, 'datalog analysis failed');
      await updateDatalog(db, row.shop_id, row.id, { status: 'failed', error: message, report: null });
      return;
    }
    await updateDatalog(db, row.shop_id, row.id, { status: 'ready', error: null, report: JSON.stringify(report) });
    const fails = report.checks.filter((c) => c.status === 'fail').length;
    await recordAudit(db, {
      shopId: row.shop_id,
      actorUserId: row.uploaded_by,
      action: 'datalog.analysed',
      subjectType: 'Job',
      subjectId: row.job_id,
      details: {
        datalogId: row.id,
        text: `Log ${row.original_name} checked: ${fails === 0 ? 'usable' : `${fails} check${fails === 1 ? '' : 's'} failed`}`,
      },
      at: clock.now(),
    });
    if (row.round !== job.round) return;
    await setJobFacts(db, row.shop_id, row.job_id, { hasLogForRound: true }, clock.now());
    if (job.state === 'with_customer') await moveJob(this.deps, auth, row.job_id, 'log_review', { bySystem: true });
  }
}

const analyzers = new WeakMap<Db, DatalogAnalyzer>();

/** One analyzer per app (keyed by its database), so the routes and start-up recovery share what is running. */
export function datalogAnalyzerOf(deps: AppDeps): DatalogAnalyzer {
  let analyzer = analyzers.get(deps.db);
  if (!analyzer) {
    analyzer = new DatalogAnalyzer(deps);
    analyzers.set(deps.db, analyzer);
  }
  return analyzer;
}

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

/** A log the signed-in user may read: through its job, so the job's role scope applies; anything else is a 404. */
export async function loadDatalog(db: Db, auth: ShopAuth, id: string): Promise<{ row: DatalogListRow; job: JobListRow }> {
  const row = await findDatalog(db, auth.shop.id, id);
  if (!row) throw new DomainError('not_found', 'Datalog not found.');
  const job = await loadJob(db, auth, row.job_id).catch((error: unknown) => {
    throw isDomainError(error) && error.code === 'not_found' ? new DomainError('not_found', 'Datalog not found.') : error;
  });
  return { row, job };
}

export function readyReport(row: DatalogRow): DatalogReport {
  if (row.status !== 'ready' || !row.report) {
    throw new DomainError('conflict', row.status === 'failed' ? 'This log could not be read, so it has no report.' : 'This log is still being checked. Try again in a moment.');
  }
  return JSON.parse(row.report) as DatalogReport;
}

const key = (range: [number, number]) => `${range[0]}:${range[1]}`;

/** Lambda error per rpm bin over all pulls of a log, pooled by sample count. */
function pooledLambdaError(report: DatalogReport): Map<string, { rpm: [number, number]; samples: number; sum: number }> {
  const bins = new Map<string, { rpm: [number, number]; samples: number; sum: number }>();
  for (const bin of report.wot.pulls.flatMap((p) => p.lambdaError) as LambdaErrorBin[]) {
    const entry = bins.get(key(bin.rpm)) ?? { rpm: bin.rpm, samples: 0, sum: 0 };
    entry.samples += bin.samples;
    entry.sum += bin.meanErrorPct * bin.samples;
    bins.set(key(bin.rpm), entry);
  }
  return bins;
}

const round2 = (v: number) => Math.round(v * 100) / 100;
const delta = (a: number | null, b: number | null) => (a === null || b === null ? null : round2(b - a));

/** Before/after of two logs of one job: trims per cell and full-throttle lambda error per rpm bin (other − base). */
export function compareReports(base: DatalogReport, other: DatalogReport) {
  // Cells of grids on different load axes (MAP, airflow) never meet: the axis is part of the key.
  const cellKey = (grid: DatalogReport['fuelTrim'], c: DatalogReport['fuelTrim']['cells'][number]) =>
    `${grid.axis ?? 'map'}|${key(c.rpm)}|${key(trimCellLoad(c))}`;
  const baseCells = new Map(base.fuelTrim.cells.map((c) => [cellKey(base.fuelTrim, c), c]));
  const otherCells = new Map(other.fuelTrim.cells.map((c) => [cellKey(other.fuelTrim, c), c]));
  const cellKeys = [...new Set([...baseCells.keys(), ...otherCells.keys()])];
  const fuelTrim = cellKeys
    .map((k) => {
      const a = baseCells.get(k);
      const b = otherCells.get(k);
      const cell = (a ?? b)!;
      const baseTrimPct = a?.meanTrimPct ?? null;
      const otherTrimPct = b?.meanTrimPct ?? null;
      return {
        rpm: cell.rpm,
        axis: cell.maf ? ('maf' as const) : ('map' as const),
        // `map` stays filled for readers that know only the MAP grid; on the airflow axis it holds the g/s bin.
        map: trimCellLoad(cell),
        ...(cell.maf && { maf: cell.maf }),
        baseTrimPct,
        otherTrimPct,
        deltaPct: delta(baseTrimPct, otherTrimPct),
      };
    })
    .sort((x, y) => x.rpm[0] - y.rpm[0] || trimCellLoad(x)[0] - trimCellLoad(y)[0]);
  const baseBins = pooledLambdaError(base);
  const otherBins = pooledLambdaError(other);
  const lambdaError = [...new Set([...baseBins.keys(), ...otherBins.keys()])]
    .map((k) => {
      const a = baseBins.get(k);
      const b = otherBins.get(k);
      const baseErrorPct = a ? round2(a.sum / a.samples) : null;
      const otherErrorPct = b ? round2(b.sum / b.samples) : null;
      return { rpm: (a ?? b)!.rpm, baseErrorPct, otherErrorPct, deltaPct: delta(baseErrorPct, otherErrorPct) };
    })
    .sort((x, y) => x.rpm[0] - y.rpm[0]);
  const checks = [...new Set([...base.checks, ...other.checks].map((c) => c.id))].map((id) => ({
    id,
    base: base.checks.find((c) => c.id === id)?.status ?? null,
    other: other.checks.find((c) => c.id === id)?.status ?? null,
  }));
  return { checks, fuelTrim, lambdaError };
}
