import { AsyncResource } from 'node:async_hooks';
import PgBoss from 'pg-boss';
import type { Logger } from 'pino';
import { countOpenPgBossJobs, createDb, hasOpenPgBossJob, holdingQueueSetupLock, listPgBossQueues, pgBossExecutor, PG_BOSS_SCHEMA, renewPgBossJob, whilePgBossJobIsOurs, withQueueKeyLock, type Db, type PgBossExecutor } from '@revloop/db';
import type { QueueHandler, QueueJobContext, WorkQueue } from './work-queue';

export interface PgBossQueueOptions {
  /** How often an idle instance asks each queue for work; a job enqueued on this instance starts at once. */
  pollMs?: number;
  /**
   * A running job's claim: the worker renews it every third of this; pg-boss's supervisor puts back (as a retry) a job
   * not renewed for this long, i.e. one whose instance died.
   */
  expireInSeconds?: number;
  /** How often one instance of the cluster runs pg-boss's supervisor (expired jobs back to the queue, archiving). */
  maintenanceIntervalSeconds?: number;
  /**
   * Delay before retry n is between base × 2^(n−1) and base × 2^n seconds (pg-boss's backoff, with jitter; it takes
   * whole seconds). 0 retries at once, without backoff (tests).
   */
  retryDelaySeconds?: number;
  /** How long `stop` waits for running handlers; jobs still running then are left to expire and run elsewhere. */
  stopTimeoutMs?: number;
  /** Connections of the queue's own pool (beside the app's). */
  poolSize?: number;
}

/** The defaults: a job whose instance died is back in the queue within 30 s + 15 s and runs after 2–4 s more. */
export const PG_BOSS_DEFAULTS: Required<PgBossQueueOptions> = {
  pollMs: 1_000,
  expireInSeconds: 30,
  maintenanceIntervalSeconds: 15,
  retryDelaySeconds: 2,
  stopTimeoutMs: 20_000,
  poolSize: 4,
};

/** What a job carries in pg-boss: our key (for `settled` and the exhausted queue, which keeps no singleton key) and payload. */
interface JobData {
  key: string;
  payload: unknown;
}

/** The job's failure as pg-boss keeps it in `output`: our `fail(…, { message })`, or its own timeout `{ value: { message } }`. */
interface JobOutput {
  message?: string;
  value?: { message?: string };
}

type Job = PgBoss.JobWithMetadata<JobData>;

/** One run of a claimed job: `end` stops its heartbeat and records its outcome, if the job is still this run's. */
interface Run {
  end(outcome: (connection: { db: PgBossExecutor }) => Promise<unknown>): Promise<void>;
}

/** Where pg-boss moves a job that failed for good (its dead-letter queue); `onExhausted` runs from there. */
export const exhaustedQueueOf = (queue: string) => `${queue}--exhausted`;

/**
 * The WorkQueue on PostgreSQL, on pg-boss 10 (docs/decisions/014). pg-boss keeps the jobs (schema `pgboss` of the
 * app's database), claims them with SKIP LOCKED, retries failures with exponential backoff up to the handler's
 * maxAttempts, puts back jobs whose worker stopped renewing them, and moves a job that failed for good to the queue's
 * dead-letter queue, where `onExhausted` runs once (as a job itself, so a crash there does not lose it). This class
 * runs its own claim loop (pg-boss `fetch`, `complete`, `fail`) rather than pg-boss `work`, whose handler timeout
 * equals the expiry: a long handler would be failed while still running; here a heartbeat renews the claim instead.
 * One unfinished job per (queue, key): the enqueue checks and inserts under a per-key lock, and the queue's "stately"
 * policy backs it with a unique index.
 */
