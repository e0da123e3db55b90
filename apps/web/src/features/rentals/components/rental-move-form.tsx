import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import type { Rental, RentalTransition } from '@revloop/contract';
import { minorToDecimalString, parseMoneyInput } from '@revloop/domain/billing';
import { RETURN_CONDITIONS, type RentalState, type ReturnCondition } from '@revloop/domain/rentals';
import { Banner } from '../../../components/ui/banner';
import { Button } from '../../../components/ui/button';
import { Field } from '../../../components/ui/field';
import { Input } from '../../../components/ui/input';
import { Select } from '../../../components/ui/select';
import { errorMessage } from '../../../lib/form-errors';
import { getKitQueryOptions } from '../../kits/api/get-kit';
import { useMoveRental } from '../api/move-rental';
import { KitDatesPicker } from './kit-dates-picker';

const CONDITION_LABELS: Record<ReturnCondition, string> = { good: 'Good', damaged: 'Damaged', missing_items: 'Items missing', lost: 'Lost' };
const today = () => new Date().toISOString().slice(0, 10);

/** The fields one rental move needs (carrier and tracking, the return check, the deposit settlement), then the move. */
export function RentalMoveForm({ rental, to, label, onDone }: { rental: Rental; to: RentalState; label: string; onDone: () => void }) {
  const move = useMoveRental();
  const [error, setError] = useState<string | null>(null);
  const [carrier, setCarrier] = useState('');
  const [tracking, setTracking] = useState('');
  const [receivedDate, setReceivedDate] = useState(today());
  const [present, setPresent] = useState<Record<string, boolean>>({});
  const [condition, setCondition] = useState<ReturnCondition>('good');
  const [notes, setNotes] = useState('');
  const [capture, setCapture] = useState('');
  const [reason, setReason] = useState('');
  const [waive, setWaive] = useState(false);
  const [booking, setBooking] = useState({ kitId: rental.kitId ?? '', startDate: rental.startDate, dueDate: rental.dueDate });
  // The return checks off the kit's own contents list; only staff record returns, and only they read the kit.
  const kit = useQuery({ ...getKitQueryOptions(rental.kitId ?? ''), enabled: to === 'returned' && Boolean(rental.kitId) });
  const items = kit.data?.data.contents ?? [];
  const id = (name: string) => `rental-${rental.id}-${name}`;

  const body = (): RentalTransition => {
    switch (to) {
      case 'booked':
        return { to, ...booking };
      case 'shipped':
        return { to, carrier, trackingNumber: tracking };
      case 'returned':
        return { to, receivedDate, condition, conditionNotes: notes, contents: items.map((item) => ({ item, present: present[item] ?? false })) };
      case 'closed':
        return { to, waiveLateFee: waive, ...(capture.trim() ? { capture: { amountMinor: parseMoneyInput(capture, rental.currency), reason } } : {}) };
      case 'cancelled':
        return { to, reason };
      default:
        return { to: 'with_customer' };
    }
  };

  const submit = (event: React.FormEvent) => {
    event.preventDefault();
    let next: RentalTransition;
    try {
      next = body();
    } catch (problem) {
      setError(errorMessage(problem));
      return;
    }
    setError(null);
    move.mutate({ rentalId: rental.id, move: next }, { onSuccess: onDone, onError: (e) => setError(errorMessage(e)) });
  };

  return (
    <form onSubmit={submit} className="flex flex-col gap-3 rounded-md border border-ink-200 p-3" aria-label={label}>
      {error && <Banner tone="bad">{error}</Banner>}
      {to === 'booked' && <KitDatesPicker value={booking} onChange={setBooking} idPrefix={id('book')} />}
      {to === 'shipped' && (
        <div className="grid gap-3 sm:grid-cols-2">
          <Field id={id('carrier')} label="Carrier">{(a) => <Input {...a} value={carrier} onChange={(e) => setCarrier(e.target.value)} />}</Field>
          <Field id={id('tracking')} label="Tracking number">{(a) => <Input {...a} value={tracking} onChange={(e) => setTracking(e.target.value)} />}</Field>
        </div>
      )}
      {to === 'returned' && (
        <>
          <Field id={id('received')} label="Received on">{(a) => <Input {...a} type="date" value={receivedDate} onChange={(e) => setReceivedDate(e.target.value)} />}</Field>
          {items.length > 0 && (
            <fieldset className="flex flex-col gap-1 text-sm">
              <legend className="font-medium">Contents received</legend>
              {items.map((item) => (
                <label key={item} className="flex items-center gap-2">
                  <input type="checkbox" checked={present[item] ?? false} onChange={(e) => setPresent({ ...present, [item]: e.target.checked })} /> {item}
                </label>
              ))}
            </fieldset>
          )}
          <Field id={id('condition')} label="Condition">
            {(a) => <Select {...a} options={RETURN_CONDITIONS.map((value) => ({ value, label: CONDITION_LABELS[value] }))} value={condition} onChange={(e) => setCondition(e.target.value as ReturnCondition)} />}
          </Field>
          <Field id={id('notes')} label="Condition notes">{(a) => <textarea {...a} className="min-h-16 rounded-md border border-ink-300 px-3 py-2 text-sm" value={notes} onChange={(e) => setNotes(e.target.value)} />}</Field>
        </>
      )}
      {to === 'closed' && (
        <>
          <p className="text-sm text-ink-700">
            Leave the amount empty to release the whole hold ({minorToDecimalString(rental.deposit.heldMinor, rental.currency)} {rental.currency}). A capture takes part of it and releases the rest; the customer sees the reason.
          </p>
          <div className="grid gap-3 sm:grid-cols-2">
            <Field id={id('capture')} label={`Capture from the deposit (${rental.currency})`}>{(a) => <Input {...a} inputMode="decimal" value={capture} onChange={(e) => setCapture(e.target.value)} />}</Field>
            <Field id={id('reason')} label="Reason the customer sees">{(a) => <Input {...a} value={reason} onChange={(e) => setReason(e.target.value)} />}</Field>
          </div>
          {rental.lateDays > 0 && (
            <label className="flex items-center gap-2 text-sm">
              <input type="checkbox" checked={waive} onChange={(e) => setWaive(e.target.checked)} /> Waive the late fee ({rental.lateDays} late days)
            </label>
          )}
        </>
      )}
      {to === 'cancelled' && <Field id={id('cancel')} label="Reason (optional)">{(a) => <Input {...a} value={reason} onChange={(e) => setReason(e.target.value)} />}</Field>}
      <div className="flex gap-2">
        <Button type="submit" pending={move.isPending} variant={to === 'cancelled' ? 'danger' : 'primary'}>
          {label}
        </Button>
        <Button variant="ghost" onClick={onDone}>Back</Button>
      </div>
    </form>
  );
}

