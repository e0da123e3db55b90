import { sql, type Expression, type ExpressionBuilder, type SqlBool } from 'kysely';
import type { JobScope } from '@revloop/domain/auth';
import type { JobState } from '@revloop/domain/jobs';
import type { Db } from '../client';
import { caseBlindLike, sqlFalse } from '../sql-functions';
import type { Database } from '../database';
import type { InsertableJobRow, JobMessageRow, JobRow, UpdateableJobRow } from './job.table';

export interface JobListRow extends JobRow {
  vehicle_description: string;
  vehicle_vin: string;
  vehicle_model_year: number;
  customer_name: string;
  customer_email: string;
  dealer_name: string | null;
  package_name: string;
  tuner_name: string | null;
}

export interface JobListFilter {
  states?: JobState[];
  /** Only jobs in an open state (the board); read through the `is_open` index. */
  open?: boolean;
  tunerId?: string | 'unassigned';
  dealerId?: string;
  packageId?: string;
  customerUserId?: string;
  /** Only jobs with a revision draft waiting for a second person's approval. */
  awaitingApproval?: boolean;
  text?: string;
}

export const JOB_SORTS = ['number', 'created', 'updated', 'state_changed', 'state', 'customer', 'vehicle', 'round'] as const;
export type JobSort = (typeof JOB_SORTS)[number];

/** The conditions on the job row itself: the shop, the role scope and every filter but the text search. */
function jobConditions(shopId: string, scope: JobScope, filter: JobListFilter) {
  return (eb: ExpressionBuilder<Database, 'jobs'>) => {
    const terms: Expression<SqlBool>[] = [eb('jobs.shop_id', '=', shopId)];
    // The SQL twin of the Job ability conditions: what a role may see is decided inside the query.
    if (scope.kind === 'tuner') {
      terms.push(eb.or([eb('jobs.assigned_tuner_id', '=', scope.userId), eb('jobs.assigned_tuner_id', 'is', null), eb('jobs.drafts_awaiting_approval', '>', 0)]));
    } else if (scope.kind === 'dealer') terms.push(eb('jobs.dealer_id', '=', scope.dealerId));
    else if (scope.kind === 'customer') terms.push(eb('jobs.customer_user_id', '=', scope.userId));
    else if (scope.kind === 'none') terms.push(sqlFalse);
    if (filter.states?.length) terms.push(eb('jobs.state', 'in', filter.states));
    if (filter.open) terms.push(eb('jobs.is_open', '=', 1));
    if (filter.tunerId === 'unassigned') terms.push(eb('jobs.assigned_tuner_id', 'is', null));
    else if (filter.tunerId) terms.push(eb('jobs.assigned_tuner_id', '=', filter.tunerId));
    if (filter.dealerId) terms.push(eb('jobs.dealer_id', '=', filter.dealerId));
    if (filter.packageId) terms.push(eb('jobs.package_id', '=', filter.packageId));
    if (filter.customerUserId) terms.push(eb('jobs.customer_user_id', '=', filter.customerUserId));
    if (filter.awaitingApproval) terms.push(eb('jobs.drafts_awaiting_approval', '>', 0));
    return eb.and(terms);
  };
}

