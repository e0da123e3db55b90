import fs from 'node:fs';
import path from 'node:path';
import { createDb, migrateToLatest } from '@revloop/db';
import { DiskBlobStore, loadEnv } from '@revloop/api';
import { seedDemo } from './demo/seed-demo';

/** Recreates the demo database under DATA_DIR from scratch: migrate, then load the invented scenario. */
const env = loadEnv();
fs.mkdirSync(env.DATA_DIR, { recursive: true });
const file = path.join(env.DATA_DIR, 'revloop.db');
for (const suffix of ['', '-wal', '-shm']) fs.rmSync(file + suffix, { force: true });
fs.rmSync(path.join(env.DATA_DIR, 'files'), { recursive: true, force: true });
const db = createDb(file);
await migrateToLatest(db);
await seedDemo(db, new Date(), { blobs: new DiskBlobStore(env.DATA_DIR) });
await db.destroy();
console.log(`Demo data loaded into ${file}`);
