import { sql } from 'kysely';
import type { JobScope } from '@revloop/domain/auth';
import type { JobState } from '@revloop/domain/jobs';
import type { Db } from '../client';
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
  tunerId?: string | 'unassigned';
  dealerId?: string;
  packageId?: string;
  customerUserId?: string;
  text?: string;
}

export const JOB_SORTS = ['number', 'created', 'updated', 'state_changed', 'state', 'customer', 'vehicle', 'round'] as const;
export type JobSort = (typeof JOB_SORTS)[number];

function baseQuery(db: Db, shopId: string, scope: JobScope) {
  return db
    .selectFrom('jobs')
    .innerJoin('vehicles', 'vehicles.id', 'jobs.vehicle_id')
    .innerJoin('users as customer', 'customer.id', 'jobs.customer_user_id')
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
    ])
    .where('jobs.shop_id', '=', shopId)
    .where((eb) => {
      // The SQL twin of the Job ability conditions: what a role may see is decided inside the query.
      switch (scope.kind) {
        case 'shop':
          return sql<boolean>`1`;
        case 'tuner':
          return eb.or([eb('jobs.assigned_tuner_id', '=', scope.userId), eb('jobs.assigned_tuner_id', 'is', null)]);
        case 'dealer':
          return eb('jobs.dealer_id', '=', scope.dealerId);
        case 'customer':
          return eb('jobs.customer_user_id', '=', scope.userId);
        case 'none':
          return sql<boolean>`0`;
      }
    });
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

export async function listJobs(
  db: Db,
  shopId: string,
  scope: JobScope,
  filter: JobListFilter,
  page: { sort: JobSort; direction: 'asc' | 'desc'; offset: number; limit: number },
): Promise<{ rows: JobListRow[]; total: number }> {
  let query = baseQuery(db, shopId, scope);
  if (filter.states?.length) query = query.where('jobs.state', 'in', filter.states);
  if (filter.tunerId === 'unassigned') query = query.where('jobs.assigned_tuner_id', 'is', null);
  else if (filter.tunerId) query = query.where('jobs.assigned_tuner_id', '=', filter.tunerId);
  if (filter.dealerId) query = query.where('jobs.dealer_id', '=', filter.dealerId);
  if (filter.packageId) query = query.where('jobs.package_id', '=', filter.packageId);
  if (filter.customerUserId) query = query.where('jobs.customer_user_id', '=', filter.customerUserId);
  if (filter.text) {
    const like = `%${filter.text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    const number = Number(filter.text.replace(/^#/, ''));
    query = query.where((eb) =>
      eb.or([
        eb(sql`vehicles.description`, 'like', sql`${like} escape '\\'`),
        eb(sql`vehicles.vin`, 'like', sql`${like} escape '\\'`),
        eb(sql`customer.name`, 'like', sql`${like} escape '\\'`),
        eb(sql`customer.email`, 'like', sql`${like} escape '\\'`),
        ...(Number.isInteger(number) && number > 0 ? [eb('jobs.number', '=', number)] : []),
      ]),
    );
  }
  const countRow = await query
    .clearSelect()
    .select((eb) => eb.fn.countAll<number>().as('n'))
    .executeTakeFirstOrThrow();
  const rows = await query
    .orderBy(sql.ref(SORT_COLUMN[page.sort]), page.direction)
    .orderBy('jobs.number', 'desc')
    .offset(page.offset)
    .limit(page.limit)
    .execute();
  return { rows: rows as JobListRow[], total: Number(countRow.n) };
}

/** One job as this scope may see it; another shop's or an out-of-scope job reads as undefined. */
export async function findJob(db: Db, shopId: string, id: string, scope: JobScope = { kind: 'shop' }): Promise<JobListRow | undefined> {
  return baseQuery(db, shopId, scope).where('jobs.id', '=', id).executeTakeFirst() as Promise<JobListRow | undefined>;
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
