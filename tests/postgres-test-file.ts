// Setup file of the PostgreSQL test projects: each test file drops the databases it made when it ends.
import { afterAll } from 'vitest';
import { dropTestDbs } from '../packages/db/src/testing/postgres';

afterAll(async () => {
  await dropTestDbs();
});
