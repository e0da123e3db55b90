import { sql, type Kysely } from 'kysely';
import { onPostgres } from './dialect';

// Frozen in time: never edit a migration that has shipped; add a new one.
// The board and the job page at 10,000 jobs per shop: every list is read in index order and stops at its page,
// counts come from a per-state tally kept by triggers, and the timeline reads only its own job's events.
export async function up(db: Kysely<any>): Promise<void> {
  // Open = not final; the final states as they are today (packages/domain/src/jobs/job-states.ts, OPEN_STATES).
  if (onPostgres(db)) {
    // PostgreSQL 15 has stored generated columns only, and a boolean needs a cast to be 0/1.
    await sql`alter table jobs add column is_open bigint generated always as ((state not in ('dialed_in', 'cancelled'))::int) stored`.execute(db);
  } else {
    await sql`alter table jobs add column is_open integer generated always as (state not in ('dialed_in', 'cancelled')) virtual`.execute(db);
  }
  // The board: open jobs, longest in their state first.
  await db.schema.createIndex('jobs_shop_open_state_changed').on('jobs').columns(['shop_id', 'is_open', 'state_changed_at', 'number']).execute();
  // The table's sorts on the job's own columns; the job number breaks ties in the same direction.
  for (const [name, column] of [
    ['jobs_shop_updated', 'updated_at'],
    ['jobs_shop_created', 'created_at'],
    ['jobs_shop_state_changed', 'state_changed_at'],
    ['jobs_shop_round', 'round'],
  ] as const) {
    await db.schema.createIndex(name).on('jobs').columns(['shop_id', column, 'number']).execute();
  }
  await db.schema.dropIndex('jobs_shop_state').execute();
  await db.schema.createIndex('jobs_shop_state').on('jobs').columns(['shop_id', 'state', 'number']).execute();

  // The job page's timeline: one job's events, newest first, without touching the rest of the shop's history.
  await db.schema
    .createIndex('audit_events_subject')
    .on('audit_events')
    .columns(['shop_id', 'subject_type', 'subject_id', 'created_at'])
    .execute();

  // Jobs per shop and state, kept by triggers in the same transaction as the change, so a page never counts the shop.
  if (onPostgres(db)) {
    await stateCountsOnPostgres(db);
    return;
  }
  await sql`create table job_state_counts (
    shop_id text not null references shops(id) on delete cascade,
    state text not null,
    n integer not null,
    primary key (shop_id, state)
  ) without rowid`.execute(db);
  await sql`insert into job_state_counts (shop_id, state, n) select shop_id, state, count(*) from jobs group by shop_id, state`.execute(db);
  await sql`create trigger jobs_count_insert after insert on jobs begin
    insert into job_state_counts (shop_id, state, n) values (new.shop_id, new.state, 1)
      on conflict (shop_id, state) do update set n = n + 1;
  end`.execute(db);
  await sql`create trigger jobs_count_delete after delete on jobs begin
    update job_state_counts set n = n - 1 where shop_id = old.shop_id and state = old.state;
  end`.execute(db);
  await sql`create trigger jobs_count_update after update of shop_id, state on jobs
    when old.shop_id is not new.shop_id or old.state is not new.state begin
    update job_state_counts set n = n - 1 where shop_id = old.shop_id and state = old.state;
    insert into job_state_counts (shop_id, state, n) values (new.shop_id, new.state, 1)
      on conflict (shop_id, state) do update set n = n + 1;
  end`.execute(db);
}

async function stateCountsOnPostgres(db: Kysely<any>): Promise<void> {
  await sql`create table job_state_counts (
    shop_id text not null references shops(id) on delete cascade,
    state text not null,
    n bigint not null,
    primary key (shop_id, state)
  )`.execute(db);
  await sql`insert into job_state_counts (shop_id, state, n) select shop_id, state, count(*) from jobs group by shop_id, state`.execute(db);
  await sql`create function jobs_count() returns trigger language plpgsql as $$
    begin
      if tg_op in ('UPDATE', 'DELETE') then
        update job_state_counts set n = n - 1 where shop_id = old.shop_id and state = old.state;
      end if;
      if tg_op in ('INSERT', 'UPDATE') then
        insert into job_state_counts (shop_id, state, n) values (new.shop_id, new.state, 1)
          on conflict (shop_id, state) do update set n = job_state_counts.n + 1;
      end if;
      return null;
    end $$`.execute(db);
  await sql`create trigger jobs_count_insert after insert on jobs for each row execute function jobs_count()`.execute(db);
  await sql`create trigger jobs_count_delete after delete on jobs for each row execute function jobs_count()`.execute(db);
  await sql`create trigger jobs_count_update after update of shop_id, state on jobs for each row
    when (old.shop_id is distinct from new.shop_id or old.state is distinct from new.state) execute function jobs_count()`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const trigger of ['jobs_count_insert', 'jobs_count_delete', 'jobs_count_update']) await sql`drop trigger ${sql.raw(trigger)}`.execute(db);
  await db.schema.dropTable('job_state_counts').execute();
  await db.schema.dropIndex('audit_events_subject').execute();
  for (const name of ['jobs_shop_open_state_changed', 'jobs_shop_updated', 'jobs_shop_created', 'jobs_shop_state_changed', 'jobs_shop_round', 'jobs_shop_state']) {
    await db.schema.dropIndex(name).execute();
  }
  await db.schema.createIndex('jobs_shop_state').on('jobs').columns(['shop_id', 'state']).execute();
  await sql`alter table jobs drop column is_open`.execute(db);
}
