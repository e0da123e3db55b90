import type { ReactNode } from 'react';
import type { ReactTable, RowData, rowSortingFeature, TableFeatures } from '@tanstack/react-table';
import { cn } from '../../lib/cn';
import { ScrollRegion } from './scroll-region';

const SORT_ICON = { asc: '▲', desc: '▼' } as const;

/** What the view needs of a column; SortableFeatures guarantees it, but TypeScript cannot narrow a generic column. */
interface SortableColumn {
  getIsSorted(): false | 'asc' | 'desc';
  getCanSort(): boolean;
  getToggleSortingHandler(): ((event: unknown) => void) | undefined;
}

/** Every table of the app sorts, so the view may draw sort buttons. */
type SortableFeatures = TableFeatures & { rowSortingFeature: typeof rowSortingFeature };

export interface TableViewProps<TFeatures extends SortableFeatures, TData extends RowData, TSelected> {
  table: ReactTable<TFeatures, TData, TSelected>;
  /** Names the table for screen readers and tests. */
  caption: string;
  emptyMessage: ReactNode;
  /** Narrower cells for wide tables. */
  dense?: boolean;
  minWidthClass?: string;
}

/** The markup of every table in the app: sortable headers as buttons with aria-sort, and an empty row. */
export function TableView<TFeatures extends SortableFeatures, TData extends RowData, TSelected>({
  table,
  caption,
  emptyMessage,
  dense = false,
  minWidthClass = 'min-w-[36rem]',
}: TableViewProps<TFeatures, TData, TSelected>) {
  const rows = table.getRowModel().rows;
  const cellPadding = dense ? 'px-2 py-2.5' : 'px-4 py-3';
  return (
    <ScrollRegion label={caption} className="rounded-lg border border-ink-200 bg-white">
      <table className={cn('w-full border-collapse text-left text-sm', minWidthClass)}>
        <caption className="sr-only">{caption}</caption>
        <thead className="bg-ink-50 text-xs tracking-wide text-ink-600 uppercase">
          {table.getHeaderGroups().map((group) => (
            <tr key={group.id}>
              {group.headers.map((header) => {
                const column = header.column as unknown as SortableColumn;
                const sorted = column.getIsSorted();
                const canSort = column.getCanSort();
                return (
                  <th
                    key={header.id}
                    scope="col"
                    aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : canSort ? 'none' : undefined}
                    className={cn('border-b border-ink-200 py-2.5 font-medium', dense ? 'px-2' : 'px-4')}
                  >
                    {header.isPlaceholder ? null : canSort ? (
                      <button type="button" onClick={column.getToggleSortingHandler()} className="inline-flex items-center gap-1 rounded uppercase hover:text-ink-900">
                        <table.FlexRender header={header} />
                        <span aria-hidden="true" className={cn('text-[0.6rem]', !sorted && 'opacity-30')}>
                          {sorted ? SORT_ICON[sorted] : '▲'}
                        </span>
                      </button>
                    ) : (
                      <table.FlexRender header={header} />
                    )}
                  </th>
                );
              })}
            </tr>
          ))}
        </thead>
        <tbody>
          {rows.length === 0 ? (
            <tr>
              <td colSpan={table.getAllLeafColumns().length} className="px-4 py-8 text-center text-ink-600">
                {emptyMessage}
              </td>
            </tr>
          ) : (
            rows.map((row) => (
              <tr key={row.id} className="border-b border-ink-100 last:border-b-0 hover:bg-ink-50">
                {row.getAllCells().map((cell) => (
                  <td key={cell.id} className={cn('align-middle whitespace-nowrap text-ink-800', cellPadding)}>
                    <table.FlexRender cell={cell} />
                  </td>
                ))}
              </tr>
            ))
          )}
        </tbody>
      </table>
    </ScrollRegion>
  );
}
