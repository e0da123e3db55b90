import { createDb, snapshotDb } from '@revloop/db';
// Transitional, until the job, file and billing API tests are on the factories: the last API code that reads the
// demo, so the import rules flag it on purpose. Delete this file with the last user.
// eslint-disable-next-line import-x/no-restricted-paths -- transitional: the last API tests on the demo (see the comment above); delete with this file.
import { seedDemo, type DemoIds } from '../../../../seeds/demo/seed-demo';
// eslint-disable-next-line import-x/no-restricted-paths -- transitional, as above.
export type { SeededJob } from '../../../../seeds/demo/jobs-scenario';
// eslint-disable-next-line import-x/no-restricted-paths -- transitional, as above.
export { DEMO_PASSWORD, KESTREL } from '../../../../seeds/demo/people';
export { seedDemo, type DemoIds };
import { hashPassword } from '../features/auth/password';
import { DiskBlobStore } from '../storage/blob-store';
import { createTestApp, migratedTemplate, TEST_PASSWORD, type TestApp } from './test-app';

let demo: Promise<{ snapshot: Buffer; ids: DemoIds }> | undefined;

/** The test app on a copy of the demo scenario, seeded once per process; everyone signs in with TEST_PASSWORD. */
export async function createDemoTestApp(envOverrides: Record<string, string> = {}, options: { stripe?: boolean } = {}): Promise<TestApp & { ids: DemoIds }> {
  demo ??= (async () => {
    const { snapshot, dataDir } = await migratedTemplate();
    const db = createDb(snapshot);
    const ids = await seedDemo(db, new Date(), { blobs: new DiskBlobStore(dataDir) });
    await db.updateTable('users').set({ password_hash: await hashPassword(TEST_PASSWORD) }).execute();
    const seeded = snapshotDb(db);
    await db.destroy();
    return { snapshot: seeded, ids };
  })();
  const { snapshot, ids } = await demo;
  return { ...(await createTestApp(envOverrides, { ...options, database: snapshot })), ids };
}