export class PgBossQueue implements WorkQueue {
  private readonly db: Db;
  private readonly boss: PgBoss;
  private readonly options: Required<PgBossQueueOptions>;
  private readonly handlers = new Map<string, QueueHandler>();
  /** Jobs running here, per pg-boss queue (ours and their exhausted queues). */
  private readonly running = new Map<string, number>();
  private readonly inFlight = new Set<Promise<void>>();
  private readonly heartbeats = new Set<NodeJS.Timeout>();
  private readonly queuesMade = new Map<string, Promise<void>>();
  /** Queue set-ups run one after another here, so they never hold more than two connections between them. */
  private setups: Promise<unknown> = Promise.resolve();
  private started: Promise<void> | undefined;
  private timer: NodeJS.Timeout | undefined;
  /**
   * Claim rounds run in the async context the queue was made in (server start-up), not in that of the request whose
   * enqueue woke them: a job must not inherit a request's shop scope (packages/db's per-context scope).
   */
  private readonly runTick = AsyncResource.bind(() => void this.tick());
  private stopped = true;
  private closed = false;
  private ticking: Promise<void> | undefined;
  private tickAgain = false;

  /** False when the queue runs on a pool it was given (and leaves open). */
  private readonly ownsDb: boolean;

  /**
   * `connection`: a PostgreSQL address, for a small pool of the queue's own, so queue polling never waits behind
   * requests for a connection (and the reverse); or an open database whose pool it shares (test apps), which needs at
   * least two connections.
   */
  constructor(
    connection: string | Db,
    private readonly logger: Logger,
    options: PgBossQueueOptions = {},
  ) {
    // Two connections at least: a queue set-up holds one (its lock) while pg-boss uses another.
    this.options = { ...PG_BOSS_DEFAULTS, ...options, poolSize: Math.max(2, options.poolSize ?? PG_BOSS_DEFAULTS.poolSize) };
    this.ownsDb = typeof connection === 'string';
    this.db = typeof connection === 'string' ? createDb(connection, { poolSize: this.options.poolSize }) : connection;
    this.boss = new PgBoss({
      db: pgBossExecutor(this.db),
      schema: PG_BOSS_SCHEMA,
      // pg-boss creates or migrates its schema on start (under its own advisory lock; instances may start together).
      migrate: true,
      supervise: true,
      // No cron schedules: the sweeps are timers in server.ts that enqueue keyed jobs.
      schedule: false,
      maintenanceIntervalSeconds: this.options.maintenanceIntervalSeconds,
    });
    this.boss.on('error', (err) => this.logger.error({ err }, 'pg-boss reported an error'));
  }

  register(queue: string, handler: QueueHandler): void {
    this.handlers.set(queue, handler);
  }

  async enqueue(queue: string, key: string, payload: unknown): Promise<boolean> {
    await this.queueMade(queue);
    const handler = this.handlers.get(queue);
    const data: JobData = { key, payload: payload ?? null };
    const id = await withQueueKeyLock(this.db, queue, key, async (trx) => {
      if (await hasOpenPgBossJob(trx, queue, key)) return null;
      return this.boss.send(queue, data, {
        singletonKey: key,
        retryLimit: Math.max(0, (handler?.maxAttempts ?? 5) - 1),
        retryDelay: this.options.retryDelaySeconds,
        retryBackoff: this.options.retryDelaySeconds > 0,
        expireInSeconds: this.options.expireInSeconds,
        db: pgBossExecutor(trx),
      });
    });
    if (id) this.poke();
    return id !== null;
  }

  start(): void {
    if (!this.stopped || this.closed) return;
    this.stopped = false;
    this.schedule(0);
  }

  /**
   * Stops claiming, waits up to stopTimeoutMs for running handlers, then closes. A handler still running then keeps
   * its job "active" without a heartbeat: it expires and runs again elsewhere, as after a crash. Final: a stopped
   * PgBossQueue is not started again.
   */
  async stop(): Promise<void> {
    this.stopped = true;
    this.closed = true;
    clearTimeout(this.timer);
    // A claim round under way launches what it fetched; wait for it so those handlers are waited for too.
    await this.ticking;
    let timer: NodeJS.Timeout | undefined;
    const timedOut = await Promise.race([
      Promise.allSettled([...this.inFlight]).then(() => false),
      new Promise<boolean>((resolve) => {
        timer = setTimeout(() => resolve(true), this.options.stopTimeoutMs);
      }),
    ]);
    clearTimeout(timer);
    if (timedOut) this.logger.warn({ running: this.inFlight.size }, 'queue stopped with jobs still running; another instance takes them after they expire');
    for (const heartbeat of this.heartbeats) clearInterval(heartbeat);
    this.heartbeats.clear();
    await this.started?.catch(() => undefined);
    // Not graceful in pg-boss's sense: it would fail its own workers' jobs, and it has none (this class claims them).
    await this.boss.stop({ graceful: false, close: false }).catch((err: unknown) => this.logger.error({ err }, 'pg-boss did not stop cleanly'));
    if (this.ownsDb) await this.db.destroy();
  }

