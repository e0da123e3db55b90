import { sql, type Kysely } from 'kysely';
import type { Db } from '../client';
import { hoursBetween, jsonNumber, jsonText } from '../sql-functions';
import { onPostgres } from './dialect';

// Frozen in time: never edit a migration that has shipped; add a new one.
// Shop reports and the Customers list on a 10,000-job shop read small indexed rows kept by their writers, instead of
// reading JSON out of audit events or summing every payment on each request:
// - job_stints: one row per finished stint of a job in a state, written by the job workflow's one writer of job state
//   (apps/api transitionJob) in the move's transaction; rows for moves made before this migration come from the audit
//   events below.
// - customer_summaries: money a customer paid for jobs and got back, kept by the payment writers (packages/db
//   payment.repository: a payment landing, a refund) in their transaction; filled from the payments below.
export async function up(db: Kysely<any>): Promise<void> {
  await sql`create table job_stints (
    id text primary key,
    shop_id text not null references shops(id) on delete cascade,
    job_id text not null references jobs(id) on delete cascade,
    state text not null,
    entered_at text not null,
    left_at text not null,
    -- left_at − entered_at in hours, stored so the reports' quantiles read it from the index (SQLite does not cover
    -- generated columns with an index).
    hours real not null,
    to_state text not null,
    round integer not null,
    left_by_user_id text references users(id) on delete set null
  )`.execute(db);
  // Turnaround and review times: the stints that ended in the range, with what the quantiles need, from the index alone.
  await sql`create index job_stints_shop_left on job_stints (shop_id, left_at, state, hours, left_by_user_id)`.execute(db);
  // Jobs dialed in (rounds, weekly counts, per tuner): the moves into one state in the range.
  await sql`create index job_stints_shop_to_left on job_stints (shop_id, to_state, left_at, round, left_by_user_id)`.execute(db);
  await sql`create index job_stints_job on job_stints (job_id, left_at)`.execute(db);
  await backfillJobStints(db);

  await sql`create table customer_summaries (
    shop_id text not null references shops(id) on delete cascade,
    customer_user_id text not null references users(id) on delete cascade,
    paid_minor integer not null default 0,
    refunded_minor integer not null default 0,
    updated_at text not null,
    primary key (shop_id, customer_user_id)
  )${onPostgres(db) ? sql`` : sql` without rowid`}`.execute(db);
  await sql`insert into customer_summaries (shop_id, customer_user_id, paid_minor, refunded_minor, updated_at)
    select p.shop_id, j.customer_user_id, sum(p.amount_minor),
      coalesce(sum((select sum(r.amount_minor) from payment_refunds r where r.shop_id = p.shop_id and r.payment_id = p.id)), 0),
      max(coalesce(p.paid_at, p.created_at))
    from payments p join jobs j on j.id = p.job_id and j.shop_id = p.shop_id
    where p.status = 'paid'
    group by p.shop_id, j.customer_user_id`.execute(db);
}

/**
 * Stints of the moves already made, from their audit events: each `job.moved` closes the stint of the state it left
 * (`details.from`), begun at the job's previous move or opening (the job's creation when no event says). The stint
 * takes the move's event id, so running this again adds nothing.
 */
export async function backfillJobStints(db: Kysely<any>): Promise<void> {
  const on = db as Db;
  const [from, to] = [jsonText(on, 'm.details', 'from'), jsonText(on, 'm.details', 'to')];
  // `where true` lets SQLite tell the upsert's `on conflict` from a join constraint.
  await sql`insert into job_stints (id, shop_id, job_id, state, entered_at, left_at, hours, to_state, round, left_by_user_id)
    select id, shop_id, job_id, state, entered_at, left_at, ${hoursBetween(on, sql.ref('left_at'), sql.ref('entered_at'))}, to_state, round, left_by_user_id
    from (
      select m.id, m.shop_id, m.subject_id as job_id, ${from} as state,
        coalesce((select max(p.created_at) from audit_events p
          where p.shop_id = m.shop_id and p.subject_id = m.subject_id and p.action in ('job.opened', 'job.moved') and p.created_at < m.created_at), j.created_at) as entered_at,
        m.created_at as left_at, ${to} as to_state, coalesce(${jsonNumber(on, 'm.details', 'round')}, j.round) as round,
        (select u.id from users u where u.id = m.actor_user_id) as left_by_user_id
      from audit_events m join jobs j on j.id = m.subject_id and j.shop_id = m.shop_id
      where m.action = 'job.moved' and m.subject_type = 'Job' and ${from} is not null and ${to} is not null
    ) as moves
    where true
    on conflict do nothing`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('customer_summaries').execute();
  await db.schema.dropTable('job_stints').execute();
}
