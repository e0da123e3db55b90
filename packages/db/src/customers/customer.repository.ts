import { sql } from 'kysely';
import type { Db } from '../client';
import { joinedText, largestOf, sqlFalse } from '../sql-functions';

export const CUSTOMER_SORTS = ['name', 'email', 'open_jobs', 'last_activity', 'paid'] as const;
export type CustomerSort = (typeof CUSTOMER_SORTS)[number];

export interface CustomerListQuery {
  /** Matches name, e-mail, or any of the customer's vehicles' VIN or description (case-insensitive, substring). */
  q?: string;
  /** Only the customers of this dealer account (a dealer's own view). */
  dealerId?: string;
  sort: CustomerSort;
  dir: 'asc' | 'desc';
  limit: number;
  offset: number;
}

export interface CustomerListRow {
  user_id: string;
  membership_id: string;
  name: string;
  email: string;
  status: 'active' | 'deactivated';
  dealer_id: string | null;
  dealer_name: string | null;
  since: string;
  vehicle_count: number;
  /** Up to three vehicle descriptions, for the list; the customer page shows them all. */
  vehicles: string | null;
  open_jobs: number;
  job_count: number;
  last_activity: string;
  paid_minor: number;
}

const SORT_SQL: Record<CustomerSort, ReturnType<typeof sql.ref>> = {
  name: sql.ref('u.name'),
  email: sql.ref('u.email'),
  open_jobs: sql.ref('open_jobs'),
  last_activity: sql.ref('last_activity'),
  paid: sql.ref('paid_minor'),
};

