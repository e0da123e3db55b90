import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { PACKAGE_MODULES, type PackageInput } from '@revloop/domain/jobs';
import { Button } from '../../../components/ui/button';
import { Field } from '../../../components/ui/field';
import { FormErrorSummary } from '../../../components/ui/form-error-summary';
import { Input, controlClasses } from '../../../components/ui/input';
import { cn } from '../../../lib/cn';
import { errorMessage } from '../../../lib/form-errors';
import { plainErrors } from '../../../lib/form-messages';
import type { Package } from '@revloop/contract';
import { useSavePackage } from '../api/save-package';
import { packageFormDefaults, packageFormSchema, type PackageFormValues } from './package-form.schemas';

const MODULE_LABELS = { ECM: 'ECM (engine)', TCM: 'TCM (transmission)' } as const;

/** Creates or edits a package; prices are typed in the shop's currency and stored as minor units. */
export function PackageForm({ pkg, currency, onDone, onCancel }: { pkg: Package | null; currency: string; onDone: () => void; onCancel: () => void }) {
  const form = useForm<PackageFormValues, unknown, PackageInput>({ resolver: zodResolver(packageFormSchema(currency), plainErrors), defaultValues: packageFormDefaults(pkg, currency) });
  const save = useSavePackage();
  const { errors, isSubmitted } = form.formState;
  // The domain's dealer-price rule reports on the minor-unit field; show it beside the price box.
  const minorErrors = errors as typeof errors & { dealerPriceMinor?: { message?: string }; retailPriceMinor?: { message?: string } };
  const dealerError = errors.dealerPrice?.message ?? minorErrors.dealerPriceMinor?.message;
  const retailError = errors.retailPrice?.message ?? minorErrors.retailPriceMinor?.message;
  const items = [
    ...(isSubmitted
      ? [
          ['name', errors.name?.message],
          ['modules', errors.modules?.message],
          ['retailPrice', retailError],
          ['dealerPrice', dealerError],
          ['roundsIncluded', errors.roundsIncluded?.message],
        ].flatMap(([field, message]) => (message ? [{ fieldId: `package-${field}`, message }] : []))
      : []),
    ...(save.error ? [{ message: errorMessage(save.error) }] : []),
  ];
  const onSubmit = form.handleSubmit((input) => save.mutate({ ...(pkg && { id: pkg.id }), input }, { onSuccess: onDone }));

  return (
    <form noValidate onSubmit={onSubmit} className="flex flex-col gap-4">
      <FormErrorSummary items={items} />
      <Field id="package-name" label="Name" error={errors.name?.message}>
        {(a11y) => <Input {...a11y} {...form.register('name')} />}
      </Field>
      <Field id="package-description" label="Description" error={errors.description?.message}>
        {(a11y) => <textarea {...a11y} rows={2} className={cn(controlClasses, 'py-2')} {...form.register('description')} />}
      </Field>
      <fieldset id="package-modules" aria-describedby={errors.modules ? 'package-modules-error' : undefined}>
        <legend className="mb-1.5 text-sm font-medium text-ink-800">Modules covered</legend>
        <div className="flex gap-4">
          {PACKAGE_MODULES.map((module) => (
            <label key={module} className="flex items-center gap-2 text-sm">
              <input type="checkbox" value={module} className="size-4 accent-accent-600" {...form.register('modules')} />
              {MODULE_LABELS[module]}
            </label>
          ))}
        </div>
        {errors.modules?.message && (
          <p id="package-modules-error" className="mt-1 text-sm text-bad">
            {errors.modules.message}
          </p>
        )}
      </fieldset>
      <div className="grid gap-4 sm:grid-cols-3">
        <Field id="package-retailPrice" label={`Retail price (${currency})`} hint="e.g. 599.00" error={retailError}>
          {(a11y) => <Input {...a11y} inputMode="decimal" {...form.register('retailPrice')} />}
        </Field>
        <Field id="package-dealerPrice" label={`Dealer price (${currency})`} hint="What dealers pay." error={dealerError}>
          {(a11y) => <Input {...a11y} inputMode="decimal" {...form.register('dealerPrice')} />}
        </Field>
        <Field id="package-roundsIncluded" label="Rounds included" error={errors.roundsIncluded?.message}>
          {(a11y) => <Input {...a11y} type="number" inputMode="numeric" {...form.register('roundsIncluded', { valueAsNumber: true })} />}
        </Field>
      </div>
      <div className="flex justify-end gap-2">
        <Button variant="secondary" onClick={onCancel} disabled={save.isPending}>
          Cancel
        </Button>
        <Button type="submit" pending={save.isPending}>
          {pkg ? 'Save package' : 'Add package'}
        </Button>
      </div>
    </form>
  );
}
