import type { ReactNode } from 'react';
import { Bar, BarChart, CartesianGrid, ComposedChart, Legend, Line, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import type { LogQualityReport, RevenueReport, RoundsReport, TunerLoadReport, TurnaroundReport, WeeklyJobsReport } from '@revloop/contract';
import { formatMoney } from '@revloop/domain/billing';
import { ScrollRegion } from '../../../components/ui/scroll-region';
import { formatHours, formatShare, formatWeek } from './report-format';

const TICK = { fontSize: 12 };
const AXIS_LABEL = { fontSize: 12, fill: 'var(--color-ink-700)' };
const LEGEND = { fontSize: 13 };
/** Legend words in the text colour: recharts paints them in the series colour, too faint for the light bars. */
const legendText = (value: string) => <span style={{ color: 'var(--color-ink-800)' }}>{value}</span>;

/**
 * A chart in a figure with a text summary for screen readers. `minWidthPx` keeps many bars legible on a phone: the
 * chart then scrolls sideways inside a named region instead of shrinking its bars to slivers.
 */
function ChartFrame({ label, summary, minWidthPx = 0, heightClass = 'h-72', children }: { label: string; summary: string; minWidthPx?: number; heightClass?: string; children: ReactNode }) {
  return (
    <figure>
      <ScrollRegion label={`${label} (chart)`}>
        <div className={`${heightClass} w-full`} style={{ minWidth: minWidthPx }}>
          <ResponsiveContainer>{children}</ResponsiveContainer>
        </div>
      </ScrollRegion>
      <figcaption className="sr-only">{summary}</figcaption>
    </figure>
  );
}

export function TurnaroundChart({ report }: { report: TurnaroundReport }) {
  return (
    <ChartFrame label="Time in each state" minWidthPx={480} summary={report.rows.map((r) => `${r.stateLabel}: median ${formatHours(r.medianHours)}, 90th percentile ${formatHours(r.p90Hours)}`).join('; ')}>
      <BarChart data={report.rows} margin={{ top: 8, right: 16, bottom: 8, left: 16 }}>
        <CartesianGrid strokeDasharray="3 3" stroke="var(--color-ink-200)" />
        <XAxis dataKey="stateLabel" tick={TICK} height={48} interval={0} label={{ ...AXIS_LABEL, value: 'Job state', position: 'insideBottom' }} />
        <YAxis tick={TICK} width={64} label={{ ...AXIS_LABEL, value: 'Time in state (h)', angle: -90, position: 'insideLeft' }} />
        <Tooltip formatter={(v) => formatHours(Number(v))} />
        <Legend verticalAlign="top" wrapperStyle={LEGEND} formatter={legendText} />
        <Bar isAnimationActive={false} dataKey="medianHours" name="Median (h)" fill="var(--color-accent-500)" />
        <Bar isAnimationActive={false} dataKey="p90Hours" name="90th percentile (h)" fill="var(--color-accent-200)" stroke="var(--color-accent-700)" />
      </BarChart>
    </ChartFrame>
  );
}

export function RoundsChart({ report }: { report: RoundsReport }) {
  return (
    <ChartFrame label="Rounds per dialed-in job" summary={report.rows.map((r) => `${r.rounds} rounds: ${r.jobs} jobs`).join('; ')}>
      <BarChart data={report.rows} margin={{ top: 8, right: 16, bottom: 8, left: 16 }}>
        <CartesianGrid strokeDasharray="3 3" stroke="var(--color-ink-200)" />
        <XAxis dataKey="rounds" tick={TICK} height={48} label={{ ...AXIS_LABEL, value: 'Rounds (revisions sent)', position: 'insideBottom' }} />
        <YAxis tick={TICK} width={56} allowDecimals={false} label={{ ...AXIS_LABEL, value: 'Jobs (count)', angle: -90, position: 'insideLeft' }} />
        <Tooltip />
        <Legend verticalAlign="top" wrapperStyle={LEGEND} formatter={legendText} />
        <Bar isAnimationActive={false} dataKey="jobs" name="Jobs dialed in" fill="var(--color-state-done)" />
      </BarChart>
    </ChartFrame>
  );
}

export function WeeklyJobsChart({ report }: { report: WeeklyJobsReport }) {
  const data = report.rows.map((r) => ({ ...r, label: formatWeek(r.weekStart) }));
  return (
    <ChartFrame label="Jobs per week" minWidthPx={Math.max(320, data.length * 28)} summary={data.map((r) => `Week of ${r.label}: ${r.opened} opened, ${r.dialedIn} dialed in`).join('; ')}>
      <BarChart data={data} margin={{ top: 8, right: 16, bottom: 8, left: 16 }}>
        <CartesianGrid strokeDasharray="3 3" stroke="var(--color-ink-200)" />
        <XAxis dataKey="label" tick={TICK} height={48} label={{ ...AXIS_LABEL, value: 'Week starting (Monday)', position: 'insideBottom' }} />
        <YAxis tick={TICK} width={56} allowDecimals={false} label={{ ...AXIS_LABEL, value: 'Jobs (count)', angle: -90, position: 'insideLeft' }} />
        <Tooltip />
        <Legend verticalAlign="top" wrapperStyle={LEGEND} formatter={legendText} />
        <Bar isAnimationActive={false} dataKey="opened" name="Opened" fill="var(--color-state-ready)" />
        <Bar isAnimationActive={false} dataKey="dialedIn" name="Dialed in" fill="var(--color-state-done)" />
      </BarChart>
    </ChartFrame>
  );
}

export function TunerLoadChart({ report }: { report: TunerLoadReport }) {
  // Only the plotted fields: recharts copies a row's fields onto its bar, and a `role` field there is an invalid ARIA role.
  const data = report.rows.map((r) => ({ name: r.name, openJobs: r.openJobs, dialedIn: r.dialedIn }));
  return (
    <ChartFrame label="Load per tuner" minWidthPx={Math.max(320, report.rows.length * 110)} summary={report.rows.map((r) => `${r.name}: ${r.openJobs} open, ${r.dialedIn} dialed in`).join('; ')}>
      <BarChart data={data} margin={{ top: 8, right: 16, bottom: 8, left: 16 }}>
        <CartesianGrid strokeDasharray="3 3" stroke="var(--color-ink-200)" />
        <XAxis dataKey="name" tick={TICK} height={48} interval={0} label={{ ...AXIS_LABEL, value: 'Tuner', position: 'insideBottom' }} />
        <YAxis tick={TICK} width={56} allowDecimals={false} label={{ ...AXIS_LABEL, value: 'Jobs (count)', angle: -90, position: 'insideLeft' }} />
        <Tooltip />
        <Legend verticalAlign="top" wrapperStyle={LEGEND} formatter={legendText} />
        <Bar isAnimationActive={false} dataKey="openJobs" name="Open jobs now" fill="var(--color-state-bench)" />
        <Bar isAnimationActive={false} dataKey="dialedIn" name="Dialed in (range)" fill="var(--color-state-done)" />
      </BarChart>
    </ChartFrame>
  );
}

/** Money in, by month: payments and dealer debits up, refunds down, the net as a line. */
export function RevenueMonthChart({ report }: { report: RevenueReport }) {
  const data = report.rows.map((r) => ({ ...r, refundsNegMinor: -r.refundsMinor }));
  const money = (minor: number) => formatMoney(Math.round(minor), report.currency);
  return (
    <ChartFrame label="Revenue by month" minWidthPx={Math.max(320, data.length * 70)} summary={data.map((r) => `${r.label}: net ${money(r.netMinor)}`).join('; ')}>
      <ComposedChart data={data} margin={{ top: 8, right: 16, bottom: 8, left: 24 }} stackOffset="sign">
        <CartesianGrid strokeDasharray="3 3" stroke="var(--color-ink-200)" />
        <XAxis dataKey="label" tick={TICK} height={48} label={{ ...AXIS_LABEL, value: 'Month (YYYY-MM)', position: 'insideBottom' }} />
        <YAxis
          tick={TICK}
          width={84}
          tickFormatter={(v: number) => money(v).replace(/\.0+$/, '')}
          label={{ ...AXIS_LABEL, value: `Amount (${report.currency})`, angle: -90, position: 'insideLeft', dx: -12 }}
        />
        <Tooltip formatter={(v) => money(Number(v))} />
        <Legend verticalAlign="top" wrapperStyle={LEGEND} formatter={legendText} />
        <ReferenceLine y={0} stroke="var(--color-ink-400)" />
        <Bar isAnimationActive={false} dataKey="paymentsMinor" name="Customer payments" stackId="money" fill="var(--color-accent-500)" />
        <Bar isAnimationActive={false} dataKey="dealerDebitsMinor" name="Dealer debits" stackId="money" fill="var(--color-accent-200)" />
        <Bar isAnimationActive={false} dataKey="refundsNegMinor" name="Refunds" stackId="money" fill="var(--color-bad)" />
        <Line isAnimationActive={false} dataKey="netMinor" name="Net revenue" stroke="var(--color-ink-900)" strokeWidth={2} dot />
      </ComposedChart>
    </ChartFrame>
  );
}

/** Net revenue per package or dealer as horizontal bars, so long names stay readable. */
export function RevenueSplitChart({ report, axisTitle }: { report: RevenueReport; axisTitle: string }) {
  const money = (minor: number) => formatMoney(Math.round(minor), report.currency);
  return (
    <ChartFrame label={`Revenue by ${report.by}`} heightClass={report.rows.length > 4 ? 'h-96' : 'h-64'} summary={report.rows.map((r) => `${r.label}: net ${money(r.netMinor)}`).join('; ')}>
      <BarChart data={report.rows} layout="vertical" margin={{ top: 8, right: 24, bottom: 8, left: 8 }}>
        <CartesianGrid strokeDasharray="3 3" stroke="var(--color-ink-200)" />
        <XAxis type="number" tick={TICK} height={48} tickFormatter={(v: number) => money(v).replace(/\.0+$/, '')} label={{ ...AXIS_LABEL, value: `Net revenue (${report.currency})`, position: 'insideBottom' }} />
        <YAxis type="category" dataKey="label" tick={TICK} width={130} label={{ ...AXIS_LABEL, value: axisTitle, angle: -90, position: 'insideLeft' }} />
        <Tooltip formatter={(v) => money(Number(v))} />
        <Legend verticalAlign="top" wrapperStyle={LEGEND} formatter={legendText} />
        <Bar isAnimationActive={false} dataKey="netMinor" name="Net revenue" fill="var(--color-accent-500)" />
      </BarChart>
    </ChartFrame>
  );
}

export function LogQualityChart({ report }: { report: LogQualityReport }) {
  const data = report.rows.map((r) => ({ ...r, failedPct: r.failedShare * 100, warnedPct: r.warnedShare * 100 }));
  return (
    <ChartFrame label="Log quality" heightClass="h-80" summary={data.map((r) => `${r.label}: ${formatShare(r.failedShare)} failed, ${formatShare(r.warnedShare)} warned`).join('; ')}>
      <BarChart data={data} layout="vertical" margin={{ top: 8, right: 24, bottom: 8, left: 8 }}>
        <CartesianGrid strokeDasharray="3 3" stroke="var(--color-ink-200)" />
        <XAxis type="number" domain={[0, 100]} tick={TICK} height={48} unit=" %" label={{ ...AXIS_LABEL, value: 'Share of logs checked (%)', position: 'insideBottom' }} />
        <YAxis type="category" dataKey="label" tick={TICK} width={130} label={{ ...AXIS_LABEL, value: 'Check', angle: -90, position: 'insideLeft' }} />
        <Tooltip formatter={(v) => `${Number(v).toFixed(1)} %`} />
        <Legend verticalAlign="top" wrapperStyle={LEGEND} formatter={legendText} />
        <Bar isAnimationActive={false} dataKey="failedPct" name="Failed (%)" stackId="share" fill="var(--color-bad)" />
        <Bar isAnimationActive={false} dataKey="warnedPct" name="Warned (%)" stackId="share" fill="var(--color-state-customer)" />
      </BarChart>
    </ChartFrame>
  );
}