const likePattern = (text: string) => `%${text.toLowerCase().replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

/**
 * One page of the shop's customers with their counts, filtered, sorted and paged in SQL so the list stays fast at
 * thousands of customers; `total` is the count before paging.
 */
export async function listCustomers(db: Db, shopId: string, query: CustomerListQuery): Promise<{ rows: CustomerListRow[]; total: number }> {
  const rows = await customerPageQuery(db, shopId, query).execute(db);
  const total = await sql<{ n: number }>`select count(*) as n from memberships m join users u on u.id = m.user_id where ${customerWhere(shopId, query)}`.execute(db);
  return { rows: rows.rows, total: Number(total.rows[0]?.n ?? 0) };
}

function customerWhere(shopId: string, query: CustomerListQuery) {
  const pattern = query.q?.trim() ? likePattern(query.q.trim()) : null;
  return sql`m.shop_id = ${shopId} and m.role = 'customer'
    ${query.dealerId ? sql`and m.dealer_id = ${query.dealerId}` : sql``}
    ${
      pattern
        ? sql`and (lower(u.name) like ${pattern} escape '\\' or lower(u.email) like ${pattern} escape '\\'
            or exists (select 1 from vehicles sv where sv.shop_id = ${shopId} and sv.owner_user_id = m.user_id
              and (lower(sv.vin) like ${pattern} escape '\\' or lower(sv.description) like ${pattern} escape '\\')))`
        : sql``
    }`;
}

/** One page of the Customers list with its sums (exported for its query-plan test). */
export function customerPageQuery(db: Db, shopId: string, query: CustomerListQuery) {
  const where = customerWhere(shopId, query);
  const dir = query.dir === 'desc' ? sql`desc` : sql`asc`;
  const order = sql`order by ${SORT_SQL[query.sort]} ${dir}, u.name asc, m.id asc`;
  // Sorted by name or e-mail, the page is chosen first and only its customers' jobs and vehicles are summed; the
  // other sorts need every customer's sums. Money paid is one row per customer, kept by the payment writers.
  const pageFirst = query.sort === 'name' || query.sort === 'email';
  // The page is empty for the other sorts, and it has no sums to order by: PostgreSQL refuses the unknown name (SQLite
  // quietly read it as a text constant).
  const pageOnly = (column: string) => (pageFirst ? sql`and ${sql.ref(column)} in (select user_id from page)` : sql``);
  return sql<CustomerListRow>`
    with page as (
      select m.user_id from memberships m join users u on u.id = m.user_id
      where ${pageFirst ? where : sqlFalse} ${pageFirst ? order : sql``} limit ${query.limit} offset ${query.offset}
    ), job_agg as (
      select customer_user_id, count(*) as job_count, sum(is_open) as open_jobs, max(updated_at) as last_job_at
      from jobs where shop_id = ${shopId} ${pageOnly('customer_user_id')} group by customer_user_id
    ), vehicle_agg as (
      select owner_user_id, count(*) as vehicle_count, max(updated_at) as last_vehicle_at
      from vehicles where shop_id = ${shopId} ${pageOnly('owner_user_id')} group by owner_user_id
    )
    select m.user_id, m.id as membership_id, u.name, u.email, m.status, m.dealer_id, d.name as dealer_name,
      m.created_at as since,
      coalesce(va.vehicle_count, 0) as vehicle_count,
      (select ${joinedText(db, sql.ref('first3.description'), ' · ')} from (select description from vehicles lv
         where lv.shop_id = ${shopId} and lv.owner_user_id = m.user_id order by lv.created_at limit 3) as first3) as vehicles,
      coalesce(ja.open_jobs, 0) as open_jobs, coalesce(ja.job_count, 0) as job_count,
      ${largestOf(db, sql`m.created_at`, sql`coalesce(ja.last_job_at, '')`, sql`coalesce(va.last_vehicle_at, '')`)} as last_activity,
      coalesce(cs.paid_minor - cs.refunded_minor, 0) as paid_minor
    from memberships m
    join users u on u.id = m.user_id
    left join dealers d on d.id = m.dealer_id and d.shop_id = m.shop_id
    left join job_agg ja on ja.customer_user_id = m.user_id
    left join customer_summaries cs on cs.shop_id = m.shop_id and cs.customer_user_id = m.user_id
    left join vehicle_agg va on va.owner_user_id = m.user_id
    where ${where} ${pageOnly('m.user_id')}
    ${order}
    limit ${query.limit} offset ${pageFirst ? 0 : query.offset}`;
}

/** The customer's membership in this shop, or undefined when the user is not a customer here. */
export async function findCustomer(db: Db, shopId: string, userId: string) {
  return db
    .selectFrom('memberships as m')
    .innerJoin('users as u', 'u.id', 'm.user_id')
    .leftJoin('dealers as d', 'd.id', 'm.dealer_id')
    .select(['m.user_id', 'm.id as membership_id', 'u.name', 'u.email', 'm.status', 'm.dealer_id', 'd.name as dealer_name', 'm.created_at as since'])
    .where('m.shop_id', '=', shopId)
    .where('m.role', '=', 'customer')
    .where('m.user_id', '=', userId)
    .executeTakeFirst();
}

/** Payments for the customer's jobs, newest first, with what was refunded of each. */
export async function listCustomerPayments(db: Db, shopId: string, userId: string) {
  return db
    .selectFrom('payments as p')
    .innerJoin('jobs as j', (join) => join.onRef('j.id', '=', 'p.job_id').onRef('j.shop_id', '=', 'p.shop_id'))
    .select([
      'p.id',
      'p.job_id',
      'j.number as job_number',
      'j.dealer_id',
      'p.amount_minor',
      'p.currency',
      'p.status',
      'p.created_at',
      'p.paid_at',
      (eb) =>
        eb
          .selectFrom('payment_refunds as r')
          .select(sql<number>`coalesce(sum(r.amount_minor), 0)`.as('n'))
          .whereRef('r.payment_id', '=', 'p.id')
          .whereRef('r.shop_id', '=', 'p.shop_id')
          .as('refunded_minor'),
    ])
    .where('p.shop_id', '=', shopId)
    .where('j.customer_user_id', '=', userId)
    .orderBy('p.created_at', 'desc')
    .execute();
}

/** The latest messages on the customer's jobs, newest first. */
export async function listCustomerMessages(db: Db, shopId: string, userId: string, limit = 50) {
  return db
    .selectFrom('job_messages as msg')
    .innerJoin('jobs as j', (join) => join.onRef('j.id', '=', 'msg.job_id').onRef('j.shop_id', '=', 'msg.shop_id'))
    .innerJoin('users as a', 'a.id', 'msg.author_user_id')
    .select(['msg.id', 'msg.job_id', 'j.number as job_number', 'j.dealer_id', 'msg.body', 'msg.created_at', 'a.name as author_name', 'msg.author_user_id'])
    .where('msg.shop_id', '=', shopId)
    .where('j.customer_user_id', '=', userId)
    .orderBy('msg.created_at', 'desc')
    .limit(limit)
    .execute();
}
