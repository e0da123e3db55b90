import { useState } from 'react';
import type { Kit, KitCreate } from '@revloop/contract';
import { minorToDecimalString, parseMoneyInput } from '@revloop/domain/billing';
import { KIT_STATUS_LABELS, KIT_STATUSES, type KitStatus } from '@revloop/domain/rentals';
import { Banner } from '../../../components/ui/banner';
import { Button } from '../../../components/ui/button';
import { Field } from '../../../components/ui/field';
import { Input } from '../../../components/ui/input';
import { Select } from '../../../components/ui/select';
import { errorMessage } from '../../../lib/form-errors';
import { useCreateKit } from '../api/create-kit';
import { useUpdateKit } from '../api/update-kit';

const lines = (text: string) => text.split('\n').map((line) => line.trim()).filter(Boolean);

const STATUS_OPTIONS = KIT_STATUSES.map((value) => ({ value, label: KIT_STATUS_LABELS[value] }));

/** Add or edit a kit. Money is typed in the shop's currency and sent in minor units; the server validates again. */
export function KitForm({ kit, currency, onDone }: { kit?: Kit; currency: string; onDone: (kit: Kit) => void }) {
  const money = (minor: number | undefined) => (minor === undefined ? '' : minorToDecimalString(minor, currency));
  const [form, setForm] = useState({
    name: kit?.name ?? '',
    interfaceSerial: kit?.interfaceSerial ?? '',
    laptopAssetTag: kit?.laptopAssetTag ?? '',
    contents: (kit?.contents ?? []).join('\n'),
    platforms: (kit?.platforms ?? []).join('\n'),
    conditionNotes: kit?.conditionNotes ?? '',
    status: (kit?.status ?? 'available') as KitStatus,
    weekly: money(kit?.weeklyPriceMinor),
    deposit: money(kit?.depositMinor),
    lateFee: money(kit?.lateFeePerDayMinor),
  });
  const [error, setError] = useState<string | null>(null);
  const create = useCreateKit();
  const update = useUpdateKit();
  const set = (key: keyof typeof form) => (event: { target: { value: string } }) => setForm((f) => ({ ...f, [key]: event.target.value }));

  const submit = (event: React.FormEvent) => {
    event.preventDefault();
    let body: KitCreate;
    try {
      body = {
        name: form.name,
        interfaceSerial: form.interfaceSerial,
        laptopAssetTag: form.laptopAssetTag,
        contents: lines(form.contents),
        platforms: lines(form.platforms),
        conditionNotes: form.conditionNotes,
        status: form.status,
        weeklyPriceMinor: parseMoneyInput(form.weekly, currency),
        depositMinor: parseMoneyInput(form.deposit, currency),
        lateFeePerDayMinor: parseMoneyInput(form.lateFee, currency),
      };
    } catch (problem) {
      setError(errorMessage(problem));
      return;
    }
    setError(null);
    const done = ({ data }: { data: Kit }) => onDone(data);
    if (kit) update.mutate({ kitId: kit.id, patch: body }, { onSuccess: done, onError: (e) => setError(errorMessage(e)) });
    else create.mutate(body, { onSuccess: done, onError: (e) => setError(errorMessage(e)) });
  };

  const area = 'min-h-20 w-full rounded-md border border-ink-300 px-3 py-2 text-sm';
  return (
    <form onSubmit={submit} className="flex flex-col gap-4" noValidate>
      {error && <Banner tone="bad">{error}</Banner>}
      <div className="grid gap-4 sm:grid-cols-2">
        <Field id="kit-name" label="Name">{(a) => <Input {...a} value={form.name} onChange={set('name')} required />}</Field>
        <Field id="kit-serial" label="Interface serial number">{(a) => <Input {...a} value={form.interfaceSerial} onChange={set('interfaceSerial')} required />}</Field>
        <Field id="kit-asset" label="Laptop asset tag">{(a) => <Input {...a} value={form.laptopAssetTag} onChange={set('laptopAssetTag')} />}</Field>
        <Field id="kit-status" label="Status">{(a) => <Select {...a} options={STATUS_OPTIONS} value={form.status} onChange={set('status')} />}</Field>
        <Field id="kit-weekly" label={`Price per week (${currency})`}>{(a) => <Input {...a} inputMode="decimal" value={form.weekly} onChange={set('weekly')} />}</Field>
        <Field id="kit-deposit" label={`Deposit (${currency})`} hint="Held on the customer's card, not charged.">{(a) => <Input {...a} inputMode="decimal" value={form.deposit} onChange={set('deposit')} />}</Field>
        <Field id="kit-late" label={`Late fee per day (${currency})`}>{(a) => <Input {...a} inputMode="decimal" value={form.lateFee} onChange={set('lateFee')} />}</Field>
      </div>
      <Field id="kit-contents" label="Contents checklist" hint="One item a line; checked off when the kit comes back.">{(a) => <textarea {...a} className={area} value={form.contents} onChange={set('contents')} />}</Field>
      <Field id="kit-platforms" label="Platforms" hint="One a line: engine families or free text.">{(a) => <textarea {...a} className={area} value={form.platforms} onChange={set('platforms')} />}</Field>
      <Field id="kit-notes" label="Condition notes">{(a) => <textarea {...a} className={area} value={form.conditionNotes} onChange={set('conditionNotes')} />}</Field>
      <div>
        <Button type="submit" pending={create.isPending || update.isPending}>
          {kit ? 'Save kit' : 'Add kit'}
        </Button>
      </div>
    </form>
  );
}

