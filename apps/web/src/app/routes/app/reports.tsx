import { useSearchParams } from 'react-router-dom';
import { PageHeader } from '../../../components/layout/page-header';
import { LogQualityPanel, RevenuePanel, RoundsPanel, TunerLoadPanel, TurnaroundPanel, WeeklyJobsPanel } from '../../../features/reports/components/report-panels';
import { defaultReportRange, ReportRangeForm } from '../../../features/reports/components/report-range-form';
import type { ReportRange } from '../../../features/reports/api/report-range';
import { RequireScreen } from './require-screen';

const DAY = /^\d{4}-\d{2}-\d{2}$/;

/** The range lives in the address (?from&to), so a report can be bookmarked or sent; the last four months otherwise. */
function useReportRange(): [ReportRange, (patch: Partial<ReportRange>) => void] {
  const [params, setParams] = useSearchParams();
  const fallback = defaultReportRange();
  const read = (key: 'from' | 'to') => {
    const value = params.get(key);
    return value && DAY.test(value) ? value : fallback[key];
  };
  // A functional update: the router applies navigations in a transition, so a second change right after the first
  // must build on the address as it is by then, not on this render's range.
  const update = (patch: Partial<ReportRange>) =>
    setParams(
      (current) => ({ from: patch.from ?? current.get('from') ?? fallback.from, to: patch.to ?? current.get('to') ?? fallback.to }),
      { replace: true },
    );
  return [{ from: read('from'), to: read('to') }, update];
}

function ReportsScreen() {
  const [range, setRange] = useReportRange();
  const valid = range.from <= range.to;
  return (
    <>
      <PageHeader title="Reports" description="How the shop is doing over the days you choose: turnaround, rounds, each tuner's load, revenue and log quality. Every table downloads as CSV." />
      <div className="mb-6">
        <ReportRangeForm range={range} onChange={setRange} />
      </div>
      {valid && (
        <div className="flex flex-col gap-6">
          <TurnaroundPanel range={range} />
          <div className="grid gap-6 xl:grid-cols-2">
            <RoundsPanel range={range} />
            <TunerLoadPanel range={range} />
          </div>
          <WeeklyJobsPanel range={range} />
          <RevenuePanel range={range} by="month" />
          <div className="grid gap-6 xl:grid-cols-2">
            <RevenuePanel range={range} by="package" />
            <RevenuePanel range={range} by="dealer" />
          </div>
          <LogQualityPanel range={range} />
        </div>
      )}
    </>
  );
}

export function ReportsRoute() {
  return (
    <RequireScreen screen="reports">
      <ReportsScreen />
    </RequireScreen>
  );
}
