import { describe, expect, it } from 'vitest';
import { mrrMinorOf, mrrSeries } from './mrr';

describe('mrrMinorOf', () => {
  it('counts paying statuses at seat price times seats', () => {
    // [CALC] Workshop 49.00 × 3 seats = 147.00 a month
    expect(mrrMinorOf({ status: 'active', planId: 'workshop', seats: 3 })).toBe(14700);
    // [CP] a past-due subscription still counts until it churns; trials count nothing until they pay
    expect(mrrMinorOf({ status: 'past_due', planId: 'fleet', seats: 5 })).toBe(19500);
    expect(mrrMinorOf({ status: 'trialing', planId: 'fleet', seats: 5 })).toBe(0);
    expect(mrrMinorOf({ status: 'canceled', planId: 'solo', seats: 1 })).toBe(0);
  });
});

describe('mrrSeries', () => {
  const now = new Date('2027-03-15T12:00:00Z');
  it('takes each shop’s latest change before each month end', () => {
    const series = mrrSeries(
      [
        { shopId: 'a', at: '2026-12-20T00:00:00Z', mrrMinor: 5900 },
        { shopId: 'b', at: '2027-01-10T00:00:00Z', mrrMinor: 9800 },
        { shopId: 'a', at: '2027-02-01T00:00:00Z', mrrMinor: 14700 },
        { shopId: 'b', at: '2027-02-28T23:59:59Z', mrrMinor: 0 },
        { shopId: 'a', at: '2027-03-20T00:00:00Z', mrrMinor: 99900 },
      ],
      now,
      4,
    );
    // [CALC] Dec: a 59.00; Jan: 59.00 + 98.00; Feb: a 147.00, b churned on the last second of Feb;
    // Mar up to the 15th: a still 147.00 (its change on the 20th lies in the future)
    expect(series).toEqual([
      { month: '2026-12', mrrMinor: 5900, shops: 1 },
      { month: '2027-01', mrrMinor: 15700, shops: 2 },
      { month: '2027-02', mrrMinor: 14700, shops: 1 },
      { month: '2027-03', mrrMinor: 14700, shops: 1 },
    ]);
  });

  it('gives zero months before anything was billed', () => {
    expect(mrrSeries([], now, 2)).toEqual([
      { month: '2027-02', mrrMinor: 0, shops: 0 },
      { month: '2027-03', mrrMinor: 0, shops: 0 },
    ]);
  });
});
