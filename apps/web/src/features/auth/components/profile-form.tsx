import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { Me } from '@revloop/contract';
import { plainErrors } from '../../../lib/form-messages';
import { Banner } from '../../../components/ui/banner';
import { Button } from '../../../components/ui/button';
import { Field } from '../../../components/ui/field';
import { FormErrorSummary } from '../../../components/ui/form-error-summary';
import { Input } from '../../../components/ui/input';
import { errorMessage, summaryItems } from '../../../lib/form-errors';
import { updateMeSchema, useUpdateMe } from '../api/update-me';

const UNIT_OPTIONS = [
  { value: 'metric', label: 'Metric', example: 'km/h, °C, kPa, N·m' },
  { value: 'imperial', label: 'Imperial', example: 'mph, °F, psi, lb·ft' },
] as const;

export function ProfileForm({ me }: { me: Me }) {
  const form = useForm({ resolver: zodResolver(updateMeSchema, plainErrors), defaultValues: { name: me.user.name, unitSystem: me.user.unitSystem } });
  const update = useUpdateMe();
  const { errors, isSubmitted, isDirty } = form.formState;
  const onSubmit = form.handleSubmit((values) => update.mutate(values, { onSuccess: (next) => form.reset({ name: next.user.name, unitSystem: next.user.unitSystem }) }));
  const items = summaryItems(isSubmitted ? errors : {}, 'profile', update.error ? errorMessage(update.error) : null);

  return (
    <form noValidate onSubmit={onSubmit} className="flex max-w-lg flex-col gap-5">
      <FormErrorSummary items={items} />
      {update.isSuccess && !isDirty && <Banner tone="ok">Profile saved.</Banner>}
      <Field id="profile-email" label="E-mail" hint="The address you sign in with.">
        {(a11y) => <Input {...a11y} value={me.user.email} readOnly disabled />}
      </Field>
      <Field id="profile-name" label="Name" error={errors.name?.message}>
        {(a11y) => <Input {...a11y} autoComplete="name" {...form.register('name')} />}
      </Field>
      <fieldset className="flex flex-col gap-2">
        <legend className="text-sm font-medium text-ink-800">Units</legend>
        <p className="text-xs text-ink-600">How vehicles, logs and reports show their numbers to you.</p>
        <div className="mt-1 grid gap-2 sm:grid-cols-2">
          {UNIT_OPTIONS.map((option) => (
            <label
              key={option.value}
              className="flex cursor-pointer items-start gap-3 rounded-lg border border-ink-300 bg-white p-3 has-checked:border-accent-600 has-checked:bg-accent-50"
            >
              <input type="radio" value={option.value} className="mt-1 accent-accent-600" {...form.register('unitSystem')} />
              <span>
                <span className="block text-sm font-medium text-ink-900">{option.label}</span>
                <span className="block text-xs text-ink-600">{option.example}</span>
              </span>
            </label>
          ))}
        </div>
      </fieldset>
      <div>
        <Button type="submit" pending={update.isPending} disabled={!isDirty}>
          Save profile
        </Button>
      </div>
    </form>
  );
}
