import fs from 'node:fs';
import { pino } from 'pino';
import { createDb, migrateToLatest } from '@revloop/db';
import { createApp } from './app';
import type { AppDeps } from './context';
import { loadEnv } from './env';
import { startSmtpFake } from '@revloop/stand-ins/smtp';
import { startStripeFake } from '@revloop/stand-ins/stripe';
import { applyBillingDeadlines } from './features/billing/subscription.service';
import { SignInThrottle } from './features/auth/sign-in-throttle';
import { createSmtpMailer } from './features/mail/mailer';
import { MAIL_QUEUE } from './features/mail/mail-outbox.service';
import { recoverAtStartup } from './features/recovery/recover.service';
import { systemClock } from './http/clock';
import { queueFor } from './queue/queue-for';
import { runRentalSweep } from './features/rentals/rental-notices';
import { blobStoreOf } from './storage/blob-store-of';
import { loadSharedSecrets } from './storage/shared-secrets';
import { warmAnalysisWorker } from './workers/datalog/analyze-file';

const env = loadEnv();
const logger = pino({ level: env.LOG_LEVEL });

fs.mkdirSync(env.DATA_DIR, { recursive: true });
// PostgreSQL when DATABASE_URL is set, else SQLite (SQLITE_FILE, by default DATA_DIR/revloop.db). Instances starting
// together migrate one at a time (the migrator holds a lock); deploys may run `npm run migrate` first instead.
const db = createDb(env.DATABASE_URL ?? env.SQLITE_FILE);
await migrateToLatest(db);
// Every instance signs file links and device cookies with the same keys, kept in the database.
const secrets = await loadSharedSecrets(db, env, new Date());

const smtp = env.LOCAL_SMTP ? await startSmtpFake({ port: env.SMTP_PORT }) : undefined;
const mailer = createSmtpMailer({ host: env.SMTP_HOST, port: smtp?.port ?? env.SMTP_PORT, from: env.MAIL_FROM });

// The local Stripe stand-in: the real SDK is pointed at it and it posts signed webhooks back to this server.
const stripeFake = env.LOCAL_STRIPE
  ? await startStripeFake({
      port: env.STRIPE_FAKE_PORT ?? env.PORT + 1,
      webhookUrl: `http://127.0.0.1:${env.PORT}/api/stripe/webhook`,
      webhookSecret: env.STRIPE_WEBHOOK_SECRET,
      logger: (msg) => logger.warn(msg),
    })
  : undefined;

// pg-boss on PostgreSQL, the table queue on SQLite; every instance works the queue.
const queue = queueFor(db, env, logger);
const deps: AppDeps = {
  db,
  queue,
  env: { ...env, FILE_LINK_SECRET: secrets.fileLink, ...(stripeFake && { STRIPE_API_URL: stripeFake.url }) },
  clock: systemClock,
  mailer,
  logger,
  throttle: new SignInThrottle(db, { deviceKey: secrets.signInDevice }),
  blobs: blobStoreOf(env),
  mailbox: smtp?.mailbox,
};
const app = createApp(deps);
// Before the first request: nothing is in flight, so leftovers of a crash can be told from live work.
await recoverAtStartup(deps);
queue.start();
const server = app.listen(env.PORT, env.HOST, () => {
  logger.info({ url: env.APP_ORIGIN, smtpPort: smtp?.port, stripeFake: stripeFake?.url }, 'Revloop is listening');
});
// The first uploaded log should not wait for a thread to start either.
warmAnalysisWorker();
// Trials and grace periods also end when no webhook arrives: check them hourly.
const billingSweep = setInterval(() => {
  applyBillingDeadlines(deps).catch((err: unknown) => logger.error({ err }, 'billing deadline check failed'));
}, 3_600_000);

// Rental deposit holds are re-placed before they lapse and reminders go out on the shop's days: check hourly.
const rentalSweep = setInterval(() => {
  runRentalSweep(deps).catch((err: unknown) => logger.error({ err }, 'rental sweep failed'));
}, 3_600_000);

// Mail a crashed or failed drain left in the outbox goes out from whichever instance takes this job.
const mailSweep = setInterval(() => {
  queue.enqueue(MAIL_QUEUE, 'sweep', null).catch((err: unknown) => logger.error({ err }, 'mail sweep could not be queued'));
}, 60_000);

async function shutdown() {
  clearInterval(mailSweep);
  server.close();
  await queue.stop();
  clearInterval(billingSweep);
  clearInterval(rentalSweep);
  await stripeFake?.close();
  await smtp?.close();
  await db.destroy();
  process.exit(0);
}
process.on('SIGINT', shutdown);
process.on('SIGTERM', shutdown);
