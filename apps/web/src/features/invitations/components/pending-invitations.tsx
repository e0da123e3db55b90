import { useState } from 'react';
import { ROLE_LABELS } from '@revloop/domain/auth';
import { Button } from '../../../components/ui/button';
import { ConfirmDialog } from '../../../components/ui/dialog';
import { EmptyState } from '../../../components/ui/empty-state';
import { formatDate } from '../../../lib/format';
import { errorMessage } from '../../../lib/form-errors';
import type { Invitation } from '@revloop/contract';
import { useRevokeInvitation } from '../api/revoke-invitation';

export function PendingInvitations({ invitations, canRevoke }: { invitations: Invitation[]; canRevoke: boolean }) {
  const [revoking, setRevoking] = useState<Invitation | null>(null);
  const revoke = useRevokeInvitation();
  const close = () => {
    setRevoking(null);
    revoke.reset();
  };

  if (invitations.length === 0) return <EmptyState title="No pending invitations">Invite a tuner, a dealer user or a customer with “Invite someone”; the link they get works once.</EmptyState>;
  return (
    <>
      <ul aria-label="Pending invitations" className="divide-y divide-ink-100">
        {invitations.map((invitation) => (
          <li key={invitation.id} className="flex flex-wrap items-center justify-between gap-3 py-3 first:pt-0 last:pb-0">
            <div className="min-w-0">
              <p className="font-medium break-all text-ink-900">{invitation.email}</p>
              <p className="text-xs text-ink-600">
                {ROLE_LABELS[invitation.role]}
                {invitation.dealer && ` · ${invitation.dealer.name}`} · sent {formatDate(invitation.createdAt)} · expires {formatDate(invitation.expiresAt)}
              </p>
            </div>
            {canRevoke && (
              <Button size="sm" variant="secondary" aria-label={`Revoke invitation for ${invitation.email}`} onClick={() => setRevoking(invitation)}>
                Revoke
              </Button>
            )}
          </li>
        ))}
      </ul>
      <ConfirmDialog
        open={revoking !== null}
        title="Revoke this invitation?"
        confirmLabel="Revoke invitation"
        confirmVariant="danger"
        pending={revoke.isPending}
        error={revoke.error ? errorMessage(revoke.error) : null}
        onCancel={close}
        onConfirm={() => revoking && revoke.mutate(revoking.id, { onSuccess: close })}
      >
        The link sent to {revoking?.email} stops working. You can invite them again later.
      </ConfirmDialog>
    </>
  );
}
