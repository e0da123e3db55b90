import { useState } from 'react';
import { useAbility } from '@casl/react';
import type { AppAbility } from '@revloop/domain/auth';
import { formatMoney } from '@revloop/domain/billing';
import { addDays, RENTAL_ENTRY_LABELS, RENTAL_STATE_LABELS, type RentalState } from '@revloop/domain/rentals';
import { Badge } from '../../../components/ui/badge';
import { Banner } from '../../../components/ui/banner';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { Spinner } from '../../../components/ui/spinner';
import { errorMessage } from '../../../lib/form-errors';
import { formatDate, formatDateTime } from '../../../lib/format';
import { CautionsList } from '../../jobs/components/cautions';
import { useAgreeRentalTerms } from '../api/agree-rental-terms';
import { useCreateRental } from '../api/create-rental';
import { useRental } from '../api/get-rental';
import { useRentals } from '../api/get-rentals';
import { useStartRentalCheckout } from '../api/start-rental-checkout';
import { KitDatesPicker, type KitDates } from './kit-dates-picker';
import { RentalMoveForm } from './rental-move-form';

const ENTRY_LABELS = RENTAL_ENTRY_LABELS;

const TERMS =
  'If the kit comes back late, each late day is charged at the late fee per day. If it comes back damaged or with items missing, the shop may take part or all of the deposit held on your card and tells you why; if it is lost, the whole deposit. The rest of the hold is released.';

