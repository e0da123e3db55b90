import {
  findDatalog,
  findJob,
  findVehicle,
  updateDatalog,
  type DatalogRow,
  type DatalogListRow,
  type Db,
  type JobListRow,
  type ShopRow,
} from '@revloop/db';
import { DomainError, isDomainError } from '@revloop/domain';
import {
  defaultLogRequest,
  logRequestSchema,
  type AnalyzeOptions,
  type DatalogReport,
  type DatalogVehicle,
  type LogRequest,
} from '@revloop/domain/datalog';
import { parseShopSettings } from '@revloop/domain/shops';
import { vehicleFuelSpec, type FuelSpec, type VehicleInput } from '@revloop/domain/vehicles';
import type { AppDeps } from '../../context';
import type { AuthContext } from '../../http/auth-context';
import { analyzeFileInWorker } from '../../workers/datalog/analyze-file';
import { recordAudit } from '../audit/audit.service';
import { loadJob, moveJob, setJobFacts } from '../jobs/job.service';
import { mappingOptions, type StoredMapping } from './datalog-mapping';

export type ShopAuth = AuthContext & { shop: ShopRow };

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
      report = await analyzeFileInWorker(await blobs.localPath(row.sha256), options, (f) => this.running.set(row.id, f));
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
