import { useAbility } from '@casl/react';
import type { AppAbility } from '@revloop/domain/auth';
import { PageHeader } from '../../../components/layout/page-header';
import { Banner } from '../../../components/ui/banner';
import { Card } from '../../../components/ui/card';
import { PageSpinner } from '../../../components/ui/spinner';
import { useSignedInMe } from '../../../features/auth/api/get-me';
import { useDealers } from '../../../features/dealers/api/get-dealers';
import { useInvitations } from '../../../features/invitations/api/get-invitations';
import { InviteForm } from '../../../features/invitations/components/invite-form';
import { PendingInvitations } from '../../../features/invitations/components/pending-invitations';
import { useMembers } from '../../../features/members/api/get-members';
import { MembersTable } from '../../../features/members/components/members-table';
import { errorMessage } from '../../../lib/form-errors';
import { RequireScreen } from './require-screen';

const EMPTY: never[] = [];

function TeamScreen() {
  const me = useSignedInMe();
  const ability = useAbility<AppAbility>();
  const canManage = ability.can('update', 'Member');
  const canInvite = ability.can('create', 'Invitation');
  const canSeeInvitations = ability.can('read', 'Invitation');
  const members = useMembers();
  const invitations = useInvitations({ enabled: canSeeInvitations });
  const dealers = useDealers({ enabled: canInvite });

  return (
    <>
      <PageHeader
        title="Team"
        description={canManage ? 'The people who work in the shop (owners, tuners, dealer users): change roles, deactivate accounts and invite new people. Customers are under Customers.' : 'The people who work in the shop. Customers are under Customers.'}
      />
      <div className="flex flex-col gap-6">
        <Card title="Members">
          {members.isPending ? (
            <PageSpinner label="Loading members" />
          ) : members.isError ? (
            <Banner tone="bad">{errorMessage(members.error)}</Banner>
          ) : (
            <MembersTable members={members.data.data} canManage={canManage} currentUserId={me.user.id} />
          )}
        </Card>
        {canInvite && (
          <Card title="Invite someone" description="They get an e-mail with a link to set their name and password.">
            <InviteForm dealers={dealers.data?.data ?? EMPTY} />
          </Card>
        )}
        {canSeeInvitations && (
          <Card title="Pending invitations">
            {invitations.isPending ? (
              <PageSpinner label="Loading invitations" />
            ) : invitations.isError ? (
              <Banner tone="bad">{errorMessage(invitations.error)}</Banner>
            ) : (
              <PendingInvitations invitations={invitations.data.data} canRevoke={ability.can('delete', 'Invitation')} />
            )}
          </Card>
        )}
      </div>
    </>
  );
}

export function TeamRoute() {
  return (
    <RequireScreen screen="team">
      <TeamScreen />
    </RequireScreen>
  );
}