/** The shop's jobs this scope may see that pass the filter, joined to the vehicle and customer the search reads. */
function filtered(db: Db, shopId: string, scope: JobScope, filter: JobListFilter = {}) {
  let query = db
    .selectFrom('jobs')
    .innerJoin('vehicles', 'vehicles.id', 'jobs.vehicle_id')
    .innerJoin('users as customer', 'customer.id', 'jobs.customer_user_id')
    .where(jobConditions(shopId, scope, filter));
  if (filter.text) {
    const like = `%${filter.text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    const number = Number(filter.text.replace(/^#/, ''));
    const op = caseBlindLike(db);
    query = query.where((eb) =>
      eb.or([
        eb(sql`vehicles.description`, op, sql`${like} escape '\\'`),
        eb(sql`vehicles.vin`, op, sql`${like} escape '\\'`),
        eb(sql`customer.name`, op, sql`${like} escape '\\'`),
        eb(sql`customer.email`, op, sql`${like} escape '\\'`),
        ...(Number.isInteger(number) && number > 0 ? [eb('jobs.number', '=', number)] : []),
      ]),
    );
  }
  return query;
}

/** The list row: the job with the names the board and the table show. */
function withNames(query: ReturnType<typeof filtered>) {
  return query
    .leftJoin('dealers', 'dealers.id', 'jobs.dealer_id')
    .innerJoin('packages', 'packages.id', 'jobs.package_id')
    .leftJoin('users as tuner', 'tuner.id', 'jobs.assigned_tuner_id')
    .selectAll('jobs')
    .select([
      'vehicles.description as vehicle_description',
      'vehicles.vin as vehicle_vin',
      'vehicles.model_year as vehicle_model_year',
      'customer.name as customer_name',
      'customer.email as customer_email',
      'dealers.name as dealer_name',
      'packages.name as package_name',
      'tuner.name as tuner_name',
    ]);
}

const SORT_COLUMN: Record<JobSort, string> = {
  number: 'jobs.number',
  created: 'jobs.created_at',
  updated: 'jobs.updated_at',
  state_changed: 'jobs.state_changed_at',
  state: 'jobs.state',
  customer: 'customer.name',
  vehicle: 'vehicles.description',
  round: 'jobs.round',
};

export interface JobPage {
  sort: JobSort;
  direction: 'asc' | 'desc';
  offset: number;
  limit: number;
}

/**
 * One page of the list, read in the order of an index on (shop_id, sort column, number) so it stops at the page;
 * the job number breaks ties in the same direction, which keeps the order total and index-friendly.
 */
export function listJobsQuery(db: Db, shopId: string, scope: JobScope, filter: JobListFilter, page: JobPage) {
  return withNames(filtered(db, shopId, scope, filter))
    .orderBy(sql.ref(SORT_COLUMN[page.sort]), page.direction)
    .orderBy('jobs.number', page.direction)
    .offset(page.offset)
    .limit(page.limit);
}

/**
 * How many jobs match. The shop-wide view filtered at most by state (the table's first screen) reads the per-state
 * tally the triggers keep, so it costs the same at 10 jobs or 100,000; the board counts its open jobs through the
 * `is_open` index, and narrower views count their own rows.
 */
export async function countJobs(db: Db, shopId: string, scope: JobScope, filter: JobListFilter): Promise<number> {
  const byStateOnly =
    scope.kind === 'shop' && !filter.open && !filter.tunerId && !filter.dealerId && !filter.packageId && !filter.customerUserId && !filter.text;
  if (byStateOnly) {
    let query = db.selectFrom('job_state_counts').select((eb) => eb.fn.sum<number>('n').as('n')).where('shop_id', '=', shopId);
    if (filter.states?.length) query = query.where('state', 'in', filter.states);
    return Number((await query.executeTakeFirst())?.n ?? 0);
  }
  // Without a text search the joined rows cannot change the count (both joins follow non-null foreign keys): skip them.
  const row = filter.text
    ? await filtered(db, shopId, scope, filter).select((eb) => eb.fn.countAll<number>().as('n')).executeTakeFirstOrThrow()
    : await db.selectFrom('jobs').where(jobConditions(shopId, scope, filter)).select((eb) => eb.fn.countAll<number>().as('n')).executeTakeFirstOrThrow();
  return Number(row.n);
}

export async function listJobs(
  db: Db,
  shopId: string,
  scope: JobScope,
  filter: JobListFilter,
  page: JobPage,
): Promise<{ rows: JobListRow[]; total: number }> {
  const rows = await listJobsQuery(db, shopId, scope, filter, page).execute();
  return { rows: rows as JobListRow[], total: await countJobs(db, shopId, scope, filter) };
}

/**
 * Every matching job in list order, a batch at a time, for exports of any size: the ids are taken in one indexed read
 * (so the order is one snapshot), then the rows are loaded per batch, so memory and each query stay small.
 */
export async function* eachJobBatch(
  db: Db,
  shopId: string,
  scope: JobScope,
  filter: JobListFilter,
  order: Pick<JobPage, 'sort' | 'direction'>,
  batchSize = 500,
): AsyncGenerator<JobListRow[]> {
  const ids = (
    await filtered(db, shopId, scope, filter)
      .select('jobs.id')
      .orderBy(sql.ref(SORT_COLUMN[order.sort]), order.direction)
      .orderBy('jobs.number', order.direction)
      .execute()
  ).map((r) => r.id);
  for (let start = 0; start < ids.length; start += batchSize) {
    const batch = ids.slice(start, start + batchSize);
    const rows = (await withNames(filtered(db, shopId, scope)).where('jobs.id', 'in', batch).execute()) as JobListRow[];
    const byId = new Map(rows.map((r) => [r.id, r]));
    yield batch.flatMap((id) => byId.get(id) ?? []);
  }
}

/** One job as this scope may see it; another shop's or an out-of-scope job reads as undefined. */
export async function findJob(db: Db, shopId: string, id: string, scope: JobScope = { kind: 'shop' }): Promise<JobListRow | undefined> {
  return withNames(filtered(db, shopId, scope)).where('jobs.id', '=', id).executeTakeFirst() as Promise<JobListRow | undefined>;
}

/** The shop's job list version: it changes with every write to a job or to a name a list shows (0 before any). */
export async function jobListVersion(db: Db, shopId: string): Promise<number> {
  const row = await db.selectFrom('job_list_versions').select('version').where('shop_id', '=', shopId).executeTakeFirst();
  return row?.version ?? 0;
}

export async function nextJobNumber(db: Db, shopId: string): Promise<number> {
  const row = await db
    .selectFrom('jobs')
    .select((eb) => eb.fn.max('number').as('max'))
    .where('shop_id', '=', shopId)
    .executeTakeFirst();
  return Math.max(Number(row?.max ?? 0), 1000) + 1;
}

export async function insertJob(db: Db, row: InsertableJobRow): Promise<JobRow> {
  return db.insertInto('jobs').values(row).returningAll().executeTakeFirstOrThrow();
}

/** Updates a job only if it is still in `expectedState`, so two people moving it at once cannot both win. */
export async function updateJob(
  db: Db,
  shopId: string,
  id: string,
  patch: UpdateableJobRow,
  expectedState?: JobState,
): Promise<JobRow | undefined> {
  let query = db.updateTable('jobs').set(patch).where('shop_id', '=', shopId).where('id', '=', id);
  if (expectedState) query = query.where('state', '=', expectedState);
  return query.returningAll().executeTakeFirst();
}

export interface JobMessageListRow extends JobMessageRow {
  author_name: string;
}

export async function insertJobMessage(db: Db, row: JobMessageRow): Promise<JobMessageRow> {
  return db.insertInto('job_messages').values(row).returningAll().executeTakeFirstOrThrow();
}

export async function listJobMessages(db: Db, shopId: string, jobId: string): Promise<JobMessageListRow[]> {
  return db
    .selectFrom('job_messages')
    .innerJoin('users', 'users.id', 'job_messages.author_user_id')
    .selectAll('job_messages')
    .select('users.name as author_name')
    .where('job_messages.shop_id', '=', shopId)
    .where('job_messages.job_id', '=', jobId)
    .orderBy('job_messages.created_at')
    .execute();
}
