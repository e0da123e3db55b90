import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { plainErrors } from '../../../lib/form-messages';
import { Button } from '../../../components/ui/button';
import { Field } from '../../../components/ui/field';
import { FormErrorSummary } from '../../../components/ui/form-error-summary';
import { Input } from '../../../components/ui/input';
import { applyFieldErrors, errorMessage, summaryItems } from '../../../lib/form-errors';
import { createDealerSchema, useCreateDealer } from '../api/create-dealer';
import type { Dealer } from '@revloop/contract';

const FIELDS = ['name', 'contactName', 'contactEmail', 'phone'] as const;

export function CreateDealerForm({ onDone, onCancel }: { onDone: (dealer: Dealer) => void; onCancel: () => void }) {
  const form = useForm({ resolver: zodResolver(createDealerSchema, plainErrors), defaultValues: { name: '', contactName: '', contactEmail: '', phone: '' } });
  const create = useCreateDealer();
  const { errors, isSubmitted } = form.formState;
  const onSubmit = form.handleSubmit((values) =>
    create.mutate(values, {
      onSuccess: (response) => onDone(response.data),
      onError: (error) => applyFieldErrors(error, FIELDS, (field, message) => form.setError(field as (typeof FIELDS)[number], { message })),
    }),
  );
  const items = summaryItems(isSubmitted ? errors : {}, 'dealer', create.error ? errorMessage(create.error) : null);

  return (
    <form noValidate onSubmit={onSubmit} className="flex flex-col gap-4">
      <FormErrorSummary items={items} />
      <Field id="dealer-name" label="Dealer name" error={errors.name?.message}>
        {(a11y) => <Input {...a11y} autoComplete="organization" {...form.register('name')} />}
      </Field>
      <Field id="dealer-contactName" label="Contact name" error={errors.contactName?.message}>
        {(a11y) => <Input {...a11y} autoComplete="off" {...form.register('contactName')} />}
      </Field>
      <Field id="dealer-contactEmail" label="Contact e-mail" error={errors.contactEmail?.message}>
        {(a11y) => <Input {...a11y} type="email" autoComplete="off" {...form.register('contactEmail')} />}
      </Field>
      <Field id="dealer-phone" label="Phone (optional)" error={errors.phone?.message}>
        {(a11y) => <Input {...a11y} type="tel" autoComplete="off" {...form.register('phone')} />}
      </Field>
      <div className="flex justify-end gap-2">
        <Button variant="secondary" onClick={onCancel} disabled={create.isPending}>
          Cancel
        </Button>
        <Button type="submit" pending={create.isPending}>
          Add dealer
        </Button>
      </div>
    </form>
  );
}
