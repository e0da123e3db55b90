import { AsyncLocalStorage } from 'node:async_hooks';
import { randomBytes } from 'node:crypto';
import { pino } from 'pino';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { sql } from 'kysely';
import { createDb } from '@revloop/db';
import { copyTemplate, testDbUrl, testEngine } from '@revloop/db/testing';
import { PgBossQueue, type PgBossQueueOptions } from './pg-boss-queue';
import type { QueueJobContext } from './work-queue';

// The PostgreSQL queue against a real database (the api-pg project); the SQLite projects skip it (TableQueue is
// theirs). One database for the file; every test uses queues of its own name. Timings are cut short through the
// options: claims expire after 1 s, the supervisor runs every second, retries wait 1–2 s.

const logger = pino({ level: 'silent' });
const FAST: PgBossQueueOptions = { pollMs: 100, expireInSeconds: 1, maintenanceIntervalSeconds: 1, retryDelaySeconds: 1, stopTimeoutMs: 5_000, poolSize: 3 };

let url: string;
const queues: PgBossQueue[] = [];
const newQueue = (options: PgBossQueueOptions = {}) => {
  const queue = new PgBossQueue(url, logger, { ...FAST, ...options });
  queues.push(queue);
  return queue;
};
const queueName = () => `test-${randomBytes(4).toString('hex')}`;

