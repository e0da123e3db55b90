import { Badge } from '../../../components/ui/badge';
import { EmptyState } from '../../../components/ui/empty-state';
import type { DealerUser } from '@revloop/contract';

export function DealerUsers({ users }: { users: DealerUser[] }) {
  if (users.length === 0) return <EmptyState title="No users yet">Invite someone from the dealer below.</EmptyState>;
  return (
    <ul aria-label="Dealer users" className="divide-y divide-ink-100">
      {users.map((user) => (
        <li key={user.id} className="flex flex-wrap items-center justify-between gap-3 py-3 first:pt-0 last:pb-0">
          <div className="min-w-0">
            <p className="font-medium text-ink-900">{user.name}</p>
            <p className="text-xs break-all text-ink-600">{user.email}</p>
          </div>
          {user.status === 'active' ? <Badge tone="ok">Active</Badge> : <Badge>Deactivated</Badge>}
        </li>
      ))}
    </ul>
  );
}
