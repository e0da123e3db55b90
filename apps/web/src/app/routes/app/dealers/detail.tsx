import { useParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { useAbility } from '@casl/react';
import type { AppAbility } from '@revloop/domain/auth';
import { PageHeader } from '../../../../components/layout/page-header';
import { Banner } from '../../../../components/ui/banner';
import { Card } from '../../../../components/ui/card';
import { PageSpinner } from '../../../../components/ui/spinner';
import { TextLink } from '../../../../components/ui/text-link';
import { paths } from '../../../../config/paths';
import { useDealer } from '../../../../features/dealers/api/get-dealer';
import { DealerJobs } from '../../../../features/dealers/components/dealer-jobs';
import { DealerUsers } from '../../../../features/dealers/components/dealer-users';
import { useSignedInMe } from '../../../../features/auth/api/get-me';
import { dealerLedgerCsvHref, getDealerLedgerQueryOptions } from '../../../../features/billing/api/get-dealer-ledger';
import { LedgerTable } from '../../../../features/billing/components/ledger-table';
import { formatMoney } from '@revloop/domain/billing';
import { useInvitations } from '../../../../features/invitations/api/get-invitations';
import { InviteForm } from '../../../../features/invitations/components/invite-form';
import { PendingInvitations } from '../../../../features/invitations/components/pending-invitations';
import { isApiError } from '../../../../lib/api-client';
import { formatDate } from '../../../../lib/format';
import { errorMessage } from '../../../../lib/form-errors';
import { RequireScreen } from '../require-screen';

function DealerScreen({ dealerId }: { dealerId: string }) {
  const ability = useAbility<AppAbility>();
  const dealer = useDealer(dealerId);
  const me = useSignedInMe();
  const isOwner = me.role === 'owner';
  const ledger = useQuery({ ...getDealerLedgerQueryOptions(dealerId), enabled: Boolean(dealer.data?.data.balance) });
  const invitations = useInvitations({ enabled: ability.can('read', 'Invitation') });
  const back = isOwner ? <TextLink to={paths.dealers.list.getHref()}>← All dealers</TextLink> : null;

  if (dealer.isPending) return <PageSpinner label="Loading the dealer" />;
  if (dealer.isError) {
    const missing = isApiError(dealer.error) && dealer.error.status === 404;
    return (
      <div className="flex flex-col gap-4">
        {back}
        <Banner tone={missing ? 'warn' : 'bad'} title={missing ? 'Dealer not found' : 'The dealer could not be loaded'}>
          {missing ? 'There is no dealer with this address in your shop.' : errorMessage(dealer.error)}
        </Banner>
      </div>
    );
  }
  const detail = dealer.data.data;
  const pending = (invitations.data?.data ?? []).filter((invitation) => invitation.dealer?.id === detail.id);

  return (
    <>
      {back && <div className="mb-3 text-sm">{back}</div>}
      <PageHeader title={detail.name} description={`Dealer since ${formatDate(detail.createdAt)}`} />
      <div className="grid gap-6 lg:grid-cols-[minmax(0,20rem)_minmax(0,1fr)]">
        <Card title="Contact" className="self-start">
          <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-2 text-sm">
            <dt className="text-ink-600">Name</dt>
            <dd className="text-ink-900">{detail.contactName}</dd>
            <dt className="text-ink-600">E-mail</dt>
            <dd className="break-all text-ink-900">{detail.contactEmail}</dd>
            <dt className="text-ink-600">Phone</dt>
            <dd className="text-ink-900">{detail.phone || '—'}</dd>
            <dt className="text-ink-600">Users</dt>
            <dd className="text-ink-900">{detail.users.length}</dd>
            {detail.balance && (
              <>
                <dt className="text-ink-600">Balance</dt>
                <dd className="font-semibold text-ink-900 tabular-nums" aria-label="Dealer balance">
                  {formatMoney(detail.balance.balanceMinor, detail.balance.currency)}
                </dd>
              </>
            )}
            <dt className="text-ink-600">Jobs</dt>
            <dd className="text-ink-900">
              {detail.jobs.open} open of {detail.jobs.total}
            </dd>
          </dl>
        </Card>
        <div className="flex flex-col gap-6">
          <Card
            title="Jobs"
            description="The latest jobs for this dealer's customers."
            actions={
              <TextLink to={`${paths.jobs.getHref()}?dealer=${encodeURIComponent(detail.id)}`}>All {detail.jobs.total} jobs</TextLink>
            }
          >
            <DealerJobs dealerId={detail.id} />
          </Card>
          {detail.balance && (
            <Card
              title="Statement"
              description="Every top-up and job charge, with the balance after each."
              actions={
                <a href={dealerLedgerCsvHref(detail.id)} download className="text-sm underline">
                  Download CSV
                </a>
              }
            >
              {ledger.isPending ? <PageSpinner label="Loading the statement" /> : ledger.isError ? <Banner tone="bad">{errorMessage(ledger.error)}</Banner> : <LedgerTable ledger={ledger.data.data} />}
            </Card>
          )}
          <Card title="Users" description="People who work for this dealer in Revloop.">
            <DealerUsers users={detail.users} />
          </Card>
          {ability.can('create', 'Invitation') && (
            <Card title="Invite a dealer user" description={`The invitee joins as a dealer user of ${detail.name}.`}>
              <InviteForm dealers={[detail]} fixedDealer={{ id: detail.id, name: detail.name }} idPrefix="dealer-invite" />
            </Card>
          )}
          {pending.length > 0 && (
            <Card title="Pending invitations">
              <PendingInvitations invitations={pending} canRevoke={ability.can('delete', 'Invitation')} />
            </Card>
          )}
        </div>
      </div>
    </>
  );
}

export function DealerRoute() {
  const { dealerId = '' } = useParams();
  return (
    <RequireScreen screen="dealer">
      <DealerScreen dealerId={dealerId} />
    </RequireScreen>
  );
}
