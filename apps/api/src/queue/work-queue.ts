import { AsyncResource } from 'node:async_hooks';
import { randomUUID } from 'node:crypto';
import type { Logger } from 'pino';
import { claimQueueJob, enqueueQueueJob, extendQueueLease, finishQueueJob, listQueueJobs, type Db, type QueueJobRow } from '@revloop/db';

/** What a handler is told about the job it runs. */
export interface QueueJobContext {
  key: string;
  /** 1 on the first run; a job re-run after a crash or an error counts up. */
  attempt: number;
  /** The last run: the handler's error is final and `onExhausted` follows. */
  final: boolean;
}

export interface QueueHandler {
  /**
   * Does the work. Must be idempotent: a job whose worker died mid-way runs again after its lease lapses, so a
   * handler checks whether its effect is already there (e.g. the log is no longer "processing") before acting.
   */
  run(payload: unknown, job: QueueJobContext): Promise<void>;
  /** Called once when the last attempt failed, to record the failure where people see it. */
  onExhausted?(payload: unknown, job: QueueJobContext, error: unknown): Promise<void>;
  maxAttempts?: number;
  /** Jobs of this queue one instance runs at once. */
  concurrency?: number;
}

/**
 * A durable work queue: jobs are rows that outlive the process, claimed with a lease, retried with backoff, and run
 * once in effect (idempotent handlers; one unfinished job per key). `TableQueue` keeps them in the app's own
 * database and runs them in this process (SQLite); `PgBossQueue` (pg-boss-queue.ts) runs on PostgreSQL. `queueFor`
 * picks one (docs/decisions/014).
 */
export interface WorkQueue {
  register(queue: string, handler: QueueHandler): void;
  /** Adds a job unless one with this key is already queued or running; true when added. */
  enqueue(queue: string, key: string, payload: unknown): Promise<boolean>;
  start(): void;
  stop(): Promise<void>;
  /** Settles when no job with these keys is queued or running any more (tests and start-up recovery wait on it). */
  settled(queue: string, keys: string[], timeoutMs?: number): Promise<void>;
}

export interface TableQueueOptions {
  /** How long a claim holds before another worker may take the job over. */
  leaseMs?: number;
  pollMs?: number;
  /** Delay before retry n (1-based): base × 2^(n-1). */
  backoffBaseMs?: number;
  now?: () => Date;
}

export class TableQueue implements WorkQueue {
  readonly worker = `${process.pid}-${randomUUID().slice(0, 8)}`;
  private readonly handlers = new Map<string, QueueHandler>();
  private readonly running = new Map<string, number>();
  private readonly inFlight = new Set<Promise<void>>();
  private timer: NodeJS.Timeout | undefined;
  /**
   * Claim rounds run in the async context the queue was made in (server start-up), not in that of the request whose
   * enqueue woke them: a job must not inherit a request's shop scope (packages/db's per-context scope).
   */
  private readonly runTick = AsyncResource.bind(() => void this.tick());
  private stopped = true;
  private readonly leaseMs: number;
  private readonly pollMs: number;
  private readonly backoffBaseMs: number;
  private readonly now: () => Date;

  constructor(
    private readonly db: Db,
    private readonly logger: Logger,
    options: TableQueueOptions = {},
  ) {
    this.leaseMs = options.leaseMs ?? 30_000;
    this.pollMs = options.pollMs ?? 250;
    this.backoffBaseMs = options.backoffBaseMs ?? 2_000;
    this.now = options.now ?? (() => new Date());
  }

  register(queue: string, handler: QueueHandler): void {
    this.handlers.set(queue, handler);
  }

  async enqueue(queue: string, key: string, payload: unknown): Promise<boolean> {
    const handler = this.handlers.get(queue);
    const added = await enqueueQueueJob(this.db, { queue, key, payload, maxAttempts: handler?.maxAttempts ?? 5, at: this.now() });
    if (added) this.poke();
    return added;
  }

  start(): void {
    if (!this.stopped) return;
    this.stopped = false;
    this.schedule(0);
  }

  async stop(): Promise<void> {
    this.stopped = true;
    clearTimeout(this.timer);
    await Promise.allSettled([...this.inFlight]);
  }

  async settled(queue: string, keys: string[], timeoutMs = 120_000): Promise<void> {
    const deadline = Date.now() + timeoutMs;
    const wanted = new Set(keys);
    for (;;) {
      const open = (await listQueueJobs(this.db, queue, ['queued', 'running'])).filter((j) => wanted.has(j.key));
      if (open.length === 0) return;
      if (Date.now() > deadline) throw new Error(`queue ${queue}: ${open.length} job(s) still open`);
      await new Promise((r) => setTimeout(r, 50));
    }
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
    try {
      for (const [queue, handler] of this.handlers) {
        while ((this.running.get(queue) ?? 0) < (handler.concurrency ?? 1)) {
          const now = this.now();
          const job = await claimQueueJob(this.db, queue, this.worker, now, new Date(now.getTime() + this.leaseMs));
          if (!job) break;
          this.launch(queue, handler, job);
        }
      }
    } catch (error) {
      this.logger.error({ err: error }, 'queue poll failed');
    }
    if (!this.stopped) this.schedule(this.pollMs);
  }

  private launch(queue: string, handler: QueueHandler, job: QueueJobRow): void {
    this.running.set(queue, (this.running.get(queue) ?? 0) + 1);
    const run = this.execute(handler, job)
      .catch((err: unknown) => this.logger.error({ err, queue, key: job.key }, 'queue job could not be recorded'))
      .finally(() => {
      this.running.set(queue, (this.running.get(queue) ?? 1) - 1);
      this.inFlight.delete(run);
      this.poke();
    });
    this.inFlight.add(run);
  }

  private async execute(handler: QueueHandler, job: QueueJobRow): Promise<void> {
    const context: QueueJobContext = { key: job.key, attempt: job.attempts, final: job.attempts >= job.max_attempts };
    const payload: unknown = JSON.parse(job.payload);
    // Renews the lease while the handler runs; a worker that dies stops renewing and the job is taken over.
    const heartbeat = setInterval(() => {
      extendQueueLease(this.db, job.id, this.worker, new Date(this.now().getTime() + this.leaseMs)).catch(() => undefined);
    }, Math.max(1_000, Math.floor(this.leaseMs / 3)));
    heartbeat.unref();
    try {
      if (job.attempts > job.max_attempts) throw new Error('gave up: too many attempts (the job was cut off every time)');
      await handler.run(payload, context);
      await finishQueueJob(this.db, job.id, this.worker, { state: 'done' }, this.now());
    } catch (error) {
      const message = error instanceof Error ? error.message : String(error);
      if (context.final || job.attempts > job.max_attempts) {
        this.logger.error({ err: error, queue: job.queue, key: job.key }, 'queue job failed for good');
        await handler.onExhausted?.(payload, { ...context, final: true }, error).catch((err: unknown) => this.logger.error({ err }, 'queue failure could not be recorded'));
        await finishQueueJob(this.db, job.id, this.worker, { state: 'failed', error: message }, this.now());
      } else {
        const retryAt = new Date(this.now().getTime() + this.backoffBaseMs * 2 ** (job.attempts - 1));
        this.logger.warn({ err: error, queue: job.queue, key: job.key, retryAt }, 'queue job failed; it will be retried');
        await finishQueueJob(this.db, job.id, this.worker, { state: 'queued', error: message, retryAt }, this.now());
      }
    } finally {
      clearInterval(heartbeat);
    }
  }
}
