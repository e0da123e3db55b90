import { formatMoney } from '@revloop/domain/billing';
import type { RevenueReport } from '@revloop/contract';
import { getLogQualityCsvHref, useLogQuality } from '../api/get-log-quality';
import { getShopRevenueCsvHref, useShopRevenue, type RevenueGrouping } from '../api/get-revenue';
import { getRoundsCsvHref, useRounds } from '../api/get-rounds';
import { getTunerLoadCsvHref, useTunerLoad } from '../api/get-tuner-load';
import { getTurnaroundCsvHref, useTurnaround } from '../api/get-turnaround';
import { getWeeklyJobsCsvHref, useWeeklyJobs } from '../api/get-weekly-jobs';
import type { ReportRange } from '../api/report-range';
import { LogQualityChart, RevenueMonthChart, RevenueSplitChart, RoundsChart, TunerLoadChart, TurnaroundChart, WeeklyJobsChart } from './report-charts';
import { formatHours, formatShare } from './report-format';
import { ReportSection } from './report-section';
import { ReportTable } from './report-table';

export function TurnaroundPanel({ range }: { range: ReportRange }) {
  return (
    <ReportSection
      title="Turnaround"
      description="How long jobs stayed in each state: the median and the 90th percentile of every stay that ended in the range (from the job's moves)."
      query={useTurnaround(range)}
      csvHref={getTurnaroundCsvHref(range)}
      csvLabel="turnaround"
      isEmpty={(r) => r.rows.length === 0}
      emptyMessage="No job moved in these days."
    >
      {(report) => (
        <>
          <TurnaroundChart report={report} />
          <ReportTable
            caption="Time in each state (hours)"
            rows={report.rows}
            rowKey={(r) => r.state}
            columns={[
              { header: 'State', cell: (r) => r.stateLabel },
              { header: 'Stays (count)', cell: (r) => r.stints, numeric: true },
              { header: 'Median (h)', cell: (r) => formatHours(r.medianHours), numeric: true },
              { header: '90th percentile (h)', cell: (r) => formatHours(r.p90Hours), numeric: true },
            ]}
          />
        </>
      )}
    </ReportSection>
  );
}

export function RoundsPanel({ range }: { range: ReportRange }) {
  return (
    <ReportSection
      title="Rounds per dialed-in job"
      description="For the jobs dialed in during the range: how many revisions each needed before it was done."
      query={useRounds(range)}
      csvHref={getRoundsCsvHref(range)}
      csvLabel="rounds per dialed-in job"
      isEmpty={(r) => r.jobs === 0}
      emptyMessage="No job was dialed in during these days."
    >
      {(report) => (
        <>
          <RoundsChart report={report} />
          <ReportTable
            caption={`Rounds per job, ${report.jobs} jobs dialed in`}
            rows={report.rows}
            rowKey={(r) => String(r.rounds)}
            columns={[
              { header: 'Rounds (revisions sent)', cell: (r) => r.rounds },
              { header: 'Jobs dialed in (count)', cell: (r) => r.jobs, numeric: true },
              { header: 'Share of jobs (%)', cell: (r) => formatShare(r.jobs / report.jobs), numeric: true },
            ]}
          />
        </>
      )}
    </ReportSection>
  );
}

export function WeeklyJobsPanel({ range }: { range: ReportRange }) {
  return (
    <ReportSection
      title="Jobs per week"
      description="Jobs opened and jobs dialed in, per week (Monday to Sunday in the shop's time zone; the first and last weeks count only days in the range)."
      query={useWeeklyJobs(range)}
      csvHref={getWeeklyJobsCsvHref(range)}
      csvLabel="jobs per week"
      isEmpty={(r) => r.rows.every((w) => w.opened === 0 && w.dialedIn === 0)}
      emptyMessage="No job was opened or dialed in during these days."
    >
      {(report) => (
        <>
          <WeeklyJobsChart report={report} />
          <ReportTable
            caption="Jobs opened and dialed in per week"
            rows={report.rows}
            rowKey={(r) => r.weekStart}
            columns={[
              { header: 'Week starting (Monday)', cell: (r) => r.weekStart },
              { header: 'Opened (count)', cell: (r) => r.opened, numeric: true },
              { header: 'Dialed in (count)', cell: (r) => r.dialedIn, numeric: true },
            ]}
            footer={['Total', report.rows.reduce((a, r) => a + r.opened, 0), report.rows.reduce((a, r) => a + r.dialedIn, 0)]}
          />
        </>
      )}
    </ReportSection>
  );
}