describe.skipIf(testEngine() !== 'postgres')('PgBossQueue (pg-boss on PostgreSQL)', () => {
  beforeAll(async () => {
    url = testDbUrl(await copyTemplate());
  });

  afterEach(async () => {
    await Promise.all(queues.splice(0).map((q) => q.stop()));
  });

  afterAll(async () => {
    await Promise.all(queues.splice(0).map((q) => q.stop()));
  });

  it('runs a job once, with its payload and key, and settles', async () => {
    const queue = newQueue();
    const name = queueName();
    const runs: Array<{ payload: unknown; job: QueueJobContext }> = [];
    queue.register(name, { maxAttempts: 3, run: async (payload, job) => void runs.push({ payload, job }) });
    queue.start();
    expect(await queue.enqueue(name, 'k1', { n: 1 })).toBe(true);
    await queue.settled(name, ['k1'], 10_000);
    expect(runs).toEqual([{ payload: { n: 1 }, job: { key: 'k1', attempt: 1, final: false } }]);
  });

  it('adds one job per key while one is open, also when enqueued at once, and a new one after it ended', async () => {
    const queue = newQueue();
    const name = queueName();
    const runs: string[] = [];
    queue.register(name, { concurrency: 2, run: async (_p, job) => void runs.push(job.key) });
    // Not started yet, so the first job stays open.
    expect(await queue.enqueue(name, 'same', null)).toBe(true);
    expect(await queue.enqueue(name, 'same', null)).toBe(false);
    expect(await queue.enqueue(name, 'other', null)).toBe(true);
    const together = await Promise.all(Array.from({ length: 6 }, () => queue.enqueue(name, 'race', null)));
    expect(together.filter(Boolean)).toHaveLength(1);
    queue.start();
    await queue.settled(name, ['same', 'other', 'race'], 10_000);
    expect(runs.sort()).toEqual(['other', 'race', 'same']);
    expect(await queue.enqueue(name, 'same', null)).toBe(true);
    await queue.settled(name, ['same'], 10_000);
    expect(runs.filter((k) => k === 'same')).toHaveLength(2);
  });

  it("runs at most the handler's concurrency at once on an instance", async () => {
    const queue = newQueue();
    const name = queueName();
    let now = 0;
    let most = 0;
    queue.register(name, {
      concurrency: 2,
      run: async () => {
        most = Math.max(most, ++now);
        await new Promise((r) => setTimeout(r, 300));
        now -= 1;
      },
    });
    const keys = ['c1', 'c2', 'c3', 'c4', 'c5'];
    for (const key of keys) await queue.enqueue(name, key, null);
    queue.start();
    await queue.settled(name, keys, 10_000);
    expect(most).toBe(2);
  });

  it('runs a job outside the async context of the request that enqueued it', async () => {
    const requestScope = new AsyncLocalStorage<string>();
    const queue = newQueue();
    const name = queueName();
    const seen: Array<string | undefined> = [];
    queue.register(name, { run: async () => void seen.push(requestScope.getStore()) });
    queue.start();
    await requestScope.run('shop-a request', () => queue.enqueue(name, 'scoped', null));
    await queue.settled(name, ['scoped'], 10_000);
    expect(seen).toEqual([undefined]);
  });

  it('retries a failed job after a backoff, then succeeds without calling onExhausted', async () => {
    const queue = newQueue();
    const name = queueName();
    const attempts: Array<{ attempt: number; final: boolean; at: number }> = [];
    let exhausted = 0;
    queue.register(name, {
      maxAttempts: 3,
      run: async (_p, job) => {
        attempts.push({ attempt: job.attempt, final: job.final, at: Date.now() });
        if (job.attempt === 1) throw new Error('first try fails');
      },
      onExhausted: async () => void (exhausted += 1),
    });
    queue.start();
    await queue.enqueue(name, 'k', null);
    await queue.settled(name, ['k'], 15_000);
    expect(attempts.map(({ attempt, final }) => ({ attempt, final }))).toEqual([
      { attempt: 1, final: false },
      { attempt: 2, final: false },
    ]);
    // pg-boss's first retry waits between retryDelay and twice that (1–2 s here).
    expect(attempts[1]!.at - attempts[0]!.at).toBeGreaterThanOrEqual(900);
    expect(exhausted).toBe(0);
  });

  it('calls onExhausted once after the last attempt fails, and settled waits for it', async () => {
    const queue = newQueue();
    const name = queueName();
    const attempts: number[] = [];
    const exhausted: Array<{ payload: unknown; job: QueueJobContext; message: string }> = [];
    queue.register(name, {
      maxAttempts: 2,
      run: async (_p, job) => {
        attempts.push(job.attempt);
        throw new Error(`broken on ${job.attempt}`);
      },
      onExhausted: async (payload, job, error) => void exhausted.push({ payload, job, message: (error as Error).message }),
    });
    queue.start();
    await queue.enqueue(name, 'k', { log: 'x' });
    await queue.settled(name, ['k'], 15_000);
    expect(attempts).toEqual([1, 2]);
    expect(exhausted).toEqual([{ payload: { log: 'x' }, job: { key: 'k', attempt: 2, final: true }, message: 'broken on 2' }]);
    await new Promise((r) => setTimeout(r, 500));
    expect(exhausted).toHaveLength(1);
  });

  it('hands a job whose instance stopped mid-run to another instance once its claim expires', async () => {
    const name = queueName();
    let release: () => void = () => undefined;
    let startedOnA: () => void = () => undefined;
    const onA = new Promise<void>((resolve) => (startedOnA = resolve));
    const a = newQueue({ stopTimeoutMs: 100 });
    a.register(name, {
      run: async () => {
        startedOnA();
        await new Promise<void>((resolve) => (release = resolve));
      },
    });
    const ranOnB: QueueJobContext[] = [];
    const b = newQueue();
    b.register(name, { run: async (_p, job) => void ranOnB.push(job) });
    a.start();
    expect(await a.enqueue(name, 'held', null)).toBe(true);
    await onA;
    // A "crashes": it stops renewing its claim and leaves the job running (stop gives up on the handler after 100 ms).
    await a.stop();
    b.start();
    const t0 = Date.now();
    await b.settled(name, ['held'], 15_000);
    release();
    expect(ranOnB).toEqual([{ key: 'held', attempt: 2, final: false }]);
    expect(Date.now() - t0).toBeLessThan(12_000);
  });

  it('calls onExhausted on another instance when the last attempt was cut off by a stopped instance', async () => {
    const name = queueName();
    let startedOnA: () => void = () => undefined;
    const onA = new Promise<void>((resolve) => (startedOnA = resolve));
    const a = newQueue({ stopTimeoutMs: 100 });
    a.register(name, { maxAttempts: 1, run: () => (startedOnA(), new Promise<void>(() => undefined)) });
    const exhaustedOnB: Array<{ job: QueueJobContext; message: string }> = [];
    const b = newQueue();
    b.register(name, {
      maxAttempts: 1,
      run: async () => {
        throw new Error('B should not run it: it had one attempt');
      },
      onExhausted: async (_p, job, error) => void exhaustedOnB.push({ job, message: (error as Error).message }),
    });
    a.start();
    await a.enqueue(name, 'cut', null);
    await onA;
    await a.stop();
    b.start();
    await b.settled(name, ['cut'], 15_000);
    expect(exhaustedOnB).toEqual([{ job: { key: 'cut', attempt: 1, final: true }, message: expect.stringMatching(/timeout/) }]);
  });

  it('a run whose claim lapsed does not end the job that another instance now runs', async () => {
    const name = queueName();
    const raw = createDb(url, { poolSize: 1 });
    const stateOf = async () => (await sql<{ state: string }>`select state::text as state from pgboss.job where name = ${name}`.execute(raw)).rows.map((r) => r.state);
    let releaseA: () => void = () => undefined;
    let releaseB: () => void = () => undefined;
    let startedOnA: () => void = () => undefined;
    let startedOnB: () => void = () => undefined;
    const onA = new Promise<void>((resolve) => (startedOnA = resolve));
    const onB = new Promise<void>((resolve) => (startedOnB = resolve));
    const attemptsOnB: number[] = [];
    const a = newQueue();
    a.register(name, { run: () => (startedOnA(), new Promise<void>((resolve) => (releaseA = resolve))) });
    const b = newQueue();
    b.register(name, { run: (_p, job) => (attemptsOnB.push(job.attempt), startedOnB(), new Promise<void>((resolve) => (releaseB = resolve))) });
    try {
      a.start();
      await a.enqueue(name, 'lapsed', null);
      await onA;
      // A's claim lapses as if its heartbeat had stalled past the expiry; the supervisor puts the job back and B takes it.
      await sql`update pgboss.job set started_on = now() - interval '1 minute' where name = ${name}`.execute(raw);
      b.start();
      await onB;
      releaseA();
      await new Promise((r) => setTimeout(r, 500));
      expect(await stateOf()).toEqual(['active']);
      releaseB();
      await b.settled(name, ['lapsed'], 10_000);
      expect(await stateOf()).toEqual(['completed']);
      expect(attemptsOnB).toEqual([2]);
    } finally {
      releaseA();
      releaseB();
      await raw.destroy();
    }
  });

  it('keeps a job that runs longer than its expiry on its instance (the heartbeat renews the claim)', async () => {
    const name = queueName();
    // Claims of 2 s renewed every 0.67 s; the handler runs 3.5 s, through at least one supervisor round.
    const a = newQueue({ expireInSeconds: 2 });
    const b = newQueue({ expireInSeconds: 2 });
    const runs: string[] = [];
    const slow = (who: string) => async () => {
      runs.push(who);
      await new Promise((r) => setTimeout(r, 3_500));
    };
    a.register(name, { run: slow('a') });
    b.register(name, { run: slow('b') });
    a.start();
    await a.enqueue(name, 'slow', null);
    b.start();
    await a.settled(name, ['slow'], 15_000);
    expect(runs).toEqual(['a']);
  });

  it('two instances starting together on a database without the pgboss schema create it once and both work', async () => {
    // A database where the app's role may create schemas (as the deploy guide's owner may), without pgboss yet.
    const name = new URL(url).pathname.slice(1);
    const admin = createDb(process.env.REVLOOP_PG_TEST_ADMIN_URL!.replace(/\/postgres$/, `/${name}`), { poolSize: 1 });
    try {
      await sql`drop schema pgboss cascade`.execute(admin);
      await sql`grant create on database ${sql.id(name)} to ${sql.id(new URL(url).username)}`.execute(admin);
    } finally {
      await admin.destroy();
    }
    const queue = queueName();
    const ran: string[] = [];
    const [a, b] = [newQueue(), newQueue()];
    a.register(queue, { run: async (_p, job) => void ran.push(`a:${job.key}`) });
    b.register(queue, { run: async (_p, job) => void ran.push(`b:${job.key}`) });
    const added = await Promise.all([a.enqueue(queue, 'one', null), b.enqueue(queue, 'one', null), b.enqueue(queue, 'two', null)]);
    expect(added.filter(Boolean)).toHaveLength(2);
    a.start();
    b.start();
    await a.settled(queue, ['one', 'two'], 10_000);
    expect(ran.map((r) => r.slice(2)).sort()).toEqual(['one', 'two']);
  });

  it('settled gives up with an error when a job stays open past its timeout', async () => {
    const queue = newQueue();
    const name = queueName();
    queue.register(name, { run: async () => undefined });
    await queue.enqueue(name, 'waiting', null);
    await expect(queue.settled(name, ['waiting'], 200)).rejects.toThrow(/still open/);
    queue.start();
    await queue.settled(name, ['waiting'], 10_000);
  });
});
