import { sql, type Expression, type RawBuilder } from 'kysely';
import type { JobState } from '@revloop/domain/jobs';
import type { Db } from '../client';
import type { InsertableJobStintRow } from './reports.table';
import { countWhere, wholePart } from '../sql-functions';

/** A report's time span: ISO instants, `from` included, `to` excluded. */
export interface ReportRange {
  from: string;
  to: string;
}

/** One bar of a time series (a week, a month): its label and its ISO instants, `start` included, `end` excluded. */
export interface ReportBucket {
  key: string;
  start: string;
  end: string;
}

/** Quantiles read from the per-state and per-reviewer duration lists. */
const MEDIAN = 0.5;
const P90 = 0.9;

interface QuantileRow {
  grp: string | null;
  n: number;
  median: number;
  p90: number;
}

/**
 * Median and 90th percentile of `v` per `grp`, in SQL: rows ranked by a window function, then the two ranks around
 * p·(n − 1) interpolated linearly (the "type 7" definition of R's and mathjs' default quantile).
 */
async function quantilesByGroup(db: Db, source: Expression<unknown> | RawBuilder<unknown>): Promise<QuantileRow[]> {
  const whole = (p: number) => wholePart(db, sql`(n - 1) * ${sql.lit(p)}`);
  const rank = (p: number, offset: number) => sql`max(case when rn = ${whole(p)} + ${sql.lit(offset)} then v end)`;
  const interpolate = (p: number, lo: string, hi: string) =>
    sql`${sql.ref(lo)} + ((n - 1) * ${sql.lit(p)} - ${whole(p)}) * (coalesce(${sql.ref(hi)}, ${sql.ref(lo)}) - ${sql.ref(lo)})`;
  const result = await sql<QuantileRow>`
    with ranked as (
      select grp, v, row_number() over (partition by grp order by v) as rn, count(*) over (partition by grp) as n
      from (${source}) as source where v is not null
    ), picked as (
      select grp, max(n) as n, ${rank(MEDIAN, 1)} as lo50, ${rank(MEDIAN, 2)} as hi50, ${rank(P90, 1)} as lo90, ${rank(P90, 2)} as hi90
      from ranked group by grp
    )
    select grp, n, ${interpolate(MEDIAN, 'lo50', 'hi50')} as median, ${interpolate(P90, 'lo90', 'hi90')} as p90 from picked order by grp`.execute(db);
  return result.rows;
}

/** Writes the stint a move ended. Only the job workflow's one writer of job state calls this, in the move's transaction. */
export async function insertJobStint(db: Db, row: InsertableJobStintRow): Promise<void> {
  const hours = (Date.parse(row.left_at) - Date.parse(row.entered_at)) / 3_600_000;
  await db.insertInto('job_stints').values({ ...row, hours }).execute();
}

/**
 * Every completed stint of a job in one state that ended inside the range (job_stints, one row per move, kept by the
 * job workflow): read from the index on (shop, left_at) that holds the state, the hours and the mover.
 */
export function stintsQuery(db: Db, shopId: string, range: ReportRange) {
  return db
    .selectFrom('job_stints as s')
    .select(['s.left_by_user_id as actor_id', sql<JobState>`s.state`.as('state'), 's.hours'])
    .where('s.shop_id', '=', shopId)
    .where('s.left_at', '>=', range.from)
    .where('s.left_at', '<', range.to);
}

export interface TurnaroundRow {
  state: JobState;
  stints: number;
  medianHours: number;
  p90Hours: number;
}

/** Hours jobs spent in each state: median and 90th percentile of the stints that ended in the range. */
export async function turnaroundReport(db: Db, shopId: string, range: ReportRange): Promise<TurnaroundRow[]> {
  const stints = stintsQuery(db, shopId, range);
  const rows = await quantilesByGroup(db, sql`select state as grp, hours as v from (${stints}) as stints`);
  return rows.map((r) => ({ state: r.grp as JobState, stints: r.n, medianHours: r.median, p90Hours: r.p90 }));
}

/** The moves into Dialed in made inside the range (the stints they ended), with the round the job finished on. */
export function dialedInQuery(db: Db, shopId: string, range: ReportRange) {
  return db
    .selectFrom('job_stints as m')
    .where('m.shop_id', '=', shopId)
    .where('m.to_state', '=', 'dialed_in')
    .where('m.left_at', '>=', range.from)
    .where('m.left_at', '<', range.to);
}

export interface RoundsRow {
  rounds: number;
  jobs: number;
}

/** How many rounds (revisions sent) each job dialed in during the range took: jobs per round count. */
export async function roundsReport(db: Db, shopId: string, range: ReportRange): Promise<RoundsRow[]> {
  const rows = await dialedInQuery(db, shopId, range)
    .select(['m.round as rounds', (eb) => eb.fn.countAll<number>().as('jobs')])
    .groupBy('m.round')
    .orderBy('m.round')
    .execute();
  return rows.map((r) => ({ rounds: Number(r.rounds), jobs: Number(r.jobs) }));
}

