import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { plainErrors } from '../../../lib/form-messages';
import { Button } from '../../../components/ui/button';
import { Field } from '../../../components/ui/field';
import { FormErrorSummary } from '../../../components/ui/form-error-summary';
import { Input } from '../../../components/ui/input';
import { applyFieldErrors, errorMessage, summaryItems } from '../../../lib/form-errors';
import { createShopSchema, useCreateShop } from '../api/create-shop';

const FIELDS = ['name', 'ownerName', 'ownerEmail'] as const;

export function CreateShopForm({ onDone, onCancel }: { onDone: (ownerEmail: string) => void; onCancel: () => void }) {
  const form = useForm({ resolver: zodResolver(createShopSchema, plainErrors), defaultValues: { name: '', ownerName: '', ownerEmail: '' } });
  const create = useCreateShop();
  const { errors, isSubmitted } = form.formState;
  const onSubmit = form.handleSubmit((values) =>
    create.mutate(values, {
      onSuccess: () => onDone(values.ownerEmail),
      onError: (error) => applyFieldErrors(error, FIELDS, (field, message) => form.setError(field as (typeof FIELDS)[number], { message })),
    }),
  );
  const items = summaryItems(isSubmitted ? errors : {}, 'shop', create.error ? errorMessage(create.error) : null);

  return (
    <form noValidate onSubmit={onSubmit} className="flex flex-col gap-4">
      <FormErrorSummary items={items} />
      <Field id="shop-name" label="Shop name" error={errors.name?.message}>
        {(a11y) => <Input {...a11y} autoComplete="off" {...form.register('name')} />}
      </Field>
      <Field id="shop-ownerName" label="Owner name" error={errors.ownerName?.message}>
        {(a11y) => <Input {...a11y} autoComplete="off" {...form.register('ownerName')} />}
      </Field>
      <Field id="shop-ownerEmail" label="Owner e-mail" hint="The owner gets an invitation to set a password." error={errors.ownerEmail?.message}>
        {(a11y) => <Input {...a11y} type="email" autoComplete="off" {...form.register('ownerEmail')} />}
      </Field>
      <div className="flex justify-end gap-2">
        <Button variant="secondary" onClick={onCancel} disabled={create.isPending}>
          Cancel
        </Button>
        <Button type="submit" pending={create.isPending}>
          Create shop
        </Button>
      </div>
    </form>
  );
}