/** `canPay`: the job's customer or dealer, who agree to the terms, pay the fee and authorise the hold. */
function RentalCard({ rentalId, canPay }: { rentalId: string; canPay: boolean }) {
  const rental = useRental(rentalId);
  const [moving, setMoving] = useState<{ to: RentalState; label: string } | null>(null);
  const [agreed, setAgreed] = useState(false);
  const terms = useAgreeRentalTerms();
  const checkout = useStartRentalCheckout();
  if (rental.isPending) return <Spinner label="Loading the rental" />;
  if (rental.isError) return <Banner tone="bad">{errorMessage(rental.error)}</Banner>;
  const r = rental.data.data;
  const money = (minor: number) => formatMoney(minor, r.currency);
  const open = r.state !== 'closed' && r.state !== 'cancelled';
  const payable = open && r.state !== 'requested';
  return (
    <article className="flex flex-col gap-3 rounded-md border border-ink-200 p-3" aria-label={`Kit rental: ${r.kitName ?? 'kit to be picked'}`}>
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h3 className="font-semibold">{r.kitName ?? 'Kit to be picked by the shop'}</h3>
        <Badge tone={r.state === 'closed' ? 'ok' : r.state === 'cancelled' ? 'neutral' : 'accent'}>{RENTAL_STATE_LABELS[r.state]}</Badge>
      </div>
      {r.nextStep && <p className="font-medium text-ink-900">{r.nextStep}</p>}
      <dl className="grid grid-cols-2 gap-2 text-sm sm:grid-cols-4">
        <div><dt className="text-ink-600">Dates</dt><dd>{formatDate(r.startDate)} – {formatDate(r.dueDate)}</dd></div>
        <div><dt className="text-ink-600">Rental fee</dt><dd>{money(r.feeMinor)}{r.feePaid ? ' (paid)' : ''}</dd></div>
        <div><dt className="text-ink-600">Deposit (held, not charged)</dt><dd>{money(r.depositMinor)}</dd></div>
        <div><dt className="text-ink-600">Late fee per day</dt><dd>{money(r.lateFeePerDayMinor)}</dd></div>
      </dl>
      {r.deposit.holdExpiresAt && <p className="text-xs text-ink-600">Hold of {money(r.deposit.heldMinor)} on the card until {formatDateTime(r.deposit.holdExpiresAt)} (renewed by the shop while the kit is out).</p>}
      {r.condition && (
        <p className="text-sm">
          Returned {formatDate(r.receivedDate)} · condition: {r.condition.replace('_', ' ')}
          {r.conditionNotes && ` — ${r.conditionNotes}`}
          {r.returnedContents?.some((c) => !c.present) && ` · missing: ${r.returnedContents.filter((c) => !c.present).map((c) => c.item).join(', ')}`}
        </p>
      )}
      {payable && canPay && !r.termsAcceptedAt && (
        <div className="flex flex-col gap-2 rounded-md bg-ink-50 p-3 text-sm">
          <p><strong>Rental terms.</strong> {TERMS}</p>
          <label className="flex items-center gap-2">
            <input type="checkbox" checked={agreed} onChange={(e) => setAgreed(e.target.checked)} /> I agree to the rental terms
          </label>
          {terms.isError && <Banner tone="bad">{errorMessage(terms.error)}</Banner>}
          <div><Button disabled={!agreed} pending={terms.isPending} onClick={() => terms.mutate(r.id)}>Agree to the terms</Button></div>
        </div>
      )}
      {payable && canPay && r.termsAcceptedAt && (!r.feePaid || r.deposit.status === 'none') && (
        <div className="flex flex-wrap gap-2">
          {!r.feePaid && r.feeMinor > 0 && (
            <Button pending={checkout.isPending && checkout.variables.kind === 'fee'} onClick={() => checkout.mutate({ rentalId: r.id, kind: 'fee' })}>Pay the rental fee ({money(r.feeMinor)})</Button>
          )}
          {r.deposit.status === 'none' && r.depositMinor > 0 && (
            <Button variant="secondary" pending={checkout.isPending && checkout.variables.kind === 'deposit'} onClick={() => checkout.mutate({ rentalId: r.id, kind: 'deposit' })}>
              Authorise the deposit hold ({money(r.depositMinor)})
            </Button>
          )}
        </div>
      )}
      {checkout.isError && <Banner tone="bad">{errorMessage(checkout.error)}</Banner>}
      {r.entries.length > 0 && (
        <table className="w-full text-left text-sm">
          <caption className="text-left font-medium">Money lines</caption>
          <thead className="text-xs text-ink-600"><tr><th scope="col">When</th><th scope="col">What</th><th scope="col" className="text-right">Amount</th></tr></thead>
          <tbody>
            {r.entries.map((e) => (
              <tr key={e.id} className="border-t border-ink-100">
                <td className="py-1 pr-2">{formatDate(e.at)}</td>
                <td className="py-1 pr-2">{ENTRY_LABELS[e.kind]}{e.description && ` — ${e.description}`}</td>
                <td className="py-1 text-right tabular-nums">{e.kind === 'card_saved' ? '—' : money(e.amountMinor)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {moving ? (
        <RentalMoveForm rental={r} to={moving.to} label={moving.label} onDone={() => setMoving(null)} />
      ) : (
        r.availableTransitions.length > 0 && (
          <div className="flex flex-wrap gap-2">
            {r.availableTransitions.map((t) => (
              <Button key={t.to} size="sm" variant={t.to === 'cancelled' ? 'danger' : 'secondary'} onClick={() => setMoving(t)}>{t.label}</Button>
            ))}
          </div>
        )
      )}
    </article>
  );
}

function NewRentalForm({ jobId, staff, onDone }: { jobId: string; staff: boolean; onDone: () => void }) {
  const start = addDays(new Date().toISOString().slice(0, 10), 7);
  const [value, setValue] = useState<KitDates>({ kitId: '', startDate: start, dueDate: addDays(start, 13) });
  const [notes, setNotes] = useState('');
  const create = useCreateRental();
  const submit = (event: React.FormEvent) => {
    event.preventDefault();
    create.mutate({ jobId, startDate: value.startDate, dueDate: value.dueDate, notes, ...(staff ? { kitId: value.kitId } : {}) }, { onSuccess: onDone });
  };
  return (
    <form onSubmit={submit} className="flex flex-col gap-3" aria-label={staff ? 'Book a kit' : 'Ask for a kit'}>
      {create.isError && <Banner tone="bad" title={create.error && 'status' in create.error && create.error.status === 409 ? 'Those dates clash' : undefined}>{errorMessage(create.error)}</Banner>}
      <KitDatesPicker value={value} onChange={setValue} idPrefix={`new-rental-${jobId}`} withKit={staff} />
      {!staff && (
        <label className="flex flex-col gap-1 text-sm">
          <span className="font-medium">Notes for the shop (optional)</span>
          <textarea className="min-h-16 rounded-md border border-ink-300 px-3 py-2" value={notes} onChange={(e) => setNotes(e.target.value)} />
        </label>
      )}
      <div className="flex gap-2">
        <Button type="submit" pending={create.isPending} disabled={staff && !value.kitId}>{staff ? 'Book the kit' : 'Ask for a kit'}</Button>
        <Button variant="ghost" onClick={onDone}>Cancel</Button>
      </div>
    </form>
  );
}

/** The job page's kit panel: the job's rentals with their money lines and moves, and booking or asking for a kit. */
export function JobKitPanel({ jobId }: { jobId: string }) {
  const ability = useAbility<AppAbility>();
  const rentals = useRentals({ jobId });
  const [adding, setAdding] = useState(false);
  const staff = ability.can('book', 'Rental');
  const canCreate = ability.can('create', 'Rental');
  const canPay = ability.can('agree', 'Rental');
  const list = rentals.data?.data ?? [];
  if (!canCreate && list.length === 0) return null;
  return (
    <Card
      title="Flashing kit"
      description="The shop can rent you a vehicle interface, a laptop set up for flashing and logging, cables and a battery supporter."
      actions={canCreate && !adding ? <Button size="sm" variant="secondary" onClick={() => setAdding(true)}>{staff ? 'Book a kit' : 'Ask for a kit'}</Button> : undefined}
    >
      <div className="flex flex-col gap-4">
        {rentals.isError && <Banner tone="bad">{errorMessage(rentals.error)}</Banner>}
        {adding && <NewRentalForm jobId={jobId} staff={staff} onDone={() => setAdding(false)} />}
        {list.map((r) => (
          <RentalCard key={r.id} rentalId={r.id} canPay={canPay} />
        ))}
        {list.length > 0 && (
          <Banner tone="warn" title="Before you flash with the kit">
            <CautionsList />
          </Banner>
        )}
      </div>
    </Card>
  );
}
