import {
  logQualityReport,
  revenueBy,
  revenueByMonth,
  roundsReport,
  tunerLoadReport,
  turnaroundReport,
  weeklyJobsReport,
  type Db,
  type RevenueRow,
  type ShopRow,
} from '@revloop/db';
import type { LogQualityReport, ReportQuery, RevenueReport, RoundsReport, TunerLoadReport, TurnaroundReport, WeeklyJobsReport } from '@revloop/contract';
import { minorToDecimalString } from '@revloop/domain/billing';
import { toCsv, type CsvValue } from '@revloop/domain/csv';
import { checkTitle } from '@revloop/domain/datalog';
import { JOB_STATES, JOB_STATE_LABELS } from '@revloop/domain/jobs';
import { monthsIn, rangeIn, weeksIn } from '@revloop/domain/reports';
import { parseShopSettings } from '@revloop/domain/shops';

/** A report ready to answer: its JSON body and the same table as CSV (header row with units). */
export interface ReportAnswer<T> {
  json: T;
  csv: () => string;
}

/** The range asked for, read in the shop's time zone (UTC when the shop has none). */
function scope(shop: ShopRow, query: ReportQuery) {
  const timeZone = parseShopSettings(shop.settings).timeZone;
  return { meta: { from: query.from, to: query.to, timeZone }, range: rangeIn(query.from, query.to, timeZone), timeZone };
}

/** Hours with two decimals for the CSV: what a spreadsheet needs, and what the screen shows. */
const hours = (value: number | null): CsvValue => (value === null ? null : Math.round(value * 100) / 100);

export async function turnaround(db: Db, shop: ShopRow, query: ReportQuery): Promise<ReportAnswer<TurnaroundReport>> {
  const { meta, range } = scope(shop, query);
  const rows = (await turnaroundReport(db, shop.id, range))
    .filter((r) => (JOB_STATES as readonly string[]).includes(r.state))
    .sort((a, b) => JOB_STATES.indexOf(a.state) - JOB_STATES.indexOf(b.state))
    .map((r) => ({ ...r, stateLabel: JOB_STATE_LABELS[r.state] }));
  return {
    json: { ...meta, rows },
    csv: () => toCsv(['State', 'Stints (count)', 'Median (h)', '90th percentile (h)'], rows.map((r) => [r.stateLabel, r.stints, hours(r.medianHours), hours(r.p90Hours)])),
  };
}

export async function rounds(db: Db, shop: ShopRow, query: ReportQuery): Promise<ReportAnswer<RoundsReport>> {
  const { meta, range } = scope(shop, query);
  const rows = await roundsReport(db, shop.id, range);
  return {
    json: { ...meta, jobs: rows.reduce((sum, r) => sum + r.jobs, 0), rows },
    csv: () => toCsv(['Rounds (revisions sent)', 'Jobs dialed in (count)'], rows.map((r) => [r.rounds, r.jobs])),
  };
}

export async function weeklyJobs(db: Db, shop: ShopRow, query: ReportQuery): Promise<ReportAnswer<WeeklyJobsReport>> {
  const { meta, timeZone } = scope(shop, query);
  const rows = await weeklyJobsReport(db, shop.id, weeksIn(query.from, query.to, timeZone));
  return {
    json: { ...meta, rows },
    csv: () => toCsv(['Week starting (Monday, YYYY-MM-DD)', 'Jobs opened (count)', 'Jobs dialed in (count)'], rows.map((r) => [r.weekStart, r.opened, r.dialedIn])),
  };
}

export async function tunerLoad(db: Db, shop: ShopRow, query: ReportQuery): Promise<ReportAnswer<TunerLoadReport>> {
  const { meta, range } = scope(shop, query);
  const rows = await tunerLoadReport(db, shop.id, range);
  return {
    json: { ...meta, rows },
    csv: () =>
      toCsv(
        ['Name', 'Role', 'Open jobs now (count)', 'Jobs dialed in (count)', 'Log reviews (count)', 'Median review time (h)'],
        rows.map((r) => [r.name, r.role, r.openJobs, r.dialedIn, r.reviews, hours(r.medianReviewHours)]),
      ),
  };
}

export async function revenue(db: Db, shop: ShopRow, query: ReportQuery, by: RevenueReport['by']): Promise<ReportAnswer<RevenueReport>> {
  const { meta, range, timeZone } = scope(shop, query);
  const rows: RevenueRow[] =
    by === 'month'
      ? await revenueByMonth(db, shop.id, monthsIn(query.from, query.to, timeZone))
      : await revenueBy(db, shop.id, range, by);
  const sum = (pick: (r: RevenueRow) => number) => rows.reduce((total, r) => total + pick(r), 0);
  const totals = { paymentsMinor: sum((r) => r.paymentsMinor), refundsMinor: sum((r) => r.refundsMinor), dealerDebitsMinor: sum((r) => r.dealerDebitsMinor), netMinor: sum((r) => r.netMinor) };
  const currency = shop.currency.toUpperCase();
  // Plain numbers in major units (12.5, not "12.50 €"), so a spreadsheet sums them; the header names the currency.
  const money = (minor: number) => Number(minorToDecimalString(minor, currency));
  const first = by === 'month' ? 'Month (YYYY-MM)' : by === 'package' ? 'Package' : 'Dealer';
  return {
    json: { ...meta, by, currency, rows: rows.map((r) => ({ ...r, key: r.key ?? null })), totals },
    csv: () =>
      toCsv(
        [first, `Customer payments (${currency})`, `Refunds (${currency})`, `Dealer debits (${currency})`, `Net revenue (${currency})`],
        rows.map((r) => [r.label, money(r.paymentsMinor), money(r.refundsMinor), money(r.dealerDebitsMinor), money(r.netMinor)]),
      ),
  };
}

export async function logQuality(db: Db, shop: ShopRow, query: ReportQuery): Promise<ReportAnswer<LogQualityReport>> {
  const { meta, range } = scope(shop, query);
  const { logs, rows } = await logQualityReport(db, shop.id, range);
  const share = (n: number, of: number) => (of === 0 ? 0 : n / of);
  const view = rows.map((r) => ({ ...r, label: checkTitle(r.checkId), failedShare: share(r.failed, r.logs), warnedShare: share(r.warned, r.logs) }));
  const percent = (value: number) => Math.round(value * 1000) / 10;
  return {
    json: { ...meta, logs, rows: view },
    csv: () =>
      toCsv(
        ['Check', 'Check id', 'Logs checked (count)', 'Failed (count)', 'Warned (count)', 'Failed (% of logs checked)', 'Warned (% of logs checked)'],
        view.map((r) => [r.label, r.checkId, r.logs, r.failed, r.warned, percent(r.failedShare), percent(r.warnedShare)]),
      ),
  };
}
