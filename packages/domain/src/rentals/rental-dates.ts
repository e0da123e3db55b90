import { DomainError } from '../errors';

/**
 * Calendar-day maths on ISO 8601 `YYYY-MM-DD` strings. A day maps to a whole number of days since 1970-01-01 through
 * Date.UTC, which has no time zone and no daylight-saving shift, so adding days never lands on the wrong day. Only
 * `localDay` touches a time zone: it asks Intl which calendar day an instant falls on in the shop's zone.
 */
export type IsoDay = string;
export interface DayRange {
  from: IsoDay;
  to: IsoDay;
}

const MS_PER_DAY = 86_400_000;
const ISO_DAY = /^(\d{4})-(\d{2})-(\d{2})$/;

/** Days since 1970-01-01 for a real calendar day; throws on "2026-02-30" and other impossible days. */
export function dayNumber(day: IsoDay): number {
  const match = ISO_DAY.exec(day);
  if (!match) throw new DomainError('validation', `"${day}" is not a date written YYYY-MM-DD.`);
  const [y, m, d] = [Number(match[1]), Number(match[2]), Number(match[3])];
  const ms = Date.UTC(y, m - 1, d);
  const back = new Date(ms);
  if (back.getUTCFullYear() !== y || back.getUTCMonth() !== m - 1 || back.getUTCDate() !== d) {
    throw new DomainError('validation', `${day} is not a day of the calendar.`);
  }
  return ms / MS_PER_DAY;
}

export const dayFromNumber = (n: number): IsoDay => new Date(n * MS_PER_DAY).toISOString().slice(0, 10);

export const addDays = (day: IsoDay, n: number): IsoDay => dayFromNumber(dayNumber(day) + n);

/** Whole days from `a` to `b` (negative when b is earlier). */
export const daysBetween = (a: IsoDay, b: IsoDay): number => dayNumber(b) - dayNumber(a);

/** Days in an inclusive range: a one-day range is 1. */
export const daysInRange = (range: DayRange): number => Math.max(0, daysBetween(range.from, range.to) + 1);

/** True when two inclusive ranges share at least one day. ISO days sort as strings. */
export const rangesOverlap = (a: DayRange, b: DayRange): boolean => a.from <= b.to && b.from <= a.to;

/** The shared part of two inclusive ranges, or null. */
export function intersectRanges(a: DayRange, b: DayRange): DayRange | null {
  const from = a.from > b.from ? a.from : b.from;
  const to = a.to < b.to ? a.to : b.to;
  return from <= to ? { from, to } : null;
}

/** Sorted ranges merged where they overlap or touch, for a calendar's "busy" days. */
export function mergeRanges(ranges: readonly DayRange[]): DayRange[] {
  const sorted = [...ranges].sort((x, y) => (x.from < y.from ? -1 : x.from > y.from ? 1 : 0));
  const merged: DayRange[] = [];
  for (const range of sorted) {
    const last = merged.at(-1);
    if (last && daysBetween(last.to, range.from) <= 1) {
      if (range.to > last.to) last.to = range.to;
    } else {
      merged.push({ ...range });
    }
  }
  return merged;
}

/**
 * The days a booking takes the kit away from the shop: the shop ships it `shippingDays` before the start and it
 * travels back for `shippingDays` after the due date.
 */
export const blockedRange = (startDate: IsoDay, dueDate: IsoDay, shippingDays: number): DayRange => ({
  from: addDays(startDate, -shippingDays),
  to: addDays(dueDate, shippingDays),
});

const dayFormatters = new Map<string, Intl.DateTimeFormat>();

/** The calendar day `instant` falls on in `timeZone` (IANA name), from the runtime's time zone data. */
export function localDay(instant: Date, timeZone: string): IsoDay {
  let format = dayFormatters.get(timeZone);
  if (!format) {
    format = new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' });
    dayFormatters.set(timeZone, format);
  }
  const parts = Object.fromEntries(format.formatToParts(instant).map((p) => [p.type, p.value]));
  return `${parts.year}-${parts.month}-${parts.day}`;
}

/**
 * Whole days late: the kit is due back on `dueDate` (a shop-local day) and each shop-local midnight after it adds a
 * day. `returnedOn` is the day it came back, or today in the shop's zone while it is still out.
 */
export const lateDays = (dueDate: IsoDay, returnedOn: IsoDay): number => Math.max(0, daysBetween(dueDate, returnedOn));

export const lateFeeMinor = (days: number, dailyFeeMinor: number): number => days * dailyFeeMinor;

/** The rental fee: the rental's days (inclusive) in whole weeks, rounded up, at the weekly price. */
export const rentalFeeMinor = (startDate: IsoDay, dueDate: IsoDay, weeklyPriceMinor: number): number =>
  Math.ceil(daysInRange({ from: startDate, to: dueDate }) / 7) * weeklyPriceMinor;
