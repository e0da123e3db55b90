import { sql, type Kysely } from 'kysely';
import { onPostgres } from './dialect';

// Frozen in time: never edit a migration that has shipped; add a new one.
// Shop reports over a date range at 10,000 jobs per shop: each report reads only the rows of its range, in index order.
export async function up(db: Kysely<any>): Promise<void> {
  // Job moves (turnaround, rounds, dialed-in counts, review times) by kind and time, never the shop's whole history.
  await db.schema.createIndex('audit_events_shop_action_created').on('audit_events').columns(['shop_id', 'action', 'created_at']).execute();
  // A job's moves and opening alone, in time order: the stint a move ends is found by one seek for the event before it.
  await sql`create index audit_events_job_moves on audit_events (shop_id, subject_id, created_at) where action in ('job.opened', 'job.moved')`.execute(db);
  // Revenue: payments by the time they landed, refunds and dealer ledger entries by the time they were written.
  await db.schema.createIndex('payments_shop_paid').on('payments').columns(['shop_id', 'paid_at']).execute();
  await db.schema.createIndex('payment_refunds_shop_created').on('payment_refunds').columns(['shop_id', 'created_at']).execute();
  await db.schema.createIndex('ledger_entries_shop_created').on('ledger_entries').columns(['shop_id', 'created_at']).execute();

  // Log quality: each analysed log's check results, one row per check, kept by triggers from the stored report, so the
  // report counts small rows instead of parsing every log's whole analysis (tens of kilobytes of JSON) on each request.
  if (onPostgres(db)) {
    await datalogChecksOnPostgres(db);
    return;
  }
  await sql`create table datalog_checks (
    datalog_id text not null references datalogs(id) on delete cascade,
    shop_id text not null references shops(id) on delete cascade,
    created_at text not null,
    check_id text not null,
    status text not null,
    primary key (datalog_id, check_id)
  ) without rowid`.execute(db);
  await db.schema.createIndex('datalog_checks_shop_created').on('datalog_checks').columns(['shop_id', 'created_at', 'check_id', 'status']).execute();
  const fillFromNew = sql`
    insert or replace into datalog_checks (datalog_id, shop_id, created_at, check_id, status)
    select new.id, new.shop_id, new.created_at, json_extract(c.value, '$.id'), json_extract(c.value, '$.status')
    from json_each(new.report, '$.checks') as c
    where new.status = 'ready' and json_extract(c.value, '$.id') is not null`;
  await sql`create trigger datalogs_checks_insert after insert on datalogs when new.report is not null begin ${fillFromNew}; end`.execute(db);
  await sql`create trigger datalogs_checks_update after update of report, status on datalogs begin
    delete from datalog_checks where datalog_id = old.id;
    ${fillFromNew};
  end`.execute(db);
  // Logs analysed before this migration.
  await sql`insert or replace into datalog_checks (datalog_id, shop_id, created_at, check_id, status)
    select d.id, d.shop_id, d.created_at, json_extract(c.value, '$.id'), json_extract(c.value, '$.status')
    from datalogs as d, json_each(d.report, '$.checks') as c
    where d.status = 'ready' and d.report is not null and json_extract(c.value, '$.id') is not null`.execute(db);
}

async function datalogChecksOnPostgres(db: Kysely<any>): Promise<void> {
  await sql`create table datalog_checks (
    datalog_id text not null references datalogs(id) on delete cascade,
    shop_id text not null references shops(id) on delete cascade,
    created_at text not null,
    check_id text not null,
    status text not null,
    primary key (datalog_id, check_id)
  )`.execute(db);
  await db.schema.createIndex('datalog_checks_shop_created').on('datalog_checks').columns(['shop_id', 'created_at', 'check_id', 'status']).execute();
  const checksOf = (row: string) => sql.raw(`jsonb_array_elements(coalesce((${row}.report::jsonb)->'checks', '[]'::jsonb)) as c(value)`);
  const upsert = sql`on conflict (datalog_id, check_id) do update set shop_id = excluded.shop_id, created_at = excluded.created_at, status = excluded.status`;
  await sql`create function datalogs_checks() returns trigger language plpgsql as $$
    begin
      if tg_op = 'UPDATE' then delete from datalog_checks where datalog_id = old.id; end if;
      if new.status = 'ready' and new.report is not null then
        insert into datalog_checks (datalog_id, shop_id, created_at, check_id, status)
          select new.id, new.shop_id, new.created_at, c.value->>'id', c.value->>'status'
          from ${checksOf('new')}
          where c.value->>'id' is not null
          ${upsert};
      end if;
      return null;
    end $$`.execute(db);
  await sql`create trigger datalogs_checks_insert after insert on datalogs for each row when (new.report is not null) execute function datalogs_checks()`.execute(db);
  await sql`create trigger datalogs_checks_update after update of report, status on datalogs for each row execute function datalogs_checks()`.execute(db);
  await sql`insert into datalog_checks (datalog_id, shop_id, created_at, check_id, status)
    select d.id, d.shop_id, d.created_at, c.value->>'id', c.value->>'status'
    from datalogs as d, ${checksOf('d')}
    where d.status = 'ready' and d.report is not null and c.value->>'id' is not null
    ${upsert}`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const trigger of ['datalogs_checks_insert', 'datalogs_checks_update']) await sql`drop trigger ${sql.raw(trigger)}`.execute(db);
  await db.schema.dropTable('datalog_checks').execute();
  for (const name of ['audit_events_shop_action_created', 'audit_events_job_moves', 'payments_shop_paid', 'payment_refunds_shop_created', 'ledger_entries_shop_created']) {
    await db.schema.dropIndex(name).execute();
  }
}
