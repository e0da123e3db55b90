import { Migrator, type Migration, type MigrationProvider } from 'kysely';
import type { Db } from './client';
import * as foundation from './migrations/2026-12-02-001-foundation';
import * as jobs from './migrations/2026-12-02-002-jobs';
import * as files from './migrations/2026-12-02-003-files';
import * as datalogs from './migrations/2026-12-02-004-datalogs';
import * as billing from './migrations/2026-12-02-005-billing';
import * as boardIndexes from './migrations/2026-12-02-006-board-indexes';
import * as vehicleRollingCircumference from './migrations/2026-12-02-007-vehicle-rolling-circumference';
import * as mailOutbox from './migrations/2026-12-02-008-mail-outbox';
import * as publicPages from './migrations/2026-12-02-009-public-pages';
import * as reports from './migrations/2026-12-02-010-reports';
import * as rentals from './migrations/2026-12-02-011-rentals';
import * as jobListVersions from './migrations/2026-12-02-012-job-list-versions';
import * as revisionDrafts from './migrations/2026-12-02-013-revision-drafts';
import * as paidBeforeDownload from './migrations/2026-12-03-014-paid-before-download';
import * as reportTables from './migrations/2026-12-03-015-report-tables';
import * as kitPhotos from './migrations/2026-12-03-016-kit-photos';
import { PostgresSchemaPlugin, onPostgres } from './migrations/dialect';
import * as sharedState from './migrations/2026-12-03-017-shared-state';
import * as postgresRowSecurity from './migrations/2026-12-03-018-postgres-row-security';
import * as postgresDoublePrecision from './migrations/2026-12-03-019-postgres-double-precision';

/** Migrations are listed here, in order, so bundlers and tsx need no folder scan. */
const MIGRATIONS: Record<string, Migration> = {
  '2026-12-02-001-foundation': foundation,
  '2026-12-02-002-jobs': jobs,
  '2026-12-02-003-files': files,
  '2026-12-02-004-datalogs': datalogs,
  '2026-12-02-005-billing': billing,
  '2026-12-02-006-board-indexes': boardIndexes,
  '2026-12-02-007-vehicle-rolling-circumference': vehicleRollingCircumference,
  '2026-12-02-008-mail-outbox': mailOutbox,
  '2026-12-02-009-public-pages': publicPages,
  '2026-12-02-010-reports': reports,
  '2026-12-02-011-rentals': rentals,
  '2026-12-02-012-job-list-versions': jobListVersions,
  '2026-12-02-013-revision-drafts': revisionDrafts,
  '2026-12-03-014-paid-before-download': paidBeforeDownload,
  '2026-12-03-015-report-tables': reportTables,
  '2026-12-03-016-kit-photos': kitPhotos,
  '2026-12-03-017-shared-state': sharedState,
  '2026-12-03-018-postgres-row-security': postgresRowSecurity,
  '2026-12-03-019-postgres-double-precision': postgresDoublePrecision,
};

const provider: MigrationProvider = { getMigrations: async () => MIGRATIONS };

export async function migrateToLatest(db: Db): Promise<string[]> {
  // Migrations are numbered by the branch that wrote them, not by landing order, so a database may meet a lower number late.
  // On PostgreSQL the schema builder's `integer` columns become `bigint` (SQLite's integer is 64-bit; see dialect.ts).
  const target = onPostgres(db) ? db.withPlugin(new PostgresSchemaPlugin()) : db;
  const migrator = new Migrator({ db: target, provider, allowUnorderedMigrations: true });
  const { error, results } = await migrator.migrateToLatest();
  if (error) throw error instanceof Error ? error : new Error(String(error));
  return (results ?? []).filter((r) => r.status === 'Success').map((r) => r.migrationName);
}
