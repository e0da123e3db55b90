import type { Subscription } from '@revloop/contract';
import { formatMoney } from '@revloop/domain/billing';
import { Badge, type Tone } from '../../../components/ui/badge';
import { Banner } from '../../../components/ui/banner';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { errorMessage } from '../../../lib/form-errors';
import { formatDate } from '../../../lib/format';
import { useStartCheckout } from '../api/start-checkout';

const STATUS_TONES: Record<Subscription['status'], Tone> = {
  trialing: 'accent',
  active: 'ok',
  past_due: 'warn',
  unpaid: 'bad',
  canceled: 'neutral',
  incomplete: 'warn',
};

function Meter({ label, used, limit }: { label: string; used: number; limit: number }) {
  const pct = Math.min(100, Math.round((used / Math.max(1, limit)) * 100));
  return (
    <div className="flex flex-col gap-1">
      <div className="flex justify-between text-sm">
        <span className="text-ink-700">{label}</span>
        <span className={used > limit ? 'font-medium text-bad' : 'text-ink-900'}>
          {used} of {limit}
        </span>
      </div>
      <div className="h-2 rounded-full bg-ink-100" role="meter" aria-label={label} aria-valuemin={0} aria-valuemax={limit} aria-valuenow={used}>
        <div className={used > limit ? 'h-2 rounded-full bg-bad' : 'h-2 rounded-full bg-accent-600'} style={{ width: `${pct}%` }} />
      </div>
    </div>
  );
}

/** The plan the shop is on, what it costs, where it stands, and the card behind it. */
export function SubscriptionSummary({ subscription: s }: { subscription: Subscription }) {
  const checkout = useStartCheckout();
  const money = (minor: number) => formatMoney(minor, s.currency);
  const nextDate = s.status === 'trialing' ? s.trialEndsAt : s.currentPeriodEnd;

  return (
    <Card
      title={`${s.planName} plan`}
      description={`${s.seats} tuner seat${s.seats === 1 ? '' : 's'} · ${money(s.monthlyAmountMinor)} a month`}
      actions={<Badge tone={STATUS_TONES[s.status]}>{s.statusLabel}</Badge>}
    >
      <div className="flex flex-col gap-5">
        {s.readOnlyText && (
          <Banner tone="bad" title="The shop is read-only">
            {s.readOnlyText}
          </Banner>
        )}
        {s.status === 'past_due' && !s.readOnlyReason && s.graceEndsAt && (
          <Banner tone="warn" title="The last payment failed">
            Update the card before {formatDate(s.graceEndsAt)} to keep the shop open for changes; the payment is retried automatically.
          </Banner>
        )}
        <dl className="grid grid-cols-[auto_1fr] gap-x-6 gap-y-2 text-sm">
          {nextDate && (
            <>
              <dt className="text-ink-600">{s.status === 'trialing' ? 'Trial ends' : s.cancelAtPeriodEnd ? 'Ends' : 'Renews'}</dt>
              <dd className="text-ink-900">{formatDate(nextDate)}</dd>
            </>
          )}
          <dt className="text-ink-600">Card</dt>
          <dd className="text-ink-900">{s.managedByProvider ? 'On file with the payment provider' : 'None on file yet'}</dd>
        </dl>
        <div className="grid gap-4 sm:grid-cols-2">
          <Meter label="Tuner seats in use" used={s.usage.seatsInUse} limit={s.seats} />
          <Meter label="Jobs opened this month" used={s.usage.jobsThisMonth} limit={s.usage.jobsPerMonth} />
        </div>
        {s.hasPaymentMethod && (
          <div className="flex flex-col gap-2">
            <div>
              <Button variant={s.status === 'past_due' || s.status === 'unpaid' ? 'primary' : 'secondary'} onClick={() => checkout.mutate({ purpose: 'payment_method' })} pending={checkout.isPending || checkout.isSuccess}>
                Update payment method
              </Button>
            </div>
            {checkout.isError && (
              <p role="alert" className="text-sm text-bad">
                {errorMessage(checkout.error)}
              </p>
            )}
          </div>
        )}
      </div>
    </Card>
  );
}
