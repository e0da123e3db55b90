import { DomainError } from '../errors';

export type CsvValue = string | number | null | undefined;

/** OWASP CSV injection: a spreadsheet treats a cell starting with one of these as a formula. */
const FORMULA_TRIGGERS = new Set(['=', '+', '-', '@', '\t', '\r']);
const NEEDS_QUOTES = /[",\r\n]/;

/**
 * One CSV cell: RFC 4180 quoting (quotes doubled, cell wrapped when it holds a comma, quote or line break),
 * and text starting with = + - @ tab or CR gets a leading single quote so a spreadsheet shows it as text.
 * Plain numbers passed as numbers (e.g. -5) are left alone: they are data, not formulas. Null, undefined
 * and non-finite numbers give an empty cell.
 */
export function csvCell(value: CsvValue): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  const text = FORMULA_TRIGGERS.has(value.charAt(0)) ? `'${value}` : value;
  return NEEDS_QUOTES.test(text) ? `"${text.replaceAll('"', '""')}"` : text;
}

/** One CSV record ended by CRLF, as RFC 4180 specifies; for documents written a batch at a time. */
export const csvLine = (cells: CsvValue[]): string => `${cells.map(csvCell).join(',')}\r\n`;

/** A whole CSV document: header line, then rows, every line ended by CRLF as RFC 4180 specifies. */
export function toCsv(header: string[], rows: CsvValue[][]): string {
  rows.forEach((row, i) => {
    if (row.length !== header.length) {
      throw new DomainError(
        'validation',
        `CSV row ${i + 1} has ${row.length} cells but the header has ${header.length}.`,
      );
    }
  });
  return [header, ...rows].map(csvLine).join('');
}
