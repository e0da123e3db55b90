import { median, quantileSeq, sum } from 'mathjs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { backfillJobStints, newId, type Db } from '@revloop/db';
import type { JobState } from '@revloop/domain/jobs';
import { createTestApp, signIn, TEST_PASSWORD, type TestApp } from '../../testing/test-app';
import { hashPassword } from '../auth/password';

// The shop reads its days in Berlin. EU summer time ends on the last Sunday of October (2026-10-25) at 01:00 UTC, so
// 1 September starts at 22:00 UTC the day before (CEST, +02:00) and 1 November at 23:00 UTC (CET, +01:00) [STD] Directive 2000/84/EC.
const TZ = 'Europe/Berlin';
const FROM = '2026-09-01';
const TO = '2026-10-31';
const RANGE_START = Date.parse('2026-08-31T22:00:00Z');
const RANGE_END = Date.parse('2026-11-01T00:00:00+01:00');
const HOUR = 3_600_000;
const inRange = (t: number) => t >= RANGE_START && t < RANGE_END;
const query = `from=${FROM}&to=${TO}`;
const iso = (t: number) => new Date(t).toISOString();

type Staff = 'owner' | 'tunerA' | 'tunerB';
type Actor = Staff | 'customer';

/** One planned move: where the job goes, how many hours after the previous event, and who moves it. */
interface Move {
  to: JobState;
  after: number;
  by: Actor;
}

interface PlannedJob {
  opened: number;
  moves: Move[];
  tuner: Staff | null;
  pkg: 0 | 1;
  viaDealer: boolean;
}