const bucketsCte = (buckets: ReportBucket[]) =>
  sql`buckets (bucket_key, bucket_start, bucket_end) as (values ${sql.join(buckets.map((b) => sql`(${b.key}, ${b.start}, ${b.end})`))})`;

export interface WeeklyJobsRow {
  weekStart: string;
  opened: number;
  dialedIn: number;
}

/** Jobs opened and jobs dialed in per week (one bucket per week, as the caller cut them in the shop's time zone). */
export async function weeklyJobsReport(db: Db, shopId: string, weeks: ReportBucket[]): Promise<WeeklyJobsRow[]> {
  if (weeks.length === 0) return [];
  const result = await weeklyJobsQuery(shopId, weeks).execute(db);
  return result.rows.map((r) => ({ weekStart: r.bucket_key, opened: r.opened, dialedIn: r.dialed_in }));
}

/** The weekly counts' statement (exported for its query-plan test): two index range counts per week. */
export function weeklyJobsQuery(shopId: string, weeks: ReportBucket[]) {
  return sql<{ bucket_key: string; opened: number; dialed_in: number }>`
    with ${bucketsCte(weeks)}
    select b.bucket_key,
      (select count(*) from jobs j where j.shop_id = ${shopId} and j.created_at >= b.bucket_start and j.created_at < b.bucket_end) as opened,
      (select count(*) from job_stints m where m.shop_id = ${shopId} and m.to_state = 'dialed_in'
        and m.left_at >= b.bucket_start and m.left_at < b.bucket_end) as dialed_in
    from buckets b order by b.bucket_start`;
}

export interface TunerLoadRow {
  userId: string;
  name: string;
  role: 'owner' | 'tuner';
  openJobs: number;
  dialedIn: number;
  reviews: number;
  medianReviewHours: number | null;
}

/**
 * Each active owner and tuner: open jobs assigned to them now, jobs they moved to Dialed in during the range, and how
 * long their log reviews took (Log review → the move they made next) for reviews that ended in the range.
 */
export async function tunerLoadReport(db: Db, shopId: string, range: ReportRange): Promise<TunerLoadRow[]> {
  const staff = await db
    .selectFrom('memberships as ms')
    .innerJoin('users as u', 'u.id', 'ms.user_id')
    .select((eb) => [
      'u.id',
      'u.name',
      'ms.role',
      eb
        .selectFrom('jobs as j')
        .select((j) => j.fn.countAll<number>().as('n'))
        .where('j.shop_id', '=', shopId)
        .whereRef('j.assigned_tuner_id', '=', 'u.id')
        .where('j.is_open', '=', 1)
        .as('open_jobs'),
      dialedInQuery(db, shopId, range)
        .select((m) => m.fn.countAll<number>().as('n'))
        .where('m.left_by_user_id', '=', sql<string>`u.id`)
        .as('dialed_in'),
    ])
    .where('ms.shop_id', '=', shopId)
    .where('ms.role', 'in', ['owner', 'tuner'])
    .where('ms.status', '=', 'active')
    .orderBy('ms.role', 'desc')
    .orderBy('u.name')
    .execute();
  const stints = stintsQuery(db, shopId, range);
  const reviews = await quantilesByGroup(db, sql`select actor_id as grp, hours as v from (${stints}) as stints where state = 'log_review'`);
  const byReviewer = new Map(reviews.map((r) => [r.grp, r]));
  return staff.map((s) => ({
    userId: s.id,
    name: s.name,
    role: s.role as 'owner' | 'tuner',
    openJobs: Number(s.open_jobs ?? 0),
    dialedIn: Number(s.dialed_in ?? 0),
    reviews: byReviewer.get(s.id)?.n ?? 0,
    medianReviewHours: byReviewer.get(s.id)?.median ?? null,
  }));
}

/**
 * Money the shop earned in the range, one signed row each: customer payments for jobs (when they landed), their
 * refunds (negative, when refunded), and dealer ledger debits for jobs (wholesale, when debited; credits back negative).
 */
