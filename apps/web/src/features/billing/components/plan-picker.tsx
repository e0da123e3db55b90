import { useState } from 'react';
import type { Subscription } from '@revloop/contract';
import { formatMoney, type PlanId } from '@revloop/domain/billing';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { Field } from '../../../components/ui/field';
import { Input } from '../../../components/ui/input';
import { cn } from '../../../lib/cn';
import { errorMessage } from '../../../lib/form-errors';
import { useChangePlan } from '../api/change-plan';
import { useStartCheckout } from '../api/start-checkout';

/** Choose a plan and seat count: through Checkout when no subscription runs yet, directly when one does. */
export function PlanPicker({ subscription: s }: { subscription: Subscription }) {
  const [planId, setPlanId] = useState<PlanId>(s.planId);
  const plan = s.plans.find((p) => p.id === planId) ?? s.plans[0]!;
  const [seatsText, setSeatsText] = useState(String(Math.max(s.seats, s.usage.seatsInUse)));
  const seats = Number(seatsText);
  const checkout = useStartCheckout();
  const change = useChangePlan();
  const error = checkout.error ?? change.error;
  const validSeats = Number.isInteger(seats) && seats >= plan.minSeats && seats <= plan.maxSeats;

  const submit = () => {
    if (s.managedByProvider) change.mutate({ planId, seats });
    else checkout.mutate({ purpose: 'subscription', planId, seats });
  };

  return (
    <Card title={s.managedByProvider ? 'Change plan' : 'Choose a plan'} description="Seats are the owners and tuners who work jobs. Prices are per seat and month.">
      <div className="flex flex-col gap-5">
        <fieldset>
          <legend className="sr-only">Plan</legend>
          <div className="grid gap-3 md:grid-cols-3">
            {s.plans.map((p) => (
              <label
                key={p.id}
                className={cn(
                  'flex cursor-pointer flex-col gap-1 rounded-lg border p-4 text-sm',
                  p.id === planId ? 'border-accent-600 bg-accent-50' : 'border-ink-200 hover:border-ink-400',
                )}
              >
                <span className="flex items-center gap-2">
                  <input
                    type="radio"
                    name="plan"
                    value={p.id}
                    checked={p.id === planId}
                    onChange={() => {
                      setPlanId(p.id);
                      setSeatsText(String(Math.min(p.maxSeats, Math.max(p.minSeats, seats || p.minSeats))));
                    }}
                  />
                  <span className="font-semibold text-ink-900">{p.name}</span>
                </span>
                <span className="text-ink-900">{formatMoney(p.seatPriceMinor, s.currency)} per seat</span>
                <span className="text-ink-600">
                  {p.minSeats === p.maxSeats ? `${p.minSeats} seat` : `${p.minSeats}–${p.maxSeats} seats`} · {p.jobsPerMonth} jobs a month
                </span>
                <span className="text-ink-600">{p.summary}</span>
              </label>
            ))}
          </div>
        </fieldset>
        <div className="flex flex-wrap items-end gap-4">
          <div className="w-32">
            <Field id="plan-seats" label="Tuner seats" error={validSeats ? undefined : `Between ${plan.minSeats} and ${plan.maxSeats}.`}>
              {(a11y) => <Input {...a11y} type="number" min={plan.minSeats} max={plan.maxSeats} value={seatsText} onChange={(e) => setSeatsText(e.target.value)} />}
            </Field>
          </div>
          <p className="pb-2 text-sm text-ink-700">
            {validSeats ? `${formatMoney(plan.seatPriceMinor * seats, s.currency)} a month` : '—'}
          </p>
          <Button onClick={submit} disabled={!validSeats || (s.managedByProvider && planId === s.planId && seats === s.seats)} pending={change.isPending || checkout.isPending || checkout.isSuccess}>
            {s.managedByProvider ? 'Change plan' : `Continue to payment`}
          </Button>
        </div>
        {change.isSuccess && <p className="text-sm text-ok">The plan is changed; the next invoice uses it.</p>}
        {error && (
          <p role="alert" className="text-sm text-bad">
            {errorMessage(error)}
          </p>
        )}
      </div>
    </Card>
  );
}
