/**
 * Report date ranges: calendar days in the shop's time zone turned into UTC instants, and the weeks (Monday first,
 * ISO 8601) and months a range is cut into for the charts. Pure calendar arithmetic on `Intl`, no I/O.
 */

const DAY_MS = 86_400_000;

/** `YYYY-MM-DD` → its calendar parts; the caller has validated the format. */
const partsOf = (day: string) => {
  const [y, m, d] = day.split('-').map(Number) as [number, number, number];
  return { y, m, d };
};

/** A calendar day as a UTC date at midnight, used only for calendar arithmetic. */
const calendarMs = (day: string) => {
  const { y, m, d } = partsOf(day);
  return Date.UTC(y, m - 1, d);
};
const dayOf = (ms: number) => new Date(ms).toISOString().slice(0, 10);

const formatters = new Map<string, Intl.DateTimeFormat>();

/** How far the zone's wall clock is ahead of UTC at `instant`, in ms (negative west of Greenwich). */
function zoneOffsetMs(instant: number, timeZone: string): number {
  let format = formatters.get(timeZone);
  if (!format) {
    format = new Intl.DateTimeFormat('en-US', { timeZone, hourCycle: 'h23', year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit', second: '2-digit' });
    formatters.set(timeZone, format);
  }
  const parts = format.formatToParts(instant);
  const get = (type: Intl.DateTimeFormatPartTypes) => Number(parts.find((p) => p.type === type)?.value);
  const wall = Date.UTC(get('year'), get('month') - 1, get('day'), get('hour'), get('minute'), get('second'));
  return wall - Math.floor(instant / 1000) * 1000;
}

/** The UTC instant at which `day` begins in `timeZone` (midnight local time; checked twice so a DST change between guesses is caught). */
export function dayStartIn(day: string, timeZone: string): Date {
  const wall = calendarMs(day);
  const first = wall - zoneOffsetMs(wall, timeZone);
  return new Date(wall - zoneOffsetMs(first, timeZone));
}

/** The calendar day an instant falls on in `timeZone`. */
export function dayIn(instant: Date, timeZone: string): string {
  return dayOf(instant.getTime() + zoneOffsetMs(instant.getTime(), timeZone));
}

export const addDays = (day: string, days: number): string => dayOf(calendarMs(day) + days * DAY_MS);

/** Whole days from `from` to `to`, both included. */
export const daysBetween = (from: string, to: string): number => Math.round((calendarMs(to) - calendarMs(from)) / DAY_MS) + 1;

export interface InstantRange {
  from: string;
  to: string;
}

/** Days `from`…`to` (both included) in the zone, as ISO instants with `to` excluded: the start of the day after. */
export function rangeIn(from: string, to: string, timeZone: string): InstantRange {
  return { from: dayStartIn(from, timeZone).toISOString(), to: dayStartIn(addDays(to, 1), timeZone).toISOString() };
}

export interface RangeBucket {
  /** The week's Monday (`YYYY-MM-DD`) or the month (`YYYY-MM`). */
  key: string;
  start: string;
  end: string;
}

/** Cuts the days `from`…`to` at the given calendar days; the first and last buckets are clipped to the range. */
function bucketsAt(from: string, to: string, timeZone: string, firstKey: string, next: (day: string) => string, keyOf: (day: string) => string): RangeBucket[] {
  const range = rangeIn(from, to, timeZone);
  const buckets: RangeBucket[] = [];
  let key = firstKey;
  let start = range.from;
  for (let boundary = next(firstKey); start < range.to; boundary = next(boundary)) {
    const end = boundary > to ? range.to : dayStartIn(boundary, timeZone).toISOString();
    buckets.push({ key: keyOf(key), start, end });
    key = boundary;
    start = end;
  }
  return buckets;
}

/** ISO 8601 weeks (Monday first) that the days `from`…`to` touch, keyed by their Monday. */
export function weeksIn(from: string, to: string, timeZone: string): RangeBucket[] {
  const weekday = (new Date(calendarMs(from)).getUTCDay() + 6) % 7;
  return bucketsAt(from, to, timeZone, addDays(from, -weekday), (day) => addDays(day, 7), (day) => day);
}

/** Calendar months that the days `from`…`to` touch, keyed `YYYY-MM`. */
export function monthsIn(from: string, to: string, timeZone: string): RangeBucket[] {
  const nextMonth = (day: string) => {
    const { y, m } = partsOf(day);
    return dayOf(Date.UTC(y, m, 1));
  };
  return bucketsAt(from, to, timeZone, `${from.slice(0, 7)}-01`, nextMonth, (day) => day.slice(0, 7));
}