/** A small deterministic generator, so the fixture is the same on every run. */
function prng(seed: number) {
  let s = seed >>> 0;
  return () => {
    s = (s * 1664525 + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
}

/** Jobs walked through the usual loop with varied stint lengths; some finish, some stop in an open state, one is cancelled. */
function planJobs(seed: number, count: number): PlannedJob[] {
  const rand = prng(seed);
  const hours = (lo: number, hi: number) => Math.round((lo + rand() * (hi - lo)) * 100) / 100;
  return Array.from({ length: count }, (_, i) => {
    const tuner: Staff = i % 3 === 2 ? 'tunerB' : i % 5 === 4 ? 'owner' : 'tunerA';
    const moves: Move[] = [
      { to: 'ready', after: hours(1, 40), by: 'customer' },
      { to: 'on_bench', after: hours(1, 30), by: tuner },
    ];
    const rounds = 1 + (i % 3);
    // Jobs 3, 7, 11 … stop on the way: open work for the load report.
    const stopAt = i % 4 === 3 ? 1 + (i % 3) : Infinity;
    for (let r = 1; r <= rounds && moves.length < 2 + stopAt * 2; r++) {
      moves.push({ to: 'with_customer', after: hours(4, 60), by: tuner });
      moves.push({ to: 'log_review', after: hours(20, 200), by: 'customer' });
      moves.push({ to: r === rounds ? 'dialed_in' : 'on_bench', after: hours(0.5, 30), by: tuner });
    }
    if (i === 5) moves.splice(3, moves.length - 3, { to: 'on_hold', after: hours(5, 20), by: 'owner' }, { to: 'with_customer', after: hours(10, 50), by: 'owner' });
    if (i === 6) moves.splice(2, moves.length - 2, { to: 'cancelled', after: hours(2, 9), by: 'owner' });
    // The first job opens just before the Berlin range starts and moves just after: counted only when the zone is applied.
    const opened = i === 0 ? Date.parse('2026-08-31T21:30:00Z') : Date.parse('2026-08-20T08:00:00Z') + i * 4.3 * 24 * HOUR + hours(0, 10) * HOUR;
    if (i === 0) moves[0]!.after = 1;
    return { opened, moves, tuner, pkg: (i % 2) as 0 | 1, viaDealer: i % 4 === 1 };
  });
}

interface Stint {
  state: JobState;
  hours: number;
  end: number;
  by: Actor;
}

/** The oracle's view of a plan: every stint with its end, and each job's final state, walked in plain code. */
function walk(job: PlannedJob) {
  let t = job.opened;
  let state: JobState = 'intake';
  let round = 0;
  const stints: Stint[] = [];
  const dialedIn: Array<{ at: number; round: number; by: Actor }> = [];
  for (const m of job.moves) {
    const end = t + m.after * HOUR;
    stints.push({ state, hours: m.after, end, by: m.by });
    if (m.to === 'with_customer' && state !== 'on_hold') round += 1;
    if (m.to === 'dialed_in') dialedIn.push({ at: end, round, by: m.by });
    state = m.to;
    t = end;
  }
  return { stints, dialedIn, state, round };
}

interface BuiltShop {
  shopId: string;
  emails: Record<Actor | 'dealer', string>;
  users: Record<Actor | 'dealer', string>;
  jobIds: string[];
  plan: PlannedJob[];
  packageIds: string[];
}

/** A shop with an owner, two tuners, a dealer and a customer, and the planned jobs written as the workflow writes them. */
async function buildShop(db: Db, name: string, seed: number, count: number): Promise<BuiltShop> {
  const at = '2026-01-01T00:00:00.000Z';
  const shopId = newId();
  await db.insertInto('shops').values({ id: shopId, name, currency: 'eur', settings: JSON.stringify({ timeZone: TZ }), created_at: at }).execute();
  const hash = await hashPassword(TEST_PASSWORD);
  const dealerId = newId();
  await db.insertInto('dealers').values({ id: dealerId, shop_id: shopId, name: `${name} dealer`, contact_name: 'D', contact_email: `dealer-${seed}@reports.test`, phone: null, created_at: at }).execute();
  const users = {} as BuiltShop['users'];
  const emails = {} as BuiltShop['emails'];
  const roles: Array<[Actor | 'dealer', 'owner' | 'tuner' | 'customer' | 'dealer']> = [
    ['owner', 'owner'],
    ['tunerA', 'tuner'],
    ['tunerB', 'tuner'],
    ['customer', 'customer'],
    ['dealer', 'dealer'],
  ];
  for (const [who, role] of roles) {
    const id = newId();
    emails[who] = `${who.toLowerCase()}-${seed}@reports.test`;
    users[who] = id;
    await db.insertInto('users').values({ id, email: emails[who], name: `${name} ${who}`, password_hash: hash, created_at: at }).execute();
    await db.insertInto('memberships').values({ id: newId(), shop_id: shopId, user_id: id, role, dealer_id: role === 'dealer' ? dealerId : null, created_at: at }).execute();
  }
  const packageIds = [newId(), newId()];
  // A name with a comma and quotes, so the CSV export has to quote it.
  const packageNames = ['Engine calibration', 'Stage 2, "track" package'];
  for (const [k, id] of packageIds.entries()) {
    await db.insertInto('packages').values({ id, shop_id: shopId, name: packageNames[k]!, modules: '["ECM"]', retail_price_minor: 59900, dealer_price_minor: 44900, rounds_included: 4, created_at: at }).execute();
  }
  const vehicleId = newId();
  await db.insertInto('vehicles').values({ id: vehicleId, shop_id: shopId, owner_user_id: users.customer, dealer_id: null, vin: '1RLREPORT00000001', model_year: 2020, description: 'Test car', spec: '{}', created_at: at, updated_at: at }).execute();

  const plan = planJobs(seed, count);
  const jobIds: string[] = [];
  for (const [i, job] of plan.entries()) {
    const { state, round, stints } = walk(job);
    const id = newId();
    jobIds.push(id);
    const last = iso(stints.at(-1)?.end ?? job.opened);
    await db
      .insertInto('jobs')
      .values({
        id,
        shop_id: shopId,
        number: 1001 + i,
        vehicle_id: vehicleId,
        customer_user_id: users.customer,
        dealer_id: job.viaDealer ? dealerId : null,
        package_id: packageIds[job.pkg]!,
        assigned_tuner_id: job.tuner ? users[job.tuner] : null,
        state,
        held_from: null,
        round,
        goals: 'Report fixture',
        log_request: '{}',
        cautions_accepted_at: iso(job.opened),
        state_changed_at: last,
        created_at: iso(job.opened),
        updated_at: last,
      })
      .execute();
    const event = (action: string, actor: Actor, t: number, details: Record<string, unknown> = {}) => ({
      id: newId(),
      shop_id: shopId,
      actor_user_id: users[actor],
      action,
      subject_type: 'Job',
      subject_id: id,
      details: JSON.stringify(details),
      created_at: iso(t),
    });
    const rows = [event('job.opened', 'customer', job.opened)];
    let from: JobState = 'intake';
    let r = 0;
    for (const [k, m] of job.moves.entries()) {
      if (m.to === 'with_customer' && from !== 'on_hold') r += 1;
      rows.push(event('job.moved', m.by, stints[k]!.end, { from, to: m.to, round: r }));
      // Other events on the job's timeline, between moves, must not cut a stint short.
      if (k === 1) rows.push(event('job.assigned', 'owner', stints[k]!.end + HOUR / 2, { tunerId: 'x' }));
      from = m.to;
    }
    await db.insertInto('audit_events').values(rows).execute();
  }
  // The moves' stints, as migration 015 derives them from these audit events (the workflow writes the same rows on
  // each move: see jobs/job-stints.api.test.ts).
  await backfillJobStints(db);
  return { shopId, emails, users, jobIds, plan, packageIds };
}

interface MoneyFixture {
  payments: Array<{ job: number; amount: number; paidAt: string | null; purpose: 'job' | 'topup'; refunds: Array<{ amount: number; at: string }> }>;
  ledger: Array<{ job: number | null; kind: 'top_up' | 'job_debit' | 'job_credit'; amount: number; at: string }>;
}

/** Payments, refunds and dealer ledger entries, some inside the range and some outside it or not revenue at all. */
const MONEY: MoneyFixture = {
  payments: [
    { job: 0, amount: 59900, paidAt: '2026-09-10T10:00:00Z', purpose: 'job', refunds: [] },
    { job: 2, amount: 89900, paidAt: '2026-10-05T10:00:00Z', purpose: 'job', refunds: [{ amount: 20000, at: '2026-10-20T09:00:00Z' }] },
    // Open checkout: never paid, never revenue.
    { job: 3, amount: 59900, paidAt: null, purpose: 'job', refunds: [] },
    // Paid before the range; its refund falls inside it.
    { job: 4, amount: 54000, paidAt: '2026-08-20T10:00:00Z', purpose: 'job', refunds: [{ amount: 10000, at: '2026-09-02T09:00:00Z' }] },
    // A dealer top-up is prepayment, not revenue: the debits for jobs are.
    { job: 1, amount: 200000, paidAt: '2026-09-01T10:00:00Z', purpose: 'topup', refunds: [] },
    // Paid just after the range ends in Berlin (00:30 local on 1 November).
    { job: 6, amount: 30000, paidAt: '2026-10-31T23:30:00Z', purpose: 'job', refunds: [] },
  ],
  ledger: [
    { job: null, kind: 'top_up', amount: 200000, at: '2026-09-01T10:00:00Z' },
    { job: 1, kind: 'job_debit', amount: -44900, at: '2026-09-15T10:00:00Z' },
    { job: 1, kind: 'job_credit', amount: 44900, at: '2026-10-02T10:00:00Z' },
    { job: 5, kind: 'job_debit', amount: -69900, at: '2026-10-10T10:00:00Z' },
  ],
};

async function addMoney(db: Db, shop: BuiltShop): Promise<void> {
  const dealer = await db.selectFrom('dealers').select('id').where('shop_id', '=', shop.shopId).executeTakeFirstOrThrow();
  for (const p of MONEY.payments) {
    const id = newId();
    await db
      .insertInto('payments')
      .values({
        id,
        shop_id: shop.shopId,
        purpose: p.purpose,
        job_id: p.purpose === 'job' ? shop.jobIds[p.job]! : null,
        dealer_id: p.purpose === 'topup' ? dealer.id : null,
        payer_user_id: shop.users.customer,
        amount_minor: p.amount,
        currency: 'eur',
        status: p.paidAt ? 'paid' : 'open',
        stripe_checkout_session_id: `cs_${id}`,
        created_at: p.paidAt ?? '2026-09-20T10:00:00Z',
        paid_at: p.paidAt,
      })
      .execute();
    for (const r of p.refunds) {
      await db.insertInto('payment_refunds').values({ id: newId(), shop_id: shop.shopId, payment_id: id, amount_minor: r.amount, currency: 'eur', reason: 'test', stripe_refund_id: `re_${newId()}`, by_user_id: shop.users.owner, created_at: r.at }).execute();
    }
  }
  let balance = 0;
  for (const [seq, e] of MONEY.ledger.entries()) {
    balance += e.amount;
    await db
      .insertInto('ledger_entries')
      .values({ id: newId(), shop_id: shop.shopId, dealer_id: dealer.id, seq: seq + 1, kind: e.kind, amount_minor: e.amount, currency: 'eur', balance_after_minor: balance, job_id: e.job === null ? null : shop.jobIds[e.job]!, payment_id: null, memo: 'test', created_at: e.at })
      .execute();
  }
}

type CheckResult = Array<{ id: string; status: 'pass' | 'warn' | 'fail' }>;
/** Uploaded logs with their analysis' check results; one still being analysed, one from before the range. */
const LOGS: Array<{ job: number; at: string; checks: CheckResult | null }> = [
  { job: 0, at: '2026-09-03T10:00:00Z', checks: [{ id: 'engine_warm', status: 'fail' }, { id: 'full_throttle', status: 'pass' }, { id: 'sensor_sanity', status: 'pass' }] },
  { job: 1, at: '2026-09-12T10:00:00Z', checks: [{ id: 'engine_warm', status: 'pass' }, { id: 'full_throttle', status: 'fail' }, { id: 'sensor_sanity', status: 'warn' }] },
  { job: 2, at: '2026-09-20T10:00:00Z', checks: [{ id: 'engine_warm', status: 'warn' }, { id: 'full_throttle', status: 'fail' }, { id: 'wot_gears', status: 'warn' }] },
  { job: 2, at: '2026-10-01T10:00:00Z', checks: [{ id: 'engine_warm', status: 'pass' }, { id: 'full_throttle', status: 'pass' }, { id: 'wot_gears', status: 'pass' }] },
  { job: 4, at: '2026-10-15T10:00:00Z', checks: [{ id: 'engine_warm', status: 'pass' }, { id: 'full_throttle', status: 'warn' }, { id: 'wot_gears', status: 'fail' }] },
  { job: 4, at: '2026-10-16T10:00:00Z', checks: null },
  { job: 0, at: '2026-08-25T10:00:00Z', checks: [{ id: 'engine_warm', status: 'fail' }] },
];

async function addLogs(db: Db, shop: BuiltShop): Promise<void> {
  for (const [i, log] of LOGS.entries()) {
    await db
      .insertInto('datalogs')
      .values({
        id: newId(),
        shop_id: shop.shopId,
        job_id: shop.jobIds[log.job]!,
        round: 1,
        original_name: `log-${i}.csv`,
        sha256: 'a'.repeat(64),
        size_bytes: 100,
        header_signature: 'sig',
        mapping: '{}',
        fuel: '{}',
        status: log.checks ? 'ready' : 'processing',
        error: null,
        report: log.checks ? JSON.stringify({ rows: 10, checks: log.checks.map((c) => ({ ...c, message: 'x' })) }) : null,
        uploaded_by: shop.users.customer,
        created_at: log.at,
      })
      .execute();
  }
}

describe('shop reports', () => {
  let t: TestApp;
  let shop: BuiltShop;
  let other: BuiltShop;
  let owner: Awaited<ReturnType<typeof signIn>>;

  beforeAll(async () => {
    t = await createTestApp();
    shop = await buildShop(t.db, 'Report shop', 3, 14);
    // Another shop with its own jobs, money and logs on the same days: none of it may count for the first.
    other = await buildShop(t.db, 'Other shop', 17, 9);
    await addMoney(t.db, shop);
    await addMoney(t.db, other);
    await addLogs(t.db, shop);
    await addLogs(t.db, other);
    owner = await signIn(t.app, shop.emails.owner);
  });
  afterAll(async () => {
    await t.close();
  });

  const walked = () => shop.plan.map(walk);
  const stintsInRange = () => walked().flatMap((w) => w.stints.filter((s) => inRange(s.end)));

  it('turnaround: median and 90th percentile hours per state equal mathjs over the stints that ended in the range', async () => {
    const res = await owner.get(`/api/reports/turnaround?${query}`);
    expect(res.status).toBe(200);
    const stints = stintsInRange();
    const states = [...new Set(stints.map((s) => s.state))];
    expect(res.body.data.rows.map((r: { state: string }) => r.state).sort()).toEqual(states.sort());
    for (const row of res.body.data.rows as Array<{ state: JobState; stints: number; medianHours: number; p90Hours: number }>) {
      const hours = stints.filter((s) => s.state === row.state).map((s) => s.hours);
      expect(row.stints).toBe(hours.length);
      // Oracle: mathjs median and quantileSeq (linear interpolation between closest ranks) [CALC]
      expect(row.medianHours).toBeCloseTo(median(hours), 6);
      expect(row.p90Hours).toBeCloseTo(Number(quantileSeq(hours, 0.9)), 6);
    }
    expect(res.body.data).toMatchObject({ from: FROM, to: TO, timeZone: TZ });
  });

  it('the range is read in the shop time zone: a move at 00:30 Berlin time on the first day counts', async () => {
    const first = walk(shop.plan[0]!).stints[0]!;
    expect(iso(first.end)).toBe('2026-08-31T22:30:00.000Z');
    const res = await owner.get(`/api/reports/turnaround?${query}`);
    const intake = (res.body.data.rows as Array<{ state: string; stints: number }>).find((r) => r.state === 'intake')!;
    expect(intake.stints).toBe(stintsInRange().filter((s) => s.state === 'intake').length);
  });

  it('rounds per dialed-in job: the distribution of rounds over the jobs dialed in during the range', async () => {
    const res = await owner.get(`/api/reports/rounds?${query}`);
    expect(res.status).toBe(200);
    const done = walked().flatMap((w) => w.dialedIn.filter((d) => inRange(d.at)));
    const expected = [...new Set(done.map((d) => d.round))].sort().map((rounds) => ({ rounds, jobs: done.filter((d) => d.round === rounds).length }));
    expect(res.body.data.rows).toEqual(expected);
    expect(res.body.data.jobs).toBe(done.length);
  });

  it('jobs opened and dialed in per week: Monday weeks in the shop time zone, zeros included', async () => {
    const res = await owner.get(`/api/reports/weekly-jobs?${query}`);
    expect(res.status).toBe(200);
    // Independent week arithmetic: the local day from Intl, then back to its Monday [STD] ISO 8601 weeks.
    const localDay = (t: number) => new Intl.DateTimeFormat('en-CA', { timeZone: TZ }).format(new Date(t));
    const mondayOf = (day: string) => {
      const d = new Date(`${day}T00:00:00Z`);
      return new Date(d.getTime() - ((d.getUTCDay() + 6) % 7) * 86_400_000).toISOString().slice(0, 10);
    };
    const weeks: string[] = [];
    for (let d = Date.parse(`${mondayOf(FROM)}T00:00:00Z`); d <= Date.parse(`${TO}T00:00:00Z`); d += 7 * 86_400_000) weeks.push(iso(d).slice(0, 10));
    const opened = shop.plan.filter((j) => inRange(j.opened)).map((j) => mondayOf(localDay(j.opened)));
    const dialed = walked().flatMap((w) => w.dialedIn.filter((d) => inRange(d.at)).map((d) => mondayOf(localDay(d.at))));
    expect(res.body.data.rows).toEqual(weeks.map((w) => ({ weekStart: w, opened: opened.filter((x) => x === w).length, dialedIn: dialed.filter((x) => x === w).length })));
  });

  it('load per tuner: open jobs now, jobs dialed in and median review time in the range', async () => {
    const res = await owner.get(`/api/reports/tuner-load?${query}`);
    expect(res.status).toBe(200);
    const rows = res.body.data.rows as Array<{ userId: string; openJobs: number; dialedIn: number; reviews: number; medianReviewHours: number | null }>;
    expect(rows).toHaveLength(3);
    for (const who of ['owner', 'tunerA', 'tunerB'] as const) {
      const row = rows.find((r) => r.userId === shop.users[who])!;
      const open = shop.plan.filter((j, i) => j.tuner === who && !['dialed_in', 'cancelled'].includes(walked()[i]!.state)).length;
      const dialed = walked().flatMap((w) => w.dialedIn).filter((d) => d.by === who && inRange(d.at)).length;
      const reviews = stintsInRange().filter((s) => s.state === 'log_review' && s.by === who).map((s) => s.hours);
      expect(row).toMatchObject({ openJobs: open, dialedIn: dialed, reviews: reviews.length });
      if (reviews.length) expect(row.medianReviewHours).toBeCloseTo(median(reviews), 6); // [CALC] mathjs median
      else expect(row.medianReviewHours).toBeNull();
    }
  });

  /** The money fixture as signed revenue items: payments when paid, refunds negative, dealer debits positive. */
  const moneyItems = () => [
    ...MONEY.payments.filter((p) => p.purpose === 'job' && p.paidAt).map((p) => ({ kind: 'payment', at: Date.parse(p.paidAt!), amount: p.amount, job: p.job })),
    ...MONEY.payments.filter((p) => p.purpose === 'job').flatMap((p) => p.refunds.map((r) => ({ kind: 'refund', at: Date.parse(r.at), amount: -r.amount, job: p.job }))),
    ...MONEY.ledger.filter((e) => e.job !== null && e.kind !== 'top_up').map((e) => ({ kind: 'dealer', at: Date.parse(e.at), amount: -e.amount, job: e.job! })),
  ];

  it('revenue by month: payments minus refunds plus dealer debits, each in the month it happened', async () => {
    const res = await owner.get(`/api/reports/revenue?${query}&by=month`);
    expect(res.status).toBe(200);
    const monthOf = (t: number) => new Intl.DateTimeFormat('en-CA', { timeZone: TZ }).format(new Date(t)).slice(0, 7);
    const items = moneyItems().filter((m) => inRange(m.at));
    const total = (list: typeof items) => (list.length ? Number(sum(list.map((m) => m.amount))) : 0); // [CALC] mathjs sum
    const expected = ['2026-09', '2026-10'].map((month) => {
      const ofMonth = items.filter((m) => monthOf(m.at) === month);
      return {
        key: month,
        label: month,
        paymentsMinor: total(ofMonth.filter((m) => m.kind === 'payment')),
        refundsMinor: -total(ofMonth.filter((m) => m.kind === 'refund')),
        dealerDebitsMinor: total(ofMonth.filter((m) => m.kind === 'dealer')),
        netMinor: total(ofMonth),
      };
    });
    expect(res.body.data.rows).toEqual(expected);
    // Worked by hand from the fixture: September 59,900 − 10,000 + 44,900; October 89,900 − 20,000 − 44,900 + 69,900 [CALC].
    expect(expected.map((m) => m.netMinor)).toEqual([94800, 94900]);
    expect(res.body.data.totals.netMinor).toBe(94800 + 94900);
    expect(res.body.data.currency).toBe('EUR');
  });

  it('revenue by package and by dealer split the same money', async () => {
    const items = moneyItems().filter((m) => inRange(m.at));
    const byPackage = await owner.get(`/api/reports/revenue?${query}&by=package`);
    for (const [k, id] of shop.packageIds.entries()) {
      const expected = items.filter((m) => shop.plan[m.job]!.pkg === k).reduce((a, m) => a + m.amount, 0);
      expect(byPackage.body.data.rows.find((r: { key: string }) => r.key === id)?.netMinor ?? 0).toBe(expected);
    }
    const byDealer = await owner.get(`/api/reports/revenue?${query}&by=dealer`);
    const dealerNet = items.filter((m) => shop.plan[m.job]!.viaDealer || m.kind === 'dealer').reduce((a, m) => a + m.amount, 0);
    const rows = byDealer.body.data.rows as Array<{ key: string | null; label: string; netMinor: number }>;
    expect(rows.find((r) => r.key !== null)?.netMinor).toBe(dealerNet);
    expect(rows.find((r) => r.key === null)).toMatchObject({ label: 'Retail customers (no dealer)', netMinor: items.reduce((a, m) => a + m.amount, 0) - dealerNet });
  });

  it('log quality: the share of analysed logs uploaded in the range that failed or warned each check', async () => {
    const res = await owner.get(`/api/reports/log-quality?${query}`);
    expect(res.status).toBe(200);
    const logs = LOGS.filter((l) => l.checks && inRange(Date.parse(l.at)));
    expect(res.body.data.logs).toBe(logs.length);
    const checks = [...new Set(logs.flatMap((l) => l.checks!.map((c) => c.id)))].sort();
    expect(res.body.data.rows.map((r: { checkId: string }) => r.checkId)).toEqual(checks);
    for (const id of checks) {
      const results = logs.flatMap((l) => l.checks!.filter((c) => c.id === id));
      const failed = results.filter((c) => c.status === 'fail').length;
      const warned = results.filter((c) => c.status === 'warn').length;
      expect(res.body.data.rows.find((r: { checkId: string }) => r.checkId === id)).toMatchObject({ logs: results.length, failed, warned, failedShare: failed / results.length, warnedShare: warned / results.length });
    }
    expect(res.body.data.rows.find((r: { checkId: string }) => r.checkId === 'engine_warm').label).toBe('Engine warm');
  });

  it('another shop’s owner sees only their own shop', async () => {
    const otherOwner = await signIn(t.app, other.emails.owner);
    const res = await otherOwner.get(`/api/reports/rounds?${query}`);
    const done = other.plan.map(walk).flatMap((w) => w.dialedIn.filter((d) => inRange(d.at)));
    expect(res.body.data.jobs).toBe(done.length);
    const load = await otherOwner.get(`/api/reports/tuner-load?${query}`);
    expect(load.body.data.rows.map((r: { userId: string }) => r.userId).sort()).toEqual([other.users.owner, other.users.tunerA, other.users.tunerB].sort());
  });

  it('is for the owner only: tuners, dealers and customers are refused, and nobody signed out gets in', async () => {
    const paths = ['turnaround', 'rounds', 'weekly-jobs', 'tuner-load', 'revenue', 'log-quality'];
    for (const who of ['tunerA', 'dealer', 'customer'] as const) {
      const agent = await signIn(t.app, shop.emails[who]);
      for (const p of paths) {
        const res = await agent.get(`/api/reports/${p}?${query}`);
        expect([403, 404]).toContain(res.status);
        expect(res.body.data).toBeUndefined();
      }
    }
    const anonymous = await (await import('supertest')).default(t.app).get(`/api/reports/turnaround?${query}`);
    expect(anonymous.status).toBe(401);
  });

  it('refuses a range that is backwards, a date that does not exist, or a missing date', async () => {
    expect((await owner.get('/api/reports/turnaround?from=2026-10-01&to=2026-09-01')).status).toBe(400);
    expect((await owner.get('/api/reports/turnaround?from=2026-02-30&to=2026-03-01')).status).toBe(400);
    expect((await owner.get('/api/reports/turnaround?from=2026-02-01')).status).toBe(400);
    expect((await owner.get('/api/reports/turnaround?from=2020-01-01&to=2026-03-01')).status).toBe(400);
  });

  it('exports each table as CSV with a header row naming the units, quoting what needs it', async () => {
    const res = await owner.get(`/api/reports/revenue?${query}&by=package&format=csv`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    expect(res.headers['content-disposition']).toBe(`attachment; filename="revenue-by-package-${FROM}-to-${TO}.csv"`);
    const lines = res.text.split('\r\n');
    expect(lines[0]).toBe('Package,Customer payments (EUR),Refunds (EUR),Dealer debits (EUR),Net revenue (EUR)');
    // RFC 4180: a field with a comma or quotes is quoted and its quotes doubled [STD] RFC 4180 §2.
    expect(lines.some((l) => l.startsWith('"Stage 2, ""track"" package",'))).toBe(true);
    for (const p of ['turnaround', 'rounds', 'weekly-jobs', 'tuner-load', 'log-quality']) {
      const csv = await owner.get(`/api/reports/${p}?${query}&format=csv`);
      expect(csv.status).toBe(200);
      expect(csv.text.split('\r\n')[0]).toMatch(/\(/);
    }
    const turnaround = await owner.get(`/api/reports/turnaround?${query}&format=csv`);
    expect(turnaround.text.split('\r\n')[0]).toBe('State,Stints (count),Median (h),90th percentile (h)');
  });
});
