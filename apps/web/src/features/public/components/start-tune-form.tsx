import { useEffect } from 'react';
import { useForm, type FieldPath, type UseFormReturn } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import {
  publicStartSchema,
  type PublicPackage,
  type PublicStartFormValues,
  type PublicStartInput,
} from '@revloop/contract';
import { formatMoney } from '@revloop/domain/billing';
import type { JobIntakeFormValues, JobIntakeInput } from '@revloop/domain/jobs';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { Field } from '../../../components/ui/field';
import { FormErrorSummary } from '../../../components/ui/form-error-summary';
import { Input, controlClasses } from '../../../components/ui/input';
import { Select } from '../../../components/ui/select';
import { cn } from '../../../lib/cn';
import { errorMessage, fieldErrorsFrom } from '../../../lib/form-errors';
import { plainErrors } from '../../../lib/form-messages';
import { CautionsList } from '../../jobs/components/cautions';
import { fieldId, flattenFieldErrors } from '../../jobs/components/intake-errors';
import { IntakeVehicleFields, NEW_VEHICLE } from '../../jobs/components/intake-vehicle-fields';
import { useStartTune } from '../api/start-tune';

const LABELS: Record<string, string> = {
  name: 'Your name',
  email: 'E-mail',
  password: 'Password',
  packageId: 'Package',
  goals: 'Goals',
  cautionsAccepted: 'Cautions',
};

/** "Start a tune": the account, the vehicle and the package in one form; the job opens when the e-mailed link is opened. */
export function StartTuneForm({
  slug,
  packages,
  currency,
  packageId,
  onSent,
}: {
  slug: string;
  packages: PublicPackage[];
  currency: string;
  packageId: string;
  onSent: (email: string) => void;
}) {
  const form = useForm<PublicStartFormValues, unknown, PublicStartInput>({
    resolver: zodResolver(publicStartSchema, plainErrors),
    shouldFocusError: false,
    defaultValues: {
      name: '',
      email: '',
      password: '',
      vehicle: { kind: 'new', vehicle: NEW_VEHICLE },
      packageId,
      goals: '',
      specialRequests: {},
    },
  });
  const start = useStartTune(slug);
  // A later "Start a tune" on another package card switches the package and keeps what was typed.
  useEffect(() => form.setValue('packageId', packageId), [form, packageId]);
  const { register } = form;
  const { errors, isSubmitted } = form.formState;
  const flat = isSubmitted ? flattenFieldErrors(errors) : [];
  const err = (path: string) => flat.find((e) => e.path === path)?.message;
  const items = [
    ...flat.map((e) => ({
      fieldId: fieldId('intake', e.path),
      message: LABELS[e.path] ? `${LABELS[e.path]}: ${e.message}` : e.message,
    })),
    ...(start.error ? [{ message: errorMessage(start.error) }] : []),
  ];
  const onSubmit = form.handleSubmit((values) =>
    start.mutate(values, {
      onSuccess: () => onSent(values.email),
      onError: (error) => {
        for (const [path, message] of Object.entries(fieldErrorsFrom(error)))
          form.setError(path as FieldPath<PublicStartFormValues>, { message });
      },
    }),
  );

  return (
    <form noValidate onSubmit={onSubmit} className="flex flex-col gap-6" aria-label="Start a tune">
      <FormErrorSummary items={items} focusKey={form.formState.submitCount} />
      <Card
        title="Your account"
        description="We e-mail you a link to confirm the address; your job opens when you open it."
      >
        <div className="grid gap-4 sm:grid-cols-2">
          <Field id={fieldId('intake', 'name')} label="Your name" error={err('name')}>
            {(a11y) => <Input {...a11y} autoComplete="name" {...register('name')} />}
          </Field>
          <Field id={fieldId('intake', 'email')} label="E-mail" error={err('email')}>
            {(a11y) => <Input {...a11y} type="email" autoComplete="email" {...register('email')} />}
          </Field>
          <Field
            id={fieldId('intake', 'password')}
            label="Password"
            hint="At least 10 characters. A short sentence works well."
            error={err('password')}
          >
            {(a11y) => (
              <Input
                {...a11y}
                type="password"
                autoComplete="new-password"
                {...register('password')}
              />
            )}
          </Field>
        </div>
      </Card>

      <Card title="Vehicle">
        {/* The public form keeps the intake's `vehicle.vehicle.*` paths, so the intake's own vehicle fields serve it. */}
        <IntakeVehicleFields
          form={form as unknown as UseFormReturn<JobIntakeFormValues, unknown, JobIntakeInput>}
          units="metric"
        />
      </Card>

      <Card title="Package and goals">
        <div className="flex flex-col gap-4">
          <Field id={fieldId('intake', 'packageId')} label="Package" error={err('packageId')}>
            {(a11y) => (
              <Select
                {...a11y}
                options={[
                  { value: '', label: 'Choose a package' },
                  ...packages.map((pkg) => ({
                    value: pkg.id,
                    label: `${pkg.name} (${pkg.modules.join(' + ')}) — ${formatMoney(pkg.retailPriceMinor, currency)}, ${pkg.roundsIncluded} rounds`,
                  })),
                ]}
                {...register('packageId')}
              />
            )}
          </Field>
          <Field
            id={fieldId('intake', 'goals')}
            label="Goals"
            hint="What the calibration should achieve: power, response, economy, towing, parts to match…"
            error={err('goals')}
          >
            {(a11y) => (
              <textarea
                {...a11y}
                rows={3}
                className={cn(controlClasses, 'py-2')}
                {...register('goals')}
              />
            )}
          </Field>
        </div>
      </Card>

      <Card title="Cautions">
        <CautionsList />
        <label className="mt-4 flex items-start gap-2 text-sm font-medium text-ink-900">
          <input
            id={fieldId('intake', 'cautionsAccepted')}
            type="checkbox"
            className="mt-0.5 size-4 accent-accent-600"
            aria-invalid={err('cautionsAccepted') ? true : undefined}
            {...register('cautionsAccepted')}
          />
          I have read and accept these cautions.
        </label>
        {err('cautionsAccepted') && (
          <p className="mt-1 text-sm text-bad">Accept the cautions before the job opens.</p>
        )}
      </Card>

      <div className="flex justify-end">
        <Button type="submit" pending={start.isPending}>
          Start a tune
        </Button>
      </div>
    </form>
  );
}