  async settled(queue: string, keys: string[], timeoutMs = 120_000): Promise<void> {
    await this.queueMade(queue);
    const deadline = Date.now() + timeoutMs;
    // A job that failed for good is open until its onExhausted has run in the exhausted queue.
    const queues = [queue, exhaustedQueueOf(queue)];
    for (;;) {
      const open = await countOpenPgBossJobs(this.db, queues, keys);
      if (open === 0) return;
      if (Date.now() > deadline) throw new Error(`queue ${queue}: ${open} job(s) still open`);
      await new Promise((r) => setTimeout(r, 50));
    }
  }

  /** Starts pg-boss once (creating its schema when missing). */
  private bossStarted(): Promise<void> {
    this.started ??= this.boss.start().then(
      () => undefined,
      (error: unknown) => {
        // The next caller tries again (the database was down, say).
        this.started = undefined;
        throw error;
      },
    );
    return this.started;
  }

  /** Creates the queue and its exhausted queue in pg-boss once; v10 refuses jobs for a queue it does not know. */
  private queueMade(queue: string): Promise<void> {
    let made = this.queuesMade.get(queue);
    if (!made) {
      made = this.setups.then(async () => {
        await this.bossStarted();
        const exhausted = exhaustedQueueOf(queue);
        const found = await listPgBossQueues(this.db, [queue, exhausted]);
        const main = found.find((q) => q.name === queue);
        if (found.length === 2 && main?.policy === 'stately' && main.dead_letter === exhausted) return;
        await holdingQueueSetupLock(this.db, async () => {
          // The dead-letter queue must exist first: a job's failure inserts into it.
          await this.boss.createQueue(exhausted, { name: exhausted, policy: 'standard' });
          await this.boss.createQueue(queue, { name: queue, policy: 'stately', deadLetter: exhausted });
          // createQueue leaves an existing queue as it was; these settings must hold on one an older release made too.
          await this.boss.updateQueue(queue, { name: queue, policy: 'stately', deadLetter: exhausted });
        });
      });
      this.setups = made.catch(() => undefined);
      // A failed attempt (database down at start) is tried again by the next caller.
      made.catch(() => this.queuesMade.delete(queue));
      this.queuesMade.set(queue, made);
    }
    return made;
  }

  private poke(): void {
    if (!this.stopped) this.schedule(0);
  }

  private schedule(ms: number): void {
    clearTimeout(this.timer);
    this.timer = setTimeout(this.runTick, ms);
    this.timer.unref();
  }

  private async tick(): Promise<void> {
    if (this.stopped) return;
    // One claim round at a time, so a poke during a round cannot claim past a handler's concurrency.
    if (this.ticking) {
      this.tickAgain = true;
      return;
    }
    this.ticking = this.claimRound();
    await this.ticking;
    this.ticking = undefined;
    if (!this.stopped) this.schedule(this.options.pollMs);
  }

  private async claimRound(): Promise<void> {
    try {
      do {
        this.tickAgain = false;
        for (const [queue, handler] of this.handlers) {
          await this.queueMade(queue);
          await this.claim(queue, handler.concurrency ?? 1, (job, run) => this.execute(queue, handler, job, run));
          await this.claim(exhaustedQueueOf(queue), 1, (job, run) => this.exhaust(queue, handler, job, run));
        }
      } while (this.tickAgain && !this.stopped);
    } catch (error) {
      this.logger.error({ err: error }, 'queue poll failed');
    }
  }

