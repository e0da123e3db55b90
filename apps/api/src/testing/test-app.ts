import fs from 'node:fs';
import { createServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { pino } from 'pino';
import request from 'supertest';
import { createDb, migrateToLatest, snapshotDb, type Db } from '@revloop/db';
import { copyTemplate, testDbUrl, testEngine } from '@revloop/db/testing';
import { createApp } from '../app';
import type { AppDeps } from '../context';
import { loadEnv, type Env } from '../env';
import { startSmtpFake, type Mailbox } from '@revloop/stand-ins/smtp';
import { startStripeFake, type StripeFakeControl } from '@revloop/stand-ins/stripe';
import { SignInThrottle } from '../features/auth/sign-in-throttle';
import { createSmtpMailer } from '../features/mail/mailer';
import type { Clock } from '../http/clock';
import { queueFor } from '../queue/queue-for';
import { DiskBlobStore } from '../storage/blob-store';

export const TEST_ORIGIN = 'http://localhost:8080';
/** Everyone the factories make signs in with this. */
export const TEST_PASSWORD = 'factory-password';

/** A clock the test moves by hand. */
export class FakeClock implements Clock {
  // Starts at the real time: cookie jars in tests drop cookies whose Expires lies in the real past.
  constructor(private t = Date.now()) {}
  now(): Date {
    return new Date(this.t);
  }
  advance(ms: number): void {
    this.t += ms;
  }
}

export interface TestApp {
  app: ReturnType<typeof createApp>;
  /** What the app was built with, for calling services directly. */
  deps: AppDeps;
  db: Db;
  clock: FakeClock;
  env: Env;
  mailbox: Mailbox;
  blobs: DiskBlobStore;
  /** Present when asked for: the local Stripe stand-in, posting signed webhooks to this app on a real port. */
  stripe?: { url: string; control: StripeFakeControl };
  close(): Promise<void>;
}

export const TEST_WEBHOOK_SECRET = 'whsec_revloop_test';

interface MigratedTemplate {
  snapshot: Buffer;
  dataDir: string;
}
let template: Promise<MigratedTemplate> | undefined;

/**
 * The schema is migrated once per test process and every app starts from its own in-memory copy of the empty
 * database; tests add the rows they need with ./factories. The blob store is shared within the process: it is
 * content-addressed, so a test's uploads never change what another reads.
 */
function migratedTemplate(): Promise<MigratedTemplate> {
  template ??= (async () => {
    const db = createDb(':memory:');
    await migrateToLatest(db);
    const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'revloop-api-test-'));
    process.once('exit', () => fs.rmSync(dataDir, { recursive: true, force: true }));
    const snapshot = snapshotDb(db);
    await db.destroy();
    return { snapshot, dataDir };
  })();
  return template;
}

/**
 * The whole API on an empty migrated in-memory database, a fake clock and a live local SMTP mailbox. With `dataDir`,
 * on a database file and a blob store in that folder instead, laid out as the server keeps them, so a test can build
 * rows with the factories and then start the real server on the folder. In the api-pg project each app gets its own
 * copy of the migrated PostgreSQL template (tests/with-postgres.ts).
 */