function moneyRows(shopId: string, range: ReportRange) {
  return sql`
    select p.paid_at as at, j.package_id, j.dealer_id, 'payment' as kind, p.amount_minor as amount
    from payments p left join jobs j on j.id = p.job_id and j.shop_id = p.shop_id
    where p.shop_id = ${shopId} and p.purpose = 'job' and p.status = 'paid' and p.paid_at >= ${range.from} and p.paid_at < ${range.to}
    union all
    select r.created_at, j.package_id, j.dealer_id, 'refund', -r.amount_minor
    from payment_refunds r join payments p on p.id = r.payment_id and p.shop_id = r.shop_id
    left join jobs j on j.id = p.job_id and j.shop_id = p.shop_id
    where r.shop_id = ${shopId} and p.purpose = 'job' and r.created_at >= ${range.from} and r.created_at < ${range.to}
    union all
    select l.created_at, j.package_id, l.dealer_id, 'dealer', -l.amount_minor
    from ledger_entries l left join jobs j on j.id = l.job_id and j.shop_id = l.shop_id
    where l.shop_id = ${shopId} and l.kind in ('job_debit', 'job_credit') and l.created_at >= ${range.from} and l.created_at < ${range.to}`;
}

export interface RevenueRow {
  key: string | null;
  label: string;
  paymentsMinor: number;
  refundsMinor: number;
  dealerDebitsMinor: number;
  netMinor: number;
}

const moneySums = sql`coalesce(sum(case when m.kind = 'payment' then m.amount end), 0) as payments,
  coalesce(sum(case when m.kind = 'refund' then -m.amount end), 0) as refunds,
  coalesce(sum(case when m.kind = 'dealer' then m.amount end), 0) as dealer,
  coalesce(sum(m.amount), 0) as net`;

interface MoneySumRow {
  key: string | null;
  label: string | null;
  payments: number;
  refunds: number;
  dealer: number;
  net: number;
}

const toRevenueRow = (r: MoneySumRow, fallbackLabel: string): RevenueRow => ({
  key: r.key,
  label: r.label ?? fallbackLabel,
  paymentsMinor: r.payments,
  refundsMinor: r.refunds,
  dealerDebitsMinor: r.dealer,
  netMinor: r.net,
});

/** Revenue per month (buckets cut by the caller in the shop's time zone); months without money read zero. */
export async function revenueByMonth(db: Db, shopId: string, months: ReportBucket[]): Promise<RevenueRow[]> {
  if (months.length === 0) return [];
  const range = { from: months[0]!.start, to: months.at(-1)!.end };
  const result = await sql<MoneySumRow>`
    with ${bucketsCte(months)}, money as (${moneyRows(shopId, range)})
    select b.bucket_key as key, b.bucket_key as label, ${moneySums}
    from buckets b left join money m on m.at >= b.bucket_start and m.at < b.bucket_end
    group by b.bucket_key, b.bucket_start order by b.bucket_start`.execute(db);
  return result.rows.map((r) => toRevenueRow(r, r.key ?? ''));
}

/** How revenue splits other than by month: the money's column, the table that names it, and the name of "none". */
const SPLITS = {
  package: { column: 'package_id', table: 'packages', name: 'name', none: 'No package' },
  dealer: { column: 'dealer_id', table: 'dealers', name: 'name', none: 'Retail customers (no dealer)' },
} as const;

/** Revenue per package the money was for, or per dealer (customers who buy directly are one row with no dealer); largest net first. */
export async function revenueBy(db: Db, shopId: string, range: ReportRange, split: keyof typeof SPLITS): Promise<RevenueRow[]> {
  const { column, table, name, none } = SPLITS[split];
  const result = await sql<MoneySumRow>`
    with money as (${moneyRows(shopId, range)})
    select m.${sql.raw(column)} as key, n.${sql.raw(name)} as label, ${moneySums}
    from money m left join ${sql.table(table)} n on n.id = m.${sql.raw(column)} and n.shop_id = ${shopId}
    group by m.${sql.raw(column)}, n.${sql.raw(name)} order by net desc, label`.execute(db);
  return result.rows.map((r) => toRevenueRow(r, none));
}

export interface LogQualityRow {
  checkId: string;
  logs: number;
  failed: number;
  warned: number;
}

/** For each check of the log analysis: how many logs uploaded in the range it judged, failed and warned. */
export async function logQualityReport(db: Db, shopId: string, range: ReportRange): Promise<{ logs: number; rows: LogQualityRow[] }> {
  const inRange = db
    .selectFrom('datalog_checks as c')
    .where('c.shop_id', '=', shopId)
    .where('c.created_at', '>=', range.from)
    .where('c.created_at', '<', range.to);
  const [rows, total] = await Promise.all([
    inRange
      .select((eb) => [
        'c.check_id',
        eb.fn.countAll<number>().as('logs'),
        countWhere(sql`c.status = 'fail'`).as('failed'),
        countWhere(sql`c.status = 'warn'`).as('warned'),
      ])
      .groupBy('c.check_id')
      .orderBy('c.check_id')
      .execute(),
    inRange.select(sql<number>`count(distinct c.datalog_id)`.as('logs')).executeTakeFirstOrThrow(),
  ]);
  return { logs: total.logs, rows: rows.map((r) => ({ checkId: r.check_id, logs: r.logs, failed: r.failed, warned: r.warned })) };
}
