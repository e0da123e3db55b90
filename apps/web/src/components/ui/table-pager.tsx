import { buttonClasses } from './button';
import { Select } from './select';

/** What the pager needs of a server-paged table (TanStack's pagination feature provides it). */
interface PagedTable {
  setPageSize(size: number): void;
  getCanPreviousPage(): boolean;
  getCanNextPage(): boolean;
  previousPage(): void;
  nextPage(): void;
  getPageCount(): number;
}

/** Rows per page and Previous/Next under a table whose pages the server cuts. */
export function TablePager({ table, page, pageSize, pageSizes }: { table: PagedTable; page: number; pageSize: number; pageSizes: readonly number[] }) {
  return (
    <nav aria-label="Pages" className="flex flex-wrap items-center justify-between gap-3 text-sm text-ink-700">
      <label className="flex items-center gap-2 whitespace-nowrap">
        Rows per page
        <Select
          className="w-20"
          value={String(pageSize)}
          onChange={(event) => table.setPageSize(Number(event.target.value))}
          options={pageSizes.map((size) => ({ value: String(size), label: String(size) }))}
        />
      </label>
      <div className="flex items-center gap-2">
        <button type="button" className={buttonClasses('secondary', 'sm')} disabled={!table.getCanPreviousPage()} onClick={() => table.previousPage()}>
          Previous
        </button>
        <span>
          Page {page} of {Math.max(1, table.getPageCount())}
        </span>
        <button type="button" className={buttonClasses('secondary', 'sm')} disabled={!table.getCanNextPage()} onClick={() => table.nextPage()}>
          Next
        </button>
      </div>
    </nav>
  );
}
