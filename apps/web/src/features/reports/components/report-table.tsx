import type { ReactNode } from 'react';
import { ScrollRegion } from '../../../components/ui/scroll-region';
import { cn } from '../../../lib/cn';

export interface ReportColumn<T> {
  /** The header, with its unit, as the CSV export names it. */
  header: string;
  cell: (row: T) => ReactNode;
  numeric?: boolean;
}

/** A report's numbers as a plain table with a visible caption; it scrolls sideways on a phone instead of squeezing. */
export function ReportTable<T>({ caption, columns, rows, rowKey, footer }: { caption: string; columns: ReportColumn<T>[]; rows: T[]; rowKey: (row: T) => string; footer?: ReactNode[] }) {
  return (
    <ScrollRegion label={caption} className="rounded-lg border border-ink-200 bg-white">
      <table className="w-full min-w-[32rem] border-collapse text-left text-sm">
        <caption className="px-4 pt-3 pb-2 text-left text-sm font-medium text-ink-700">{caption}</caption>
        <thead className="bg-ink-50 text-xs text-ink-600">
          <tr>
            {columns.map((c) => (
              <th key={c.header} scope="col" className={cn('border-y border-ink-200 px-4 py-2.5 font-medium', c.numeric && 'text-right')}>
                {c.header}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.map((row) => (
            <tr key={rowKey(row)} className="border-b border-ink-100 last:border-b-0">
              {columns.map((c, i) =>
                i === 0 ? (
                  <th key={c.header} scope="row" className="px-4 py-2.5 font-medium whitespace-nowrap text-ink-900">
                    {c.cell(row)}
                  </th>
                ) : (
                  <td key={c.header} className={cn('px-4 py-2.5 whitespace-nowrap text-ink-800', c.numeric && 'text-right tabular-nums')}>
                    {c.cell(row)}
                  </td>
                ),
              )}
            </tr>
          ))}
        </tbody>
        {footer && (
          <tfoot>
            <tr className="border-t border-ink-300 bg-ink-50 font-semibold">
              {footer.map((cell, i) =>
                i === 0 ? (
                  <th key={i} scope="row" className="px-4 py-2.5 text-ink-900">
                    {cell}
                  </th>
                ) : (
                  <td key={i} className={cn('px-4 py-2.5 whitespace-nowrap', columns[i]?.numeric && 'text-right tabular-nums')}>
                    {cell}
                  </td>
                ),
              )}
            </tr>
          </tfoot>
        )}
      </table>
    </ScrollRegion>
  );
}