export function TunerLoadPanel({ range }: { range: ReportRange }) {
  return (
    <ReportSection
      title="Load per tuner"
      description="Open jobs assigned to each person now; the jobs they dialed in and their median log review (Log review until their next move) in the range."
      query={useTunerLoad(range)}
      csvHref={getTunerLoadCsvHref(range)}
      csvLabel="load per tuner"
      isEmpty={(r) => r.rows.length === 0}
      emptyMessage="The shop has no tuners yet."
    >
      {(report) => (
        <>
          <TunerLoadChart report={report} />
          <ReportTable
            caption="Load per tuner"
            rows={report.rows}
            rowKey={(r) => r.userId}
            columns={[
              { header: 'Name', cell: (r) => `${r.name}${r.role === 'owner' ? ' (owner)' : ''}` },
              { header: 'Open jobs now (count)', cell: (r) => r.openJobs, numeric: true },
              { header: 'Dialed in (count)', cell: (r) => r.dialedIn, numeric: true },
              { header: 'Log reviews (count)', cell: (r) => r.reviews, numeric: true },
              { header: 'Median review time (h)', cell: (r) => formatHours(r.medianReviewHours), numeric: true },
            ]}
          />
        </>
      )}
    </ReportSection>
  );
}

const GROUPING_TEXT: Record<RevenueGrouping, { title: string; first: string; csv: string; empty: string }> = {
  month: { title: 'Revenue by month', first: 'Month (YYYY-MM)', csv: 'revenue by month', empty: 'No money came in during these days.' },
  package: { title: 'Revenue by package', first: 'Package', csv: 'revenue by package', empty: 'No money came in during these days.' },
  dealer: { title: 'Revenue by dealer', first: 'Dealer', csv: 'revenue by dealer', empty: 'No money came in during these days.' },
};

function RevenueTable({ report, caption, first }: { report: RevenueReport; caption: string; first: string }) {
  const money = (minor: number) => formatMoney(minor, report.currency);
  const c = report.currency;
  return (
    <ReportTable
      caption={caption}
      rows={report.rows}
      rowKey={(r) => r.key ?? 'none'}
      columns={[
        { header: first, cell: (r) => r.label },
        { header: `Customer payments (${c})`, cell: (r) => money(r.paymentsMinor), numeric: true },
        { header: `Refunds (${c})`, cell: (r) => money(r.refundsMinor), numeric: true },
        { header: `Dealer debits (${c})`, cell: (r) => money(r.dealerDebitsMinor), numeric: true },
        { header: `Net revenue (${c})`, cell: (r) => money(r.netMinor), numeric: true },
      ]}
      footer={['Total', money(report.totals.paymentsMinor), money(report.totals.refundsMinor), money(report.totals.dealerDebitsMinor), money(report.totals.netMinor)]}
    />
  );
}

export function RevenuePanel({ range, by }: { range: ReportRange; by: RevenueGrouping }) {
  const text = GROUPING_TEXT[by];
  return (
    <ReportSection
      title={text.title}
      description="Customer payments for jobs when they landed, minus refunds when refunded, plus dealer debits for jobs (wholesale, from the dealer balance). Dealer top-ups are prepayments, not revenue."
      query={useShopRevenue(range, by)}
      csvHref={getShopRevenueCsvHref(range, by)}
      csvLabel={text.csv}
      isEmpty={(r) => r.rows.every((row) => row.paymentsMinor === 0 && row.refundsMinor === 0 && row.dealerDebitsMinor === 0)}
      emptyMessage={text.empty}
    >
      {(report) => (
        <>
          {by === 'month' ? <RevenueMonthChart report={report} /> : <RevenueSplitChart report={report} axisTitle={text.first} />}
          <RevenueTable report={report} caption={`${text.title} (${report.currency})`} first={text.first} />
        </>
      )}
    </ReportSection>
  );
}

export function LogQualityPanel({ range }: { range: ReportRange }) {
  return (
    <ReportSection
      title="Log quality"
      description="Of the logs uploaded in the range and analysed, the share that failed or warned each check: where customers need a clearer log request."
      query={useLogQuality(range)}
      csvHref={getLogQualityCsvHref(range)}
      csvLabel="log quality"
      isEmpty={(r) => r.logs === 0}
      emptyMessage="No log was uploaded during these days."
    >
      {(report) => (
        <>
          <LogQualityChart report={report} />
          <ReportTable
            caption={`Check results over ${report.logs} analysed logs`}
            rows={report.rows}
            rowKey={(r) => r.checkId}
            columns={[
              { header: 'Check', cell: (r) => r.label },
              { header: 'Logs checked (count)', cell: (r) => r.logs, numeric: true },
              { header: 'Failed (%)', cell: (r) => `${formatShare(r.failedShare)} (${r.failed})`, numeric: true },
              { header: 'Warned (%)', cell: (r) => `${formatShare(r.warnedShare)} (${r.warned})`, numeric: true },
            ]}
          />
        </>
      )}
    </ReportSection>
  );
}
