import fs from 'node:fs';
import path from 'node:path';
import { pino } from 'pino';
import { createDb, migrateToLatest } from '@revloop/db';
import { createApp } from './app';
import { loadEnv } from './env';
import { startSmtpFake } from './fakes/smtp/smtp-fake';
import { SignInThrottle } from './features/auth/sign-in-throttle';
import { createSmtpMailer } from './features/mail/mailer';
import { systemClock } from './http/clock';
import { BlobStore } from './storage/blob-store';

const env = loadEnv();
const logger = pino({ level: env.LOG_LEVEL });

fs.mkdirSync(env.DATA_DIR, { recursive: true });
const db = createDb(path.join(env.DATA_DIR, 'revloop.db'));
await migrateToLatest(db);

const smtp = env.LOCAL_SMTP ? await startSmtpFake({ port: env.SMTP_PORT }) : undefined;
const mailer = createSmtpMailer({ host: env.SMTP_HOST, port: smtp?.port ?? env.SMTP_PORT, from: env.MAIL_FROM });

const app = createApp({
  db,
  env,
  clock: systemClock,
  mailer,
  logger,
  throttle: new SignInThrottle(),
  blobs: new BlobStore(env.DATA_DIR),
  mailbox: smtp?.mailbox,
});
const server = app.listen(env.PORT, env.HOST, () => {
  logger.info({ url: env.APP_ORIGIN, smtpPort: smtp?.port }, 'Revloop is listening');
});

async function shutdown() {
  server.close();
  await smtp?.close();
  await db.destroy();
  process.exit(0);
}
process.on('SIGINT', shutdown);
process.on('SIGTERM', shutdown);
