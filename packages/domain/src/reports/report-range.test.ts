import { describe, expect, it } from 'vitest';
import { dayIn, dayStartIn, daysBetween, monthsIn, rangeIn, weeksIn } from './report-range';

describe('report ranges in the shop time zone', () => {
  it('a day starts at local midnight, across daylight-saving changes', () => {
    // EU summer time starts on the last Sunday of March at 01:00 UTC: CET (+01:00) before, CEST (+02:00) after [STD] Directive 2000/84/EC.
    expect(dayStartIn('2026-03-29', 'Europe/Berlin').toISOString()).toBe('2026-03-28T23:00:00.000Z');
    expect(dayStartIn('2026-03-30', 'Europe/Berlin').toISOString()).toBe('2026-03-29T22:00:00.000Z');
    // US daylight time ends on the first Sunday of November: EDT (−04:00) until 02:00 local, then EST (−05:00) [STD] 15 U.S.C. 260a.
    expect(dayStartIn('2026-11-01', 'America/New_York').toISOString()).toBe('2026-11-01T04:00:00.000Z');
    expect(dayStartIn('2026-11-02', 'America/New_York').toISOString()).toBe('2026-11-02T05:00:00.000Z');
    expect(dayStartIn('2026-07-01', 'UTC').toISOString()).toBe('2026-07-01T00:00:00.000Z');
    expect(dayIn(new Date('2026-03-28T23:30:00Z'), 'Europe/Berlin')).toBe('2026-03-29');
  });

  it('a range includes both days; its end is the start of the day after', () => {
    expect(rangeIn('2026-03-01', '2026-03-31', 'Europe/Berlin')).toEqual({ from: '2026-02-28T23:00:00.000Z', to: '2026-03-31T22:00:00.000Z' });
    expect(daysBetween('2026-01-01', '2026-12-31')).toBe(365);
  });

  it('weeks start on Monday (ISO 8601) and are clipped to the range', () => {
    // 2026-12-02 is a Wednesday; 2026-11-30 the Monday of its week [CALC] (2026-01-01 is a Thursday).
    const weeks = weeksIn('2026-12-02', '2026-12-14', 'UTC');
    expect(weeks.map((w) => w.key)).toEqual(['2026-11-30', '2026-12-07', '2026-12-14']);
    expect(weeks[0]).toEqual({ key: '2026-11-30', start: '2026-12-02T00:00:00.000Z', end: '2026-12-07T00:00:00.000Z' });
    expect(weeks.at(-1)).toEqual({ key: '2026-12-14', start: '2026-12-14T00:00:00.000Z', end: '2026-12-15T00:00:00.000Z' });
  });

  it('months follow the calendar, each one ending where the next begins', () => {
    const months = monthsIn('2026-01-15', '2026-04-02', 'Europe/Berlin');
    expect(months.map((m) => m.key)).toEqual(['2026-01', '2026-02', '2026-03', '2026-04']);
    expect(months[1]).toEqual({ key: '2026-02', start: '2026-01-31T23:00:00.000Z', end: '2026-02-28T23:00:00.000Z' });
    expect(months[3]!.end).toBe('2026-04-02T22:00:00.000Z');
    for (let i = 1; i < months.length; i++) expect(months[i]!.start).toBe(months[i - 1]!.end);
  });
});
