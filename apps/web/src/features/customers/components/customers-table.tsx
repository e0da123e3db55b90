import { useState } from 'react';
import { Link } from 'react-router-dom';
import { createDataTableColumns, DataTable } from '../../../components/ui/data-table';
import { SearchInput } from '../../../components/ui/search-input';
import { textLinkClasses } from '../../../components/ui/text-link';
import { paths } from '../../../config/paths';
import { formatDate } from '../../../lib/format';
import type { Customer } from '../api/get-customers';

const helper = createDataTableColumns<Customer>();

const columns = helper.columns([
  helper.accessor('name', { header: 'Customer', sortFn: 'text' }),
  helper.accessor('email', { header: 'E-mail', sortFn: 'text' }),
  helper.accessor('since', { header: 'Customer since', sortFn: 'text', cell: (info) => formatDate(info.getValue()) }),
  helper.display({
    id: 'actions',
    header: 'Jobs',
    cell: (info) => (
      <span className="flex gap-4">
        <Link to={`${paths.jobs.getHref()}?customer=${encodeURIComponent(info.row.original.id)}`} className={textLinkClasses} aria-label={`Jobs of ${info.row.original.name}`}>
          Their jobs
        </Link>
        <Link to={paths.newJob.getHref(info.row.original.id)} className={textLinkClasses} aria-label={`Open a job for ${info.row.original.name}`}>
          Open a job
        </Link>
      </span>
    ),
  }),
]);

/** A dealer's own customers, each with a way to their jobs and to open a new one. */
export function CustomersTable({ customers }: { customers: Customer[] }) {
  const [filter, setFilter] = useState('');
  return (
    <div className="flex flex-col gap-4">
      <SearchInput id="customers-filter" label="Filter customers" placeholder="Name or e-mail" value={filter} onChange={setFilter} />
      <DataTable
        caption="Customers"
        columns={columns}
        data={customers}
        getRowId={(customer) => customer.id}
        globalFilter={filter}
        initialSorting={[{ id: 'name', desc: false }]}
        emptyMessage={filter ? 'No customer matches the filter.' : 'No customers yet: open a job for a new customer, or share your public page so customers sign up themselves.'}
      />
    </div>
  );
}
