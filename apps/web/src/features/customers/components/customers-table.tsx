import { useDeferredValue, useEffect, useState } from 'react';
import { Link } from 'react-router-dom';
import {
  createColumnHelper,
  functionalUpdate,
  rowPaginationFeature,
  rowSortingFeature,
  tableFeatures,
  useTable,
  type PaginationState,
  type SortingState,
  type Updater,
} from '@tanstack/react-table';
import { CUSTOMER_SORT_KEYS, type CustomerSortKey } from '@revloop/contract';
import { formatMoney } from '@revloop/domain/billing';
import { Banner } from '../../../components/ui/banner';
import { SearchInput } from '../../../components/ui/search-input';
import { Spinner } from '../../../components/ui/spinner';
import { TablePager } from '../../../components/ui/table-pager';
import { TableView } from '../../../components/ui/table-view';
import { textLinkClasses } from '../../../components/ui/text-link';
import { paths } from '../../../config/paths';
import { errorMessage } from '../../../lib/form-errors';
import { formatDate } from '../../../lib/format';
import { useCustomerList, type Customer } from '../api/get-customers';

// Search, sorting and paging happen on the server: the table renders the page it is given and reports clicks.
const features = tableFeatures({ rowSortingFeature, rowPaginationFeature });
const helper = createColumnHelper<typeof features, Customer>();
const PAGE_SIZES = [25, 50, 100];

const columns = helper.columns([
  helper.accessor('name', {
    id: 'name',
    header: 'Customer',
    cell: (info) => (
      <span className="flex flex-col">
        <Link to={paths.customer.getHref(info.row.original.id)} className={textLinkClasses}>
          {info.getValue()}
        </Link>
        {info.row.original.dealer && <span className="text-xs text-ink-600">via {info.row.original.dealer.name}</span>}
      </span>
    ),
  }),
  helper.accessor('email', { id: 'email', header: 'Contact', cell: (info) => <span className="break-all">{info.getValue()}</span> }),
  helper.accessor('vehicles', {
    id: 'vehicles',
    header: 'Vehicles',
    enableSorting: false,
    cell: (info) => (
      <span className="line-clamp-2 block min-w-36 whitespace-normal">
        {info.getValue() ?? '—'}
        {info.row.original.vehicleCount > 3 && ` +${info.row.original.vehicleCount - 3}`}
      </span>
    ),
  }),
  helper.accessor('openJobs', { id: 'open_jobs', header: 'Open jobs', cell: (info) => <span className="tabular-nums">{info.getValue()}</span> }),
  helper.accessor('lastActivityAt', { id: 'last_activity', header: 'Last activity', cell: (info) => formatDate(info.getValue()) }),
  helper.accessor('paidMinor', { id: 'paid', header: 'Paid', cell: (info) => <span className="tabular-nums">{formatMoney(info.getValue(), info.row.original.currency)}</span> }),
]);

/** The shop's customers (a dealer's own), searched, sorted and paged by the server. */
export function CustomersTable() {
  const [text, setText] = useState('');
  const q = useDeferredValue(text.trim());
  const [sort, setSort] = useState<{ sort: CustomerSortKey; dir: 'asc' | 'desc' }>({ sort: 'name', dir: 'asc' });
  const [pagination, setPagination] = useState<PaginationState>({ pageIndex: 0, pageSize: 25 });
  useEffect(() => setPagination((p) => ({ ...p, pageIndex: 0 })), [q]);
  const customers = useCustomerList({ q, ...sort, page: pagination.pageIndex + 1, pageSize: pagination.pageSize });
  const sorting: SortingState = [{ id: sort.sort, desc: sort.dir === 'desc' }];

  const table = useTable({
    features,
    columns,
    data: customers.data?.data ?? [],
    getRowId: (customer) => customer.id,
    state: { sorting, pagination },
    manualSorting: true,
    manualPagination: true,
    enableMultiSort: false,
    enableSortingRemoval: false,
    rowCount: customers.data?.meta.total ?? 0,
    onSortingChange: (updater: Updater<SortingState>) => {
      const [next] = functionalUpdate(updater, sorting);
      if (next && (CUSTOMER_SORT_KEYS as readonly string[]).includes(next.id)) {
        setSort({ sort: next.id as CustomerSortKey, dir: next.desc ? 'desc' : 'asc' });
        setPagination((p) => ({ ...p, pageIndex: 0 }));
      }
    },
    onPaginationChange: (updater: Updater<PaginationState>) => setPagination((p) => functionalUpdate(updater, p)),
  });

  const meta = customers.data?.meta;
  const empty = customers.isPending
    ? 'Loading…'
    : q
      ? 'No customer matches the search: try part of a name, an e-mail or a VIN.'
      : 'No customers yet: open a job for a new customer, or share your public page so customers sign up themselves.';

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <SearchInput id="customers-search" label="Search customers" placeholder="Name, e-mail, VIN or vehicle" value={text} onChange={setText} />
        <p aria-live="polite" className="text-sm text-ink-700">
          {meta ? `${meta.total} ${meta.total === 1 ? 'customer' : 'customers'}` : 'Loading customers'}
          {customers.isFetching && <Spinner label="Updating" className="ml-2 align-middle" />}
        </p>
      </div>
      {customers.isError && <Banner tone="bad">{errorMessage(customers.error)}</Banner>}
      <TableView
        table={table}
        dense
        minWidthClass="min-w-[48rem]"
        caption={`Customers, sorted by ${sort.sort.replace('_', ' ')} ${sort.dir === 'asc' ? 'ascending' : 'descending'}`}
        emptyMessage={empty}
      />
      <TablePager table={table} page={pagination.pageIndex + 1} pageSize={pagination.pageSize} pageSizes={PAGE_SIZES} />
    </div>
  );
}
