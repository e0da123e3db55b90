import { useState } from 'react';
import {
  columnFilteringFeature,
  createColumnHelper,
  createFilteredRowModel,
  createSortedRowModel,
  filterFn_equalsString,
  filterFn_includesString,
  globalFilteringFeature,
  rowSortingFeature,
  sortFn_alphanumeric,
  sortFn_basic,
  sortFn_datetime,
  sortFn_text,
  tableFeatures,
  useTable,
  type ColumnDef,
  type ColumnFiltersState,
  type RowData,
  type SortingState,
} from '@tanstack/react-table';
import { TableView } from './table-view';

/** One feature set for every table of the app: client-side sorting, a text filter and column filters. */
export const dataTableFeatures = tableFeatures({
  rowSortingFeature,
  columnFilteringFeature,
  globalFilteringFeature,
  filteredRowModel: createFilteredRowModel(),
  sortedRowModel: createSortedRowModel(),
  sortFns: { alphanumeric: sortFn_alphanumeric, text: sortFn_text, datetime: sortFn_datetime, basic: sortFn_basic },
  filterFns: { includesString: filterFn_includesString, equalsString: filterFn_equalsString },
});
export type DataTableFeatures = typeof dataTableFeatures;
export type DataTableColumn<T extends RowData> = ColumnDef<DataTableFeatures, T, unknown>;

export const createDataTableColumns = <T extends RowData>() => createColumnHelper<DataTableFeatures, T>();

export interface DataTableProps<T extends RowData> {
  /** Names the table for screen readers and tests. */
  caption: string;
  columns: DataTableColumn<T>[];
  data: T[];
  getRowId: (row: T) => string;
  globalFilter?: string;
  columnFilters?: ColumnFiltersState;
  initialSorting?: SortingState;
  emptyMessage?: string;
}

export function DataTable<T extends RowData>({ caption, columns, data, getRowId, globalFilter = '', columnFilters = [], initialSorting = [], emptyMessage = 'Nothing matches.' }: DataTableProps<T>) {
  const [sorting, setSorting] = useState<SortingState>(initialSorting);
  const table = useTable({
    features: dataTableFeatures,
    columns,
    data,
    getRowId: (row) => getRowId(row),
    state: { sorting, globalFilter, columnFilters },
    onSortingChange: setSorting,
    globalFilterFn: 'includesString',
  });
  return <TableView table={table} caption={caption} emptyMessage={emptyMessage} />;
}
