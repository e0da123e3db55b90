import {
  clearWorkProgress,
  findDatalog,
  setWorkProgress,
  workProgressOf,
  findJob,
  findVehicle,
  inShopScope,
  inTransaction,
  outsideShopScope,
  updateDatalog,
  type DatalogRow,
  type DatalogListRow,
  type Db,
  type JobListRow,
  type ShopRow,
} from '@revloop/db';
import { DomainError, isDomainError } from '@revloop/domain';
import { systemActorFor } from '@revloop/domain/auth';
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
import { loadAuthContext, type AuthContext } from '../../http/auth-context';
import { analyzeFileInWorker } from '../../workers/datalog/analyze-file';
import { recordAudit } from '../audit/audit.service';
import { loadJob, setJobFacts, transitionJob } from '../jobs/job.service';
import { drainMailOutbox } from '../mail/mail-outbox.service';
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

export const DATALOG_QUEUE = 'datalog-analysis';

interface AnalysisJob {
  datalogId: string;
  shopId: string;
}

const progressKey = (id: string) => `datalog:${id}`;

/**
 * Log analysis as jobs of the durable queue (deps.queue), keyed by the log's id: any instance may run it, a crash
 * re-runs it after the lease, and a run finds the log no longer "processing" when it was done before. Progress
 * (0–1) is kept in work_progress, so every instance shows it; the status is in the row.
 */
export class DatalogAnalyzer {
  private readonly written = new Map<string, number>();

  constructor(private readonly deps: AppDeps) {
    deps.queue.register(DATALOG_QUEUE, {
      concurrency: 2,
      maxAttempts: 3,
      // A job is its log's shop's work: row-level security keeps it to that shop (PostgreSQL), as a request would be.
      run: (payload) => inShopScope(deps.db, (payload as AnalysisJob).shopId, () => this.runJob(payload as AnalysisJob)),
      onExhausted: async (payload) => {
        const job = payload as AnalysisJob;
        await inShopScope(deps.db, job.shopId, () =>
          updateDatalog(deps.db, job.shopId, job.datalogId, { status: 'failed', error: 'The log could not be analysed.', report: null }),
        );
      },
    });
  }

  async progressOf(id: string): Promise<number | undefined> {
    return (await workProgressOf(this.deps.db, [progressKey(id)])).get(progressKey(id));
  }

  async progressOfMany(ids: string[]): Promise<Map<string, number>> {
    const found = await workProgressOf(this.deps.db, ids.map(progressKey));
    return new Map(ids.flatMap((id) => (found.has(progressKey(id)) ? [[id, found.get(progressKey(id))!] as const] : [])));
  }

  /** Queues the analysis of a "processing" log; false when a job for it is already queued or running. */
  start(row: { id: string; shop_id: string }): Promise<boolean> {
    // Unscoped: the queue's poller that this wakes is system work for every shop, and would keep the request's scope.
    return outsideShopScope(this.deps.db, () =>
      this.deps.queue.enqueue(DATALOG_QUEUE, row.id, { datalogId: row.id, shopId: row.shop_id } satisfies AnalysisJob),
    );
  }

  /** Settles when the given logs have no open analysis job (tests and start-up recovery). */
  settled(ids: string[]): Promise<void> {
    return this.deps.queue.settled(DATALOG_QUEUE, ids);
  }

  private async runJob(job: AnalysisJob): Promise<void> {
    const { db } = this.deps;
    const row = await findDatalog(db, job.shopId, job.datalogId);
    // Done before (by this or another instance), or removed: nothing to do, which makes a re-run harmless.
    if (!row || row.status !== 'processing') return;
    // Acts as the member who uploaded the log, as the upload itself did.
    const auth = row.uploaded_by ? await loadAuthContext(db, 'analysis-queue', row.uploaded_by, row.shop_id) : null;
    if (!auth?.shop) {
      await updateDatalog(db, row.shop_id, row.id, {
        status: 'failed',
        error: 'The check was cut off by a restart and its uploader is no longer a member of the shop. Upload the log again.',
        report: null,
      });
      return;
    }
    try {
      await this.run(auth as ShopAuth, row);
    } finally {
      this.written.delete(row.id);
      await clearWorkProgress(db, progressKey(row.id));
    }
  }

  private reportProgress(id: string, fraction: number): void {
    // A write per 5 %: enough for a progress bar, little for the database.
    if (fraction - (this.written.get(id) ?? -1) < 0.05) return;
    this.written.set(id, fraction);
    setWorkProgress(this.deps.db, progressKey(id), fraction, this.deps.clock.now()).catch(() => undefined);
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
      report = await analyzeFileInWorker(await blobs.localPath(row.sha256), options, (f) => this.reportProgress(row.id, f));
    } catch (error) {
      const message = isDomainError(error) ? error.message : 'The log could not be analysed.';
      if (!isDomainError(error)) this.deps.logger.error({ err: error, datalogId: row.id }, 'datalog analysis failed');
      await updateDatalog(db, row.shop_id, row.id, { status: 'failed', error: message, report: null });
      return;
    }
    const fails = report.checks.filter((c) => c.status === 'fail').length;
    // The report, its audit line and the job's move to log review commit together: whoever sees the log ready sees the
    // job moved too (on PostgreSQL a reader can come between two separate writes), and a crash leaves neither.
    await inTransaction(db, async (trx) => {
      await updateDatalog(trx, row.shop_id, row.id, { status: 'ready', error: null, report: JSON.stringify(report) });
      await recordAudit(trx, {
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
      await setJobFacts(trx, row.shop_id, row.job_id, { hasLogForRound: true }, clock.now());
      const current = await loadJob(trx, auth, row.job_id);
      if (current.state === 'with_customer') {
        await transitionJob(this.deps, trx, current, 'log_review', { actor: systemActorFor(auth.shop.id), causedBy: auth.user.id });
      }
    });
    await drainMailOutbox(this.deps);
  }
}

const analyzers = new WeakMap<Db, DatalogAnalyzer>();

/** One analyzer per app (keyed by its database): it registers the queue's handler once. */
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
