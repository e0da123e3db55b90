/** The days a report covers, `YYYY-MM-DD` in the shop's time zone, both included. */
export interface ReportRange {
  from: string;
  to: string;
}

/** Every report query sits under this key. */
export const reportsRootKey = ['reports'] as const;

/** The query string of a report request; `format=csv` asks for the same table as a file. */
export const reportSearch = (range: ReportRange, extra: Record<string, string> = {}) => new URLSearchParams({ from: range.from, to: range.to, ...extra }).toString();

/** Where the browser downloads a report's table as CSV. */
export const reportCsvHref = (path: string, range: ReportRange, extra: Record<string, string> = {}) => `/api/reports/${path}?${reportSearch(range, { ...extra, format: 'csv' })}`;