  private async claim(name: string, limit: number, run: (job: Job, run: Run) => Promise<void>): Promise<void> {
    const free = limit - (this.running.get(name) ?? 0);
    if (free <= 0 || this.stopped) return;
    const jobs = await this.boss.fetch<JobData>(name, { batchSize: free, includeMetadata: true });
    for (const job of jobs) this.launch(name, job, run);
  }

  private launch(name: string, job: Job, run: (job: Job, run: Run) => Promise<void>): void {
    this.running.set(name, (this.running.get(name) ?? 0) + 1);
    let startedOn = job.startedOn;
    let beat: Promise<unknown> = Promise.resolve();
    // Renews the claim while the handler runs; a worker that dies stops renewing and pg-boss puts the job back.
    const heartbeat = setInterval(
      () => {
        beat = beat.then(async () => {
          const renewed = await renewPgBossJob(this.db, name, job.id, startedOn).catch(() => startedOn);
          if (renewed) startedOn = renewed;
          else clearInterval(heartbeat);
        });
      },
      Math.max(250, Math.floor((this.options.expireInSeconds * 1000) / 3)),
    );
    heartbeat.unref();
    this.heartbeats.add(heartbeat);
    const stopBeating = async () => {
      clearInterval(heartbeat);
      this.heartbeats.delete(heartbeat);
      await beat;
    };
    const handle: Run = {
      end: async (outcome) => {
        await stopBeating();
        const ours = await whilePgBossJobIsOurs(this.db, name, job.id, startedOn, (trx) => outcome({ db: pgBossExecutor(trx) }));
        if (!ours) this.logger.warn({ queue: name, key: job.data.key }, 'queue job was taken over while it ran here (its claim lapsed); this run leaves it to the other');
      },
    };
    const done = run(job, handle)
      .catch((err: unknown) => this.logger.error({ err, queue: name, key: job.data.key }, 'queue job could not be recorded'))
      .finally(async () => {
        await stopBeating();
        this.running.set(name, (this.running.get(name) ?? 1) - 1);
        this.inFlight.delete(done);
        this.poke();
      });
    this.inFlight.add(done);
  }

  private async execute(queue: string, handler: QueueHandler, job: Job, run: Run): Promise<void> {
    const context: QueueJobContext = { key: job.data.key, attempt: job.retryCount + 1, final: job.retryCount >= job.retryLimit };
    try {
      await handler.run(job.data.payload, context);
    } catch (error) {
      const message = error instanceof Error ? error.message : String(error);
      if (context.final) this.logger.error({ err: error, queue, key: context.key }, 'queue job failed for good');
      else this.logger.warn({ err: error, queue, key: context.key, attempt: context.attempt }, 'queue job failed; it will be retried');
      // pg-boss decides: back to the queue after the backoff, or (last attempt) failed and copied to the exhausted queue.
      await run.end((connection) => this.boss.fail(queue, job.id, { message }, connection));
      return;
    }
    await run.end((connection) => this.boss.complete(queue, job.id, {}, connection));
  }

  /** A job that failed for good (an error on its last attempt, or it expired on it): records that once. */
  private async exhaust(queue: string, handler: QueueHandler, job: Job, run: Run): Promise<void> {
    const output = (job.output ?? {}) as JobOutput;
    const error = new Error(output.message ?? output.value?.message ?? 'the job failed');
    const context: QueueJobContext = { key: job.data.key, attempt: job.retryLimit + 1, final: true };
    if (output.value?.message) this.logger.error({ err: error, queue, key: context.key }, 'queue job failed for good');
    const exhausted = exhaustedQueueOf(queue);
    try {
      await handler.onExhausted?.(job.data.payload, context, error);
    } catch (err) {
      this.logger.error({ err, queue, key: context.key }, 'queue failure could not be recorded');
      await run.end((connection) => this.boss.fail(exhausted, job.id, { message: err instanceof Error ? err.message : String(err) }, connection));
      return;
    }
    await run.end((connection) => this.boss.complete(exhausted, job.id, {}, connection));
  }
}
