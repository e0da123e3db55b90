import { useMemo, useState } from 'react';
import type { Member } from '@revloop/contract';
import { ROLE_LABELS, type ShopRole } from '@revloop/domain/auth';
import { Badge } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { ConfirmDialog } from '../../../components/ui/dialog';
import { createDataTableColumns, DataTable } from '../../../components/ui/data-table';
import { SearchInput } from '../../../components/ui/search-input';
import { Select } from '../../../components/ui/select';
import { formatDate, formatDateTime } from '../../../lib/format';
import { errorMessage } from '../../../lib/form-errors';
import { useDeactivateMember } from '../api/deactivate-member';
import { useReactivateMember } from '../api/reactivate-member';
import { useUpdateMemberRole } from '../api/update-member-role';

/** Dealer users belong to a dealer account, so they are invited as such rather than switched to or from. */
// Team is staff only: nobody becomes a customer (or a customer staff) here; the server refuses it too.
const ASSIGNABLE_ROLES = (['owner', 'tuner'] as const).map((role) => ({ value: role, label: ROLE_LABELS[role] }));
const ROLE_FILTER_OPTIONS = [{ value: '', label: 'All roles' }, ...(['owner', 'tuner', 'dealer'] as const).map((role) => ({ value: role, label: ROLE_LABELS[role] }))];

type Pending = { member: Member; action: 'deactivate' | 'reactivate' } | null;

const helper = createDataTableColumns<Member>();

export interface MembersTableProps {
  members: Member[];
  /** The owner manages members; a tuner only reads the list. */
  canManage: boolean;
  currentUserId: string;
}

export function MembersTable({ members, canManage, currentUserId }: MembersTableProps) {
  const [filter, setFilter] = useState('');
  const [roleFilter, setRoleFilter] = useState('');
  const [pending, setPending] = useState<Pending>(null);
  const updateRole = useUpdateMemberRole();
  const deactivate = useDeactivateMember();
  const reactivate = useReactivateMember();
  const statusMutation = pending?.action === 'reactivate' ? reactivate : deactivate;
  const { mutate: changeRole, isPending: roleChanging, variables: roleVariables } = updateRole;

  const columns = useMemo(
    () =>
      helper.columns([
        helper.accessor('name', {
          header: 'Name',
          sortFn: 'text',
          cell: (info) => (
            <span className="font-medium text-ink-900">
              {info.getValue()}
              {info.row.original.userId === currentUserId && <span className="ml-1.5 text-xs font-normal text-ink-600">(you)</span>}
            </span>
          ),
        }),
        helper.accessor('email', { header: 'E-mail', sortFn: 'text' }),
        helper.accessor('role', {
          header: 'Role',
          sortFn: 'text',
          filterFn: 'equalsString',
          cell: (info) => {
            const member = info.row.original;
            const editable = canManage && member.role !== 'dealer' && member.userId !== currentUserId && member.status === 'active';
            if (!editable) {
              return (
                <span>
                  {ROLE_LABELS[member.role]}
                  {member.dealer && <span className="block text-xs text-ink-600">{member.dealer.name}</span>}
                </span>
              );
            }
            return (
              <Select
                aria-label={`Role of ${member.name}`}
                className="h-9 w-auto min-w-36"
                options={ASSIGNABLE_ROLES}
                value={member.role}
                disabled={roleChanging && roleVariables?.memberId === member.id}
                onChange={(event) => changeRole({ memberId: member.id, role: event.target.value as ShopRole })}
              />
            );
          },
        }),
        helper.accessor('status', {
          header: 'Status',
          sortFn: 'text',
          cell: (info) => (info.getValue() === 'active' ? <Badge tone="ok">Active</Badge> : <Badge>Deactivated</Badge>),
        }),
        helper.accessor((member) => member.lastSignInAt ?? '', {
          id: 'lastSignInAt',
          header: 'Last sign-in',
          sortFn: 'text',
          cell: (info) => (info.getValue() ? formatDateTime(info.getValue()) : 'Never'),
        }),
        helper.accessor('createdAt', { header: 'Joined', sortFn: 'text', cell: (info) => formatDate(info.getValue()) }),
        helper.display({
          id: 'actions',
          header: () => <span className="sr-only">Actions</span>,
          cell: (info) => {
            const member = info.row.original;
            if (!canManage || member.userId === currentUserId) return null;
            return member.status === 'active' ? (
              <Button size="sm" variant="secondary" aria-label={`Deactivate ${member.name}`} onClick={() => setPending({ member, action: 'deactivate' })}>
                Deactivate
              </Button>
            ) : (
              <Button size="sm" variant="secondary" aria-label={`Reactivate ${member.name}`} onClick={() => setPending({ member, action: 'reactivate' })}>
                Reactivate
              </Button>
            );
          },
        }),
      ]),
    [canManage, currentUserId, changeRole, roleChanging, roleVariables],
  );

  const close = () => {
    setPending(null);
    deactivate.reset();
    reactivate.reset();
  };

  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-wrap items-end gap-3">
        <SearchInput id="members-filter" label="Filter members" placeholder="Name or e-mail" value={filter} onChange={setFilter} />
        <div className="flex flex-col gap-1.5">
          <label htmlFor="members-role-filter" className="text-sm font-medium text-ink-800">
            Role
          </label>
          <Select id="members-role-filter" className="w-40" options={ROLE_FILTER_OPTIONS} value={roleFilter} onChange={(event) => setRoleFilter(event.target.value)} />
        </div>
      </div>
      {updateRole.isError && (
        <p role="alert" className="text-sm text-bad">
          The role was not changed: {errorMessage(updateRole.error)}
        </p>
      )}
      <DataTable
        caption="Members"
        columns={columns}
        data={members}
        getRowId={(member) => member.id}
        globalFilter={filter}
        columnFilters={roleFilter ? [{ id: 'role', value: roleFilter }] : []}
        initialSorting={[{ id: 'name', desc: false }]}
        emptyMessage={filter || roleFilter ? 'No member matches the filters.' : 'No members yet.'}
      />
      <ConfirmDialog
        open={pending !== null}
        title={pending?.action === 'reactivate' ? `Reactivate ${pending.member.name}?` : `Deactivate ${pending?.member.name ?? ''}?`}
        confirmLabel={pending?.action === 'reactivate' ? 'Reactivate' : 'Deactivate'}
        confirmVariant={pending?.action === 'reactivate' ? 'primary' : 'danger'}
        pending={statusMutation.isPending}
        error={statusMutation.error ? errorMessage(statusMutation.error) : null}
        onCancel={close}
        onConfirm={() => pending && statusMutation.mutate(pending.member.id, { onSuccess: close })}
      >
        {pending?.action === 'reactivate'
          ? 'They can sign in again with their existing password.'
          : 'They are signed out and cannot sign in. Their jobs, files and messages stay in the shop.'}
      </ConfirmDialog>
    </div>
  );
}
