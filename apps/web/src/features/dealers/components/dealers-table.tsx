import { useState } from 'react';
import { Link } from 'react-router-dom';
import { createDataTableColumns, DataTable } from '../../../components/ui/data-table';
import { SearchInput } from '../../../components/ui/search-input';
import { textLinkClasses } from '../../../components/ui/text-link';
import { paths } from '../../../config/paths';
import { formatDate } from '../../../lib/format';
import type { DealerListItem } from '@revloop/contract';

const helper = createDataTableColumns<DealerListItem>();

const columns = helper.columns([
  helper.accessor('name', {
    header: 'Dealer',
    sortFn: 'text',
    cell: (info) => (
      <Link to={paths.dealers.detail.getHref(info.row.original.id)} className={textLinkClasses}>
        {info.getValue()}
      </Link>
    ),
  }),
  helper.accessor('contactName', { header: 'Contact', sortFn: 'text' }),
  helper.accessor('contactEmail', { header: 'Contact e-mail', sortFn: 'text' }),
  helper.accessor((dealer) => dealer.phone ?? '', { id: 'phone', header: 'Phone', sortFn: 'text', cell: (info) => info.getValue() || '—' }),
  helper.accessor('userCount', { header: 'Users', sortFn: 'basic' }),
  helper.accessor('createdAt', { header: 'Added', sortFn: 'text', cell: (info) => formatDate(info.getValue()) }),
]);

export function DealersTable({ dealers }: { dealers: DealerListItem[] }) {
  const [filter, setFilter] = useState('');
  return (
    <div className="flex flex-col gap-4">
      <SearchInput id="dealers-filter" label="Filter dealers" placeholder="Name, contact or e-mail" value={filter} onChange={setFilter} />
      <DataTable
        caption="Dealers"
        columns={columns}
        data={dealers}
        getRowId={(dealer) => dealer.id}
        globalFilter={filter}
        initialSorting={[{ id: 'name', desc: false }]}
        emptyMessage={filter ? 'No dealer matches the filter.' : 'No dealers yet: add a garage that resells your packages at the dealer price.'}
      />
    </div>
  );
}
