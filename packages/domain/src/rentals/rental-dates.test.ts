import { describe, expect, it } from 'vitest';
import {
  addDays,
  blockedRange,
  daysBetween,
  daysInRange,
  lateDays,
  lateFeeMinor,
  localDay,
  mergeRanges,
  rangesOverlap,
  rentalFeeMinor,
} from './rental-dates';

describe('calendar days', () => {
  it('counts across month ends and leap days', () => {
    // [STD] Gregorian calendar (ISO 8601): 2026 is not a leap year, 2028 is.
    expect(daysBetween('2026-02-28', '2026-03-01')).toBe(1);
    expect(daysBetween('2028-02-28', '2028-03-01')).toBe(2);
    expect(addDays('2026-12-31', 1)).toBe('2027-01-01');
    expect(daysBetween('2026-01-01', '2027-01-01')).toBe(365); // [STD]
  });

  it('refuses impossible days', () => {
    expect(() => daysBetween('2026-02-29', '2026-03-01')).toThrow(/not a day/);
    expect(() => addDays('2026-3-1', 1)).toThrow(/YYYY-MM-DD/);
  });

  it('ranges are inclusive at both ends', () => {
    // [CALC] a rental from Monday to Sunday is 7 days; one that starts the day another ends shares that day.
    expect(daysInRange({ from: '2026-12-07', to: '2026-12-13' })).toBe(7);
    expect(rangesOverlap({ from: '2026-12-01', to: '2026-12-05' }, { from: '2026-12-05', to: '2026-12-09' })).toBe(true);
    expect(rangesOverlap({ from: '2026-12-01', to: '2026-12-05' }, { from: '2026-12-06', to: '2026-12-09' })).toBe(false);
  });

  it('widens a booking by the shipping days on both sides', () => {
    // [CALC] 2 shipping days: ships 2 days before the start, back 2 days after the due date.
    expect(blockedRange('2026-12-10', '2026-12-16', 2)).toEqual({ from: '2026-12-08', to: '2026-12-18' });
    // [CALC] adjacent bookings: the next may start when its shipping window begins the day after this one ends.
    const first = blockedRange('2026-12-10', '2026-12-16', 2);
    expect(rangesOverlap(first, blockedRange('2026-12-21', '2026-12-25', 2))).toBe(false);
    expect(rangesOverlap(first, blockedRange('2026-12-20', '2026-12-25', 2))).toBe(true);
  });

  it('merges touching busy ranges', () => {
    expect(
      mergeRanges([
        { from: '2026-12-10', to: '2026-12-12' },
        { from: '2026-12-01', to: '2026-12-03' },
        { from: '2026-12-04', to: '2026-12-05' },
      ]),
    ).toEqual([
      { from: '2026-12-01', to: '2026-12-05' },
      { from: '2026-12-10', to: '2026-12-12' },
    ]);
  });
});

describe('late days at the shop-local day boundary', () => {
  it('turns the day at local midnight, including on daylight-saving days', () => {
    // [STD] EU summer time (Directive 2000/84/EC) begins 2026-03-29 01:00 UTC and ends 2026-10-25 01:00 UTC:
    // Berlin is UTC+1 before/after and UTC+2 between, so local midnight is 23:00Z or 22:00Z the day before.
    const tz = 'Europe/Berlin';
    expect(localDay(new Date('2026-03-28T22:59:59Z'), tz)).toBe('2026-03-28');
    expect(localDay(new Date('2026-03-28T23:00:00Z'), tz)).toBe('2026-03-29');
    expect(localDay(new Date('2026-03-29T21:59:59Z'), tz)).toBe('2026-03-29'); // the 23-hour day
    expect(localDay(new Date('2026-03-29T22:00:00Z'), tz)).toBe('2026-03-30');
    expect(localDay(new Date('2026-10-25T22:59:59Z'), tz)).toBe('2026-10-25'); // the 25-hour day
    expect(localDay(new Date('2026-10-25T23:00:00Z'), tz)).toBe('2026-10-26');
    // [STD] US DST (Energy Policy Act 2005) begins 2026-03-08 at 02:00 local: New York is UTC-4 from then.
    expect(localDay(new Date('2026-03-09T03:59:59Z'), 'America/New_York')).toBe('2026-03-08');
    expect(localDay(new Date('2026-03-09T04:00:00Z'), 'America/New_York')).toBe('2026-03-09');
  });

  it('counts a late day per local midnight after the due date', () => {
    const tz = 'Europe/Berlin';
    const late = (instant: string) => lateDays('2026-03-28', localDay(new Date(instant), tz));
    // [CALC] due on the 28th: late from Berlin midnight, a second day from the next Berlin midnight (23 hours later).
    expect(late('2026-03-28T22:59:59Z')).toBe(0);
    expect(late('2026-03-28T23:00:00Z')).toBe(1);
    expect(late('2026-03-29T21:59:59Z')).toBe(1);
    expect(late('2026-03-29T22:00:00Z')).toBe(2);
    expect(lateDays('2026-03-28', '2026-03-20')).toBe(0);
  });

  it('charges late days at the daily fee, and the fee in whole weeks rounded up', () => {
    expect(lateFeeMinor(3, 1500)).toBe(4500); // [CALC] 3 × 15.00
    expect(rentalFeeMinor('2026-12-01', '2026-12-07', 9000)).toBe(9000); // [CALC] 7 days = 1 week
    expect(rentalFeeMinor('2026-12-01', '2026-12-08', 9000)).toBe(18000); // [CALC] 8 days → 2 weeks
  });
});