export async function createTestApp(envOverrides: Record<string, string> = {}, options: { stripe?: boolean; database?: Buffer; dataDir?: string } = {}): Promise<TestApp> {
  const template = await migratedTemplate();
  const dataDir = options.dataDir ?? template.dataDir;
  const onPg = testEngine() === 'postgres';
  if (onPg && options.database) throw new Error('A SQLite snapshot cannot seed a PostgreSQL test database.');
  // With a data folder the database outlives the app (a server is started on it later): on PostgreSQL the copy of the
  // template stays until the test file ends (its address: testDbUrl), on SQLite it is the folder's revloop.db.
  const db = onPg ? await copyTemplate() : createDb(options.dataDir ? path.join(options.dataDir, 'revloop.db') : (options.database ?? template.snapshot));
  if (options.dataDir && !onPg) await migrateToLatest(db);
  const clock = new FakeClock();
  const blobs = new DiskBlobStore(dataDir);
  const smtp = await startSmtpFake();
  // The fake needs the webhook address before the app exists, so the listener opens first and takes the app after.
  const listener = options.stripe ? createServer() : undefined;
  if (listener) await new Promise<void>((resolve) => listener.listen(0, '127.0.0.1', resolve));
  const stripe = listener
    ? await startStripeFake({
        webhookUrl: `http://127.0.0.1:${(listener.address() as AddressInfo).port}/api/stripe/webhook`,
        webhookSecret: TEST_WEBHOOK_SECRET,
        webhookRetryDelaysMs: [20, 40],
      })
    : undefined;
  const env = loadEnv({
    NODE_ENV: 'test',
    STRIPE_WEBHOOK_SECRET: TEST_WEBHOOK_SECRET,
    ...(stripe && { STRIPE_API_URL: stripe.url }),
    APP_ORIGIN: TEST_ORIGIN,
    LOG_LEVEL: 'silent',
    DATA_DIR: dataDir,
    TRUST_PROXY: 'loopback',
    // Cheap password hashes for the factories' people and sign-ups (refused outside NODE_ENV=test, see env.ts).
    TEST_ONLY_HASH_COST: 'low',
    ...envOverrides,
  });
  const mailer = createSmtpMailer({ host: '127.0.0.1', port: smtp.port, from: env.MAIL_FROM });
  const logger = pino({ level: 'silent' });
  // The queue the server would pick (pg-boss on PostgreSQL), polling often and retrying at once so tests stay quick.
  const queue = queueFor(db, onPg ? { DATABASE_URL: testDbUrl(db) } : {}, logger, {
    table: { pollMs: 50, backoffBaseMs: 50 },
    pgBoss: { pollMs: 100, retryDelaySeconds: 0 },
    pgBossOnAppPool: true,
  });
  const deps: AppDeps = {
    db,
    env,
    clock,
    mailer,
    logger,
    queue,
    throttle: new SignInThrottle(db, { now: () => clock.now().getTime() }),
    blobs,
    mailbox: smtp.mailbox,
  };
  const app = createApp(deps);
  queue.start();
  listener?.on('request', app);
  return {
    app,
    deps,
    db,
    clock,
    env,
    mailbox: smtp.mailbox,
    blobs,
    ...(stripe && { stripe: { url: stripe.url, control: stripe.control } }),
    close: async () => {
      await queue.stop();
      await stripe?.close();
      if (listener) {
        listener.closeAllConnections();
        await new Promise<void>((resolve) => listener.close(() => resolve()));
      }
      await smtp.close();
      await db.destroy();
    },
  };
}

/** Signs in and returns an agent that carries the session cookie. */
export async function signIn(app: TestApp['app'], email: string, password = TEST_PASSWORD) {
  const agent = request.agent(app);
  const res = await agent.post('/api/auth/sign-in').send({ email, password });
  if (res.status !== 200) throw new Error(`sign-in for ${email} answered ${res.status}: ${JSON.stringify(res.body)}`);
  return agent;
}

export const sessionCookieOf = (res: { headers: Record<string, unknown> }): string | undefined => {
  const raw = res.headers['set-cookie'];
  const list = Array.isArray(raw) ? (raw as string[]) : typeof raw === 'string' ? [raw] : [];
  return list.find((c) => c.startsWith('revloop_session='))?.split(';')[0];
};

/** Pulls the first link to the app out of the newest mail sent to `to`. */
export function linkFromMail(mailbox: Mailbox, to: string): string {
  const mail = mailbox.list().find((m) => m.to.includes(to));
  if (!mail) throw new Error(`no mail to ${to}`);
  const match = mail.text.match(new RegExp(`${TEST_ORIGIN}\\S+`));
  if (!match) throw new Error(`no link in mail "${mail.subject}"`);
  return match[0];
}
