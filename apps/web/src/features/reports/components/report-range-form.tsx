import { useId } from 'react';
import { Field } from '../../../components/ui/field';
import { Input } from '../../../components/ui/input';
import type { ReportRange } from '../api/report-range';

/** Today's calendar day on this device, `YYYY-MM-DD`. */
export function localDay(date: Date = new Date()): string {
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${date.getFullYear()}-${pad(date.getMonth() + 1)}-${pad(date.getDate())}`;
}

/** The default range: the last four months up to today. */
export function defaultReportRange(today: Date = new Date()): ReportRange {
  const from = new Date(today);
  from.setMonth(from.getMonth() - 4);
  return { from: localDay(from), to: localDay(today) };
}

/** Two native date fields; each change applies at once (the reports refetch), a backwards range says so. */
export function ReportRangeForm({ range, onChange }: { range: ReportRange; onChange: (patch: Partial<ReportRange>) => void }) {
  const id = useId();
  const backwards = range.from > range.to;
  return (
    <form className="flex flex-wrap items-end gap-4" onSubmit={(e) => e.preventDefault()} aria-label="Report dates">
      <Field id={`${id}-from`} label="From" hint="First day, in the shop's time zone">
        {(a11y) => <Input type="date" {...a11y} value={range.from} max={range.to} required onChange={(e) => e.target.value && onChange({ from: e.target.value })} />}
      </Field>
      <Field id={`${id}-to`} label="To" error={backwards ? 'The end date must not be before the start date.' : undefined} hint="Last day, included">
        {(a11y) => <Input type="date" {...a11y} value={range.to} min={range.from} required onChange={(e) => e.target.value && onChange({ to: e.target.value })} />}
      </Field>
    </form>
  );
}
