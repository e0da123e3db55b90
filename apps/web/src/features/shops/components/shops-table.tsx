import { useMemo, useState } from 'react';
import { Badge } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { ConfirmDialog } from '../../../components/ui/dialog';
import { createDataTableColumns, DataTable } from '../../../components/ui/data-table';
import { SearchInput } from '../../../components/ui/search-input';
import { formatDate } from '../../../lib/format';
import { errorMessage } from '../../../lib/form-errors';
import type { PlatformShopListItem } from '@revloop/contract';
import { useReactivateShop } from '../api/reactivate-shop';
import { useSuspendShop } from '../api/suspend-shop';

type Pending = { shop: PlatformShopListItem; action: 'suspend' | 'reactivate' } | null;

const helper = createDataTableColumns<PlatformShopListItem>();

export function ShopsTable({ shops, canSuspend }: { shops: PlatformShopListItem[]; canSuspend: boolean }) {
  const [filter, setFilter] = useState('');
  const [pending, setPending] = useState<Pending>(null);
  const suspend = useSuspendShop();
  const reactivate = useReactivateShop();
  const mutation = pending?.action === 'reactivate' ? reactivate : suspend;

  const columns = useMemo(
    () =>
      helper.columns([
    helper.accessor('name', { header: 'Name', sortFn: 'text', cell: (info) => <span className="font-medium text-ink-900">{info.getValue()}</span> }),
    helper.accessor((shop) => (shop.owner ? `${shop.owner.name} ${shop.owner.email}` : ''), {
      id: 'owner',
      header: 'Owner',
      sortFn: 'text',
      cell: (info) => {
        const owner = info.row.original.owner;
        return owner ? (
          <span>
            <span className="block">{owner.name}</span>
            <span className="block text-xs text-ink-600">{owner.email}</span>
          </span>
        ) : (
          <span className="text-ink-600">Invitation pending</span>
        );
      },
    }),
    helper.accessor('memberCount', { header: 'Members', sortFn: 'basic' }),
    helper.accessor('createdAt', { header: 'Created', sortFn: 'text', cell: (info) => formatDate(info.getValue()) }),
    helper.accessor('status', {
      header: 'Status',
      sortFn: 'text',
      cell: (info) => (info.getValue() === 'active' ? <Badge tone="ok">Active</Badge> : <Badge tone="warn">Suspended</Badge>),
    }),
    helper.display({
      id: 'actions',
      header: () => <span className="sr-only">Actions</span>,
      cell: (info) => {
        const shop = info.row.original;
        if (!canSuspend) return null;
        return shop.status === 'active' ? (
          <Button size="sm" variant="secondary" aria-label={`Suspend ${shop.name}`} onClick={() => setPending({ shop, action: 'suspend' })}>
            Suspend
          </Button>
        ) : (
          <Button size="sm" variant="secondary" aria-label={`Reactivate ${shop.name}`} onClick={() => setPending({ shop, action: 'reactivate' })}>
            Reactivate
          </Button>
        );
      },
    }),
      ]),
    [canSuspend],
  );

  const close = () => {
    setPending(null);
    suspend.reset();
    reactivate.reset();
  };

  return (
    <div className="flex flex-col gap-4">
      <SearchInput id="shops-filter" label="Filter shops" placeholder="Name, owner or e-mail" value={filter} onChange={setFilter} />
      <DataTable
        caption="Shops"
        columns={columns}
        data={shops}
        getRowId={(shop) => shop.id}
        globalFilter={filter}
        initialSorting={[{ id: 'name', desc: false }]}
        emptyMessage={filter ? 'No shop matches the filter.' : 'No shops yet.'}
      />
      <ConfirmDialog
        open={pending !== null}
        title={pending?.action === 'reactivate' ? `Reactivate ${pending.shop.name}?` : `Suspend ${pending?.shop.name ?? ''}?`}
        confirmLabel={pending?.action === 'reactivate' ? 'Reactivate shop' : 'Suspend shop'}
        confirmVariant={pending?.action === 'reactivate' ? 'primary' : 'danger'}
        pending={mutation.isPending}
        error={mutation.error ? errorMessage(mutation.error) : null}
        onCancel={close}
        onConfirm={() => pending && mutation.mutate(pending.shop.id, { onSuccess: close })}
      >
        {pending?.action === 'reactivate'
          ? 'Its members can change jobs, files and settings again.'
          : 'Its members can still sign in, read and download, but cannot change anything until the shop is reactivated.'}
      </ConfirmDialog>
    </div>
  );
}
