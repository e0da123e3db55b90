import type { Kysely } from 'kysely';

// Frozen in time: never edit a migration that has shipped; add a new one.
// A measured rolling circumference in mm; null = computed from the tyre size. Existing vehicles keep null.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('vehicles').addColumn('rolling_circumference_mm', 'double precision').execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('vehicles').dropColumn('rolling_circumference_mm').execute();
}
