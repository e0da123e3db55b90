import type { DayRangeQuery } from '@revloop/contract';

/** The CSV of every rental money line (fees, holds, captures with their reasons, late fees) in the range; the browser downloads it. */
export function getRentalMoneyExportHref(range: DayRangeQuery): string {
  return `/api/rentals/money.csv?${new URLSearchParams({ from: range.from, to: range.to }).toString()}`;
}
