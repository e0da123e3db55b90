// Vitest global setup of the PostgreSQL projects (db-pg, api-pg, api-crash-pg): one throwaway cluster for the whole
// run, in a temp folder, reached over a unix socket in that folder (no TCP port), removed afterwards. It migrates one
// template database as the app's role; each test database is a copy of it (CREATE DATABASE … TEMPLATE, see
// packages/db/src/testing/postgres.ts). Vitest calls a global setup once per project, all before the first test and
// all teardowns after the last, in one process: the first call starts the cluster, later ones share it, and the last
// teardown stops it.
//
// PG_TEST_URL=postgres://admin:pw@host:5432/postgres points the run at an existing server instead: the admin role
// there must be allowed to create roles and databases. The run creates the role revloop_test_app and databases named
// revloop_test_*, and drops the databases it made.
import { execFileSync } from 'node:child_process';
import { chownSync, existsSync, mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import pg from 'pg';
import PgBoss from 'pg-boss';
import { createDb, migrateToLatest, pgBossExecutor, PG_BOSS_SCHEMA } from '../packages/db/src/index';

export const APP_ROLE = 'revloop_test_app';
const APP_PASSWORD = 'revloop_test_app';
const TEMPLATE = 'revloop_test_template';

function postgresBin(name: string): string {
  const root = '/usr/lib/postgresql';
  const versions = existsSync(root) ? readdirSync(root).sort((a, b) => Number(b) - Number(a)) : [];
  for (const v of versions) {
    const file = path.join(root, v, 'bin', name);
    if (existsSync(file)) return file;
  }
  return name; // on PATH
}

/** Runs a server program as the `postgres` user when we are root (initdb and postgres refuse root). */
function runAsServerUser(file: string, args: string[]): void {
  const asRoot = process.getuid?.() === 0;
  if (asRoot) execFileSync('runuser', ['-u', 'postgres', '--', file, ...args], { stdio: 'pipe' });
  else execFileSync(file, args, { stdio: 'pipe' });
}

export interface Cluster {
  adminUrl: string;
  appUrl: (database: string) => string;
  stop: () => void;
}

/** A throwaway cluster in a temp folder (unix socket only); stop() shuts it down and removes the folder. */
export function startCluster(): Cluster {
  const dir = mkdtempSync(path.join(tmpdir(), 'revloop-pg-'));
  if (process.getuid?.() === 0) {
    const uid = Number(execFileSync('id', ['-u', 'postgres']).toString().trim());
    const gid = Number(execFileSync('id', ['-g', 'postgres']).toString().trim());
    chownSync(dir, uid, gid);
  }
  const data = path.join(dir, 'data');
  runAsServerUser(postgresBin('initdb'), ['-D', data, '-U', 'postgres', '-A', 'trust', '--no-sync', '-E', 'UTF8', '--locale=C']);
  // Durability is not wanted from a cluster that is deleted after the run.
  const options = `-k ${dir} -c listen_addresses= -c fsync=off -c synchronous_commit=off -c full_page_writes=off -c max_connections=200`;
  runAsServerUser(postgresBin('pg_ctl'), ['-D', data, '-o', options, '-l', path.join(dir, 'server.log'), '-w', 'start']);
  const host = encodeURIComponent(dir);
  return {
    adminUrl: `postgres://postgres@${host}/postgres`,
    appUrl: (database) => `postgres://${APP_ROLE}@${host}/${database}`,
    stop: () => {
      try {
        runAsServerUser(postgresBin('pg_ctl'), ['-D', data, '-m', 'immediate', 'stop']);
      } finally {
        rmSync(dir, { recursive: true, force: true });
      }
    },
  };
}

function existingServer(url: string): Cluster {
  const base = new URL(url);
  return {
    adminUrl: url,
    appUrl: (database) => {
      const u = new URL(url);
      u.username = APP_ROLE;
      u.password = APP_PASSWORD;
      u.pathname = `/${database}`;
      return u.toString();
    },
    stop: () => void base,
  };
}

async function admin<T>(url: string, work: (client: pg.Client) => Promise<T>): Promise<T> {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    return await work(client);
  } finally {
    await client.end();
  }
}

interface Shared {
  ready: Promise<() => Promise<void>>;
  users: number;
}
const SHARED = Symbol.for('revloop.tests.with-postgres');

export default async function setup(): Promise<() => Promise<void>> {
  const holder = globalThis as { [SHARED]?: Shared };
  const shared = (holder[SHARED] ??= { ready: startAndMigrate(), users: 0 });
  shared.users += 1;
  const stop = await shared.ready;
  return async () => {
    shared.users -= 1;
    if (shared.users > 0) return;
    delete holder[SHARED];
    await stop();
  };
}

/** Starts the cluster (or reaches PG_TEST_URL), migrates the template, sets the addresses; resolves with its teardown. */
async function startAndMigrate(): Promise<() => Promise<void>> {
  const cluster = process.env.PG_TEST_URL ? existingServer(process.env.PG_TEST_URL) : startCluster();
  const run = `${process.pid}`;
  const template = `${TEMPLATE}_${run}`;
  await admin(cluster.adminUrl, async (c) => {
    // The app's role: no superuser and no BYPASSRLS, so row-level security applies to it (FORCE covers ownership).
    const { rowCount } = await c.query('select 1 from pg_roles where rolname = $1', [APP_ROLE]);
    if (!rowCount) await c.query(`create role ${APP_ROLE} login nosuperuser nobypassrls password '${APP_PASSWORD}'`);
    await c.query(`drop database if exists ${template}`);
    await c.query(`create database ${template} owner ${APP_ROLE}`);
  });
  const db = createDb(cluster.appUrl(template), { poolSize: 1 });
  try {
    await migrateToLatest(db);
    // pg-boss's schema, as a server on PostgreSQL creates it at its first start (PgBossQueue). It is made here because
    // the copies belong to the admin role, where the app's role may not create a schema; in the template it may.
    const boss = new PgBoss({ db: pgBossExecutor(db), schema: PG_BOSS_SCHEMA, migrate: true, supervise: false, schedule: false });
    await boss.start();
    await boss.stop({ graceful: false, close: false });
  } finally {
    await db.destroy();
  }
  process.env.REVLOOP_PG_TEST_ADMIN_URL = cluster.adminUrl;
  process.env.REVLOOP_PG_TEST_APP_URL = cluster.appUrl('{database}');
  process.env.REVLOOP_PG_TEST_TEMPLATE = template;
  return async () => {
    try {
      if (process.env.PG_TEST_URL) {
        await admin(cluster.adminUrl, async (c) => {
          const { rows } = await c.query<{ datname: string }>('select datname from pg_database where datname like $1', [`revloop_test_%_${run}%`]);
          for (const { datname } of rows) await c.query(`drop database if exists ${datname} with (force)`);
          await c.query(`drop database if exists ${template} with (force)`);
        });
      }
    } finally {
      cluster.stop();
    }
  };
}
