import { useState } from 'react';
import { parseMoneyInput } from '@revloop/domain/billing';
import { Button } from '../../../components/ui/button';
import { Field } from '../../../components/ui/field';
import { Input } from '../../../components/ui/input';
import { errorMessage } from '../../../lib/form-errors';
import { useStartCheckout } from '../api/start-checkout';

/** Adds to a dealer's prepaid balance through Checkout; the statement shows it once the payment is confirmed. */
export function TopUpForm({ dealerId, currency }: { dealerId: string; currency: string }) {
  const [amount, setAmount] = useState('500.00');
  const [fieldError, setFieldError] = useState<string | undefined>();
  const checkout = useStartCheckout();

  const submit = (event: React.FormEvent) => {
    event.preventDefault();
    let amountMinor: number;
    try {
      amountMinor = parseMoneyInput(amount, currency);
    } catch (error) {
      setFieldError(errorMessage(error));
      return;
    }
    setFieldError(undefined);
    checkout.mutate({ purpose: 'topup', dealerId, amountMinor });
  };

  return (
    <form onSubmit={submit} className="flex flex-wrap items-end gap-3" noValidate>
      <div className="w-40">
        <Field id="top-up-amount" label={`Amount (${currency})`} error={fieldError}>
          {(a11y) => <Input {...a11y} inputMode="decimal" value={amount} onChange={(e) => setAmount(e.target.value)} />}
        </Field>
      </div>
      <Button type="submit" pending={checkout.isPending || checkout.isSuccess}>
        Top up
      </Button>
      {checkout.isError && (
        <p role="alert" className="w-full text-sm text-bad">
          {errorMessage(checkout.error)}
        </p>
      )}
    </form>
  );
}
