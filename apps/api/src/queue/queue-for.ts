import type { Logger } from 'pino';
import { isPostgresUrl, type Db } from '@revloop/db';
import type { Env } from '../env';
import { PgBossQueue, type PgBossQueueOptions } from './pg-boss-queue';
import { TableQueue, type TableQueueOptions, type WorkQueue } from './work-queue';

/**
 * The one place that picks the work queue (docs/decisions/014): pg-boss on PostgreSQL (DATABASE_URL), the table queue
 * in the app's own database on SQLite.
 */
export function queueFor(
  db: Db,
  env: Pick<Env, 'DATABASE_URL'>,
  logger: Logger,
  /** `pgBossOnAppPool`: pg-boss shares `db`'s pool instead of opening its own (test apps: fewer connections to open). */
  options: { pgBoss?: PgBossQueueOptions; pgBossOnAppPool?: boolean; table?: TableQueueOptions } = {},
): WorkQueue {
  if (env.DATABASE_URL && isPostgresUrl(env.DATABASE_URL)) return new PgBossQueue(options.pgBossOnAppPool ? db : env.DATABASE_URL, logger, options.pgBoss);
  return new TableQueue(db, logger, options.table);
}
