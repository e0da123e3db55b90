import type { DayRange } from '@revloop/contract';
import { addDays, dayNumber } from '@revloop/domain/rentals';
import { cn } from '../../../lib/cn';

const WEEKDAYS = ['Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat', 'Sun'];

/** The first and last day of the month holding `day` (YYYY-MM-DD). */
export function monthOf(day: string): DayRange {
  const [y, m] = day.split('-').map(Number) as [number, number];
  const last = new Date(Date.UTC(y, m, 0)).getUTCDate();
  const mm = String(m).padStart(2, '0');
  return { from: `${y}-${mm}-01`, to: `${y}-${mm}-${String(last).padStart(2, '0')}` };
}

const inAny = (day: string, ranges: readonly DayRange[]) => ranges.some((r) => r.from <= day && day <= r.to);

/**
 * A month as a CSS grid, Monday first. Busy days are shaded; `labelFor` names what holds a day (staff see bookings).
 * Each day is a list item with its state in words, so a screen reader does not depend on the shading.
 */
export function MonthCalendar({ month, busy, labelFor }: { month: DayRange; busy: readonly DayRange[]; labelFor?: (day: string) => string | null }) {
  // 1970-01-01 (day 0) was a Thursday: weekday index with Monday = 0.
  const lead = (dayNumber(month.from) + 3) % 7;
  const days: string[] = [];
  for (let d = month.from; d <= month.to; d = addDays(d, 1)) days.push(d);
  return (
    <div>
      <div className="grid grid-cols-7 gap-1 text-center text-xs font-medium text-ink-600" aria-hidden="true">
        {WEEKDAYS.map((w) => (
          <div key={w}>{w}</div>
        ))}
      </div>
      <ol className="mt-1 grid grid-cols-7 gap-1" aria-label={`Days from ${month.from} to ${month.to}`}>
        {days.map((day, i) => {
          const isBusy = inAny(day, busy);
          const label = labelFor?.(day) ?? null;
          return (
            <li
              key={day}
              style={i === 0 ? { gridColumnStart: lead + 1 } : undefined}
              className={cn('min-h-12 rounded border p-1 text-xs', isBusy ? 'border-warn/40 bg-warn-soft' : 'border-ink-100 bg-white')}
            >
              <span className="font-medium">{Number(day.slice(8))}</span>
              <span className="sr-only">{isBusy ? ' busy' : ' free'}</span>
              {label && <span className="mt-0.5 block truncate text-[10px] text-ink-700">{label}</span>}
            </li>
          );
        })}
      </ol>
      <p className="mt-2 flex items-center gap-2 text-xs text-ink-600">
        <span className="inline-block h-3 w-3 rounded border border-warn/40 bg-warn-soft" aria-hidden="true" /> Busy (booked, including shipping days)
      </p>
    </div>
  );
}
