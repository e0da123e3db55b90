import type { Logger } from 'pino';
import type { Db } from '@revloop/db';
import type { Env } from './env';
import type { Mailbox } from '@revloop/stand-ins/smtp';
import type { SignInThrottle } from './features/auth/sign-in-throttle';
import type { Mailer } from './features/mail/mailer';
import type { Clock } from './http/clock';
import type { WorkQueue } from './queue/work-queue';
import type { BlobStore } from './storage/blob-store';

// The app's dependencies live apart from app.ts, which imports every router: routers and services type against this module.
export interface AppDeps {
  db: Db;
  env: Env;
  clock: Clock;
  mailer: Mailer;
  logger: Logger;
  throttle: SignInThrottle;
  /** Content-addressed file storage: DATA_DIR/files or an S3-compatible bucket (BLOB_STORE). */
  blobs: BlobStore;
  /** The durable work queue (log analysis, mail): jobs survive a crash and run on any instance. */
  queue: WorkQueue;
  /** Present when the local SMTP stand-in runs: exposes the development mailbox page. */
  mailbox?: Mailbox | undefined;
}
