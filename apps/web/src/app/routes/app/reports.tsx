import { useEffect, useState } from 'react';
import { useSearchParams } from 'react-router-dom';
import { PageHeader } from '../../../components/layout/page-header';
import { LogQualityPanel, RevenuePanel, RoundsPanel, TunerLoadPanel, TurnaroundPanel, WeeklyJobsPanel } from '../../../features/reports/components/report-panels';
import { defaultReportRange, ReportRangeForm } from '../../../features/reports/components/report-range-form';
import type { ReportRange } from '../../../features/reports/api/report-range';
import { RequireScreen } from './require-screen';

const DAY = /^\d{4}-\d{2}-\d{2}$/;

/**
 * The range lives in the address (?from&to), so a report can be bookmarked or sent; the last four months otherwise.
 * The page keeps it in state and writes the address after: the router applies navigations in a transition, so two
 * quick changes read from the address would lose the first.
 */
function useReportRange(): [ReportRange, (patch: Partial<ReportRange>) => void] {
  const [params, setParams] = useSearchParams();
  const [range, setRange] = useState<ReportRange>(() => {
    const fallback = defaultReportRange();
    const read = (key: 'from' | 'to') => {
      const value = params.get(key);
      return value && DAY.test(value) ? value : fallback[key];
    };
    return { from: read('from'), to: read('to') };
  });
  useEffect(() => {
    setParams({ from: range.from, to: range.to }, { replace: true });
  }, [range.from, range.to, setParams]);
  return [range, (patch) => setRange((current) => ({ ...current, ...patch }))];
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
