import { useEffect } from 'react';
import { useParams, useSearchParams } from 'react-router-dom';
import { useQueryClient } from '@tanstack/react-query';
import { formatMoney } from '@revloop/domain/billing';
import { PageHeader } from '../../../../components/layout/page-header';
import { Banner } from '../../../../components/ui/banner';
import { buttonClasses } from '../../../../components/ui/button';
import { Card } from '../../../../components/ui/card';
import { PageSpinner } from '../../../../components/ui/spinner';
import { useSignedInMe } from '../../../../features/auth/api/get-me';
import { dealerLedgerCsvHref, getDealerLedgerQueryOptions, useDealerLedger } from '../../../../features/billing/api/get-dealer-ledger';
import { LedgerTable } from '../../../../features/billing/components/ledger-table';
import { TopUpForm } from '../../../../features/billing/components/top-up-form';
import { isApiError } from '../../../../lib/api-client';
import { errorMessage } from '../../../../lib/form-errors';

export function DealerStatementRoute() {
  const me = useSignedInMe();
  // The dealer's own statement has no id in its address; the owner opens one per dealer.
  const { dealerId = me.dealer?.id ?? '' } = useParams();
  const [params] = useSearchParams();
  const toppedUp = params.get('topup') === 'done';
  const ledger = useDealerLedger(dealerId);
  const queryClient = useQueryClient();
  useEffect(() => {
    if (!toppedUp) return;
    // The webhook that credits the balance may land a moment after the return from Checkout.
    const timers = [800, 2000, 4500].map((ms) => setTimeout(() => void queryClient.invalidateQueries({ queryKey: getDealerLedgerQueryOptions(dealerId).queryKey }), ms));
    return () => timers.forEach(clearTimeout);
  }, [toppedUp, dealerId, queryClient]);

  if (ledger.isPending) return <PageSpinner label="Loading the statement" />;
  if (ledger.isError) {
    const missing = isApiError(ledger.error) && ledger.error.status === 404;
    return (
      <Banner tone={missing ? 'warn' : 'bad'} title={missing ? 'Statement not found' : 'The statement could not be loaded'}>
        {missing ? 'There is no dealer statement here that your account can open.' : errorMessage(ledger.error)}
      </Banner>
    );
  }
  const l = ledger.data.data;
  return (
    <>
      <PageHeader
        title={`Statement — ${l.dealer.name}`}
        description="The prepaid balance that wholesale jobs are paid from: every top-up and debit, newest first, with the balance after it."
        actions={
          <a className={buttonClasses('secondary')} href={dealerLedgerCsvHref(dealerId)} download>
            Download CSV
          </a>
        }
      />
      <div className="flex flex-col gap-6">
        {toppedUp && (
          <Banner tone="ok" title="Top-up paid">
            The balance updates as soon as the payment is confirmed.
          </Banner>
        )}
        <div className="grid gap-6 lg:grid-cols-[minmax(0,16rem)_minmax(0,1fr)]">
          <Card title="Balance">
            <p className="text-3xl font-semibold text-ink-900 tabular-nums" aria-label="Balance">
              {formatMoney(l.balanceMinor, l.currency)}
            </p>
          </Card>
          {l.canTopUp && (
            <Card title="Top up" description="Pay by card on a secure payment page; the receipt comes by e-mail.">
              <TopUpForm dealerId={dealerId} currency={l.currency} />
            </Card>
          )}
        </div>
        <Card title="Entries">
          <LedgerTable ledger={l} />
        </Card>
      </div>
    </>
  );
}
