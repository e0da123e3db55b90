// `npm run migrate`: brings the database to the latest schema and exits, the deploy step before API instances start
// (docs/deploy.md). PostgreSQL when DATABASE_URL is set, else SQLite in DATA_DIR/revloop.db; prints what it applied.
// Exit 0 when the schema is current, 1 with the error on stderr.
import fs from 'node:fs';
import path from 'node:path';
import { createDb, migrateToLatest } from '@revloop/db';
import { loadEnv } from '../env';

const env = loadEnv();
if (!env.DATABASE_URL) fs.mkdirSync(env.DATA_DIR, { recursive: true });
const db = createDb(env.DATABASE_URL ?? path.join(env.DATA_DIR, 'revloop.db'), { poolSize: 1 });
try {
  const applied = await migrateToLatest(db);
  process.stdout.write(applied.length ? `Applied ${applied.length} migration(s):\n${applied.map((m) => `  ${m}\n`).join('')}` : 'Schema is current.\n');
} catch (error) {
  process.stderr.write(`Migration failed: ${error instanceof Error ? error.message : String(error)}\n`);
  process.exitCode = 1;
} finally {
  await db.destroy();
}
