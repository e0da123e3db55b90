import { useFieldArray, useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { CANONICAL_CHANNELS, CHANNEL_INFO, DEFAULT_ANALYSIS_SETTINGS, defaultLogRequest } from '@revloop/domain/datalog';
import { Button } from '../../../components/ui/button';
import { Field } from '../../../components/ui/field';
import { FormErrorSummary } from '../../../components/ui/form-error-summary';
import { Input, controlClasses } from '../../../components/ui/input';
import { Select } from '../../../components/ui/select';
import { cn } from '../../../lib/cn';
import { errorMessage } from '../../../lib/form-errors';
import { plainErrors } from '../../../lib/form-messages';
import { fieldId, flattenFieldErrors } from '../../jobs/components/intake-errors';
import type { Shop } from '@revloop/contract';
import { useUpdateShop } from '../api/update-shop';
import { shopSettingsFormDefaults, shopSettingsFormSchema, type ShopSettingsFormOutput, type ShopSettingsFormValues } from './shop-settings-form.schemas';

/** The log-check thresholds a shop may tune; the hints say what each one decides. */
const THRESHOLDS = [
  { key: 'warmCoolantC', label: 'Warm engine at (°C)', hint: 'Coolant at or above this counts as warm (common practice: 80–105 °C).' },
  { key: 'wotThresholdPct', label: 'Full throttle at (%)', hint: 'Pedal or throttle at or above this is a full-throttle pull.' },
  { key: 'partialPedalPct', label: 'Half-pressed pedal above (%)', hint: 'A sustained pedal above this that never reaches full throttle fails the pull.' },
  { key: 'trimRpmBinWidth', label: 'Trim grid rpm step', hint: 'Width of each fuel-trim cell in rpm.' },
  { key: 'trimMapBinWidthKpa', label: 'Trim grid MAP step (kPa)', hint: 'Height of each fuel-trim cell in kPa.' },
  { key: 'trimMafBinWidthGs', label: 'Trim grid airflow step (g/s)', hint: 'Height of each fuel-trim cell when the grid is by mass airflow.' },
  { key: 'trimMinSamples', label: 'Samples per trim cell', hint: 'Fewer samples than this leave a cell out as noise.' },
  { key: 'bankSplitPct', label: 'Bank split above (%)', hint: 'Bank 1 and bank 2 trims of a cell further apart than this are flagged (common practice: 5 %).' },
  { key: 'wotRpmBinWidth', label: 'Full-throttle rpm step', hint: 'Width of each rpm bin in the full-throttle table.' },
] as const;

// Every IANA zone the browser knows; UTC first, as the default.
const TIME_ZONES = ['UTC', ...Intl.supportedValuesOf('timeZone').filter((zone) => zone !== 'UTC')].map((zone) => ({ value: zone, label: zone.replaceAll('_', ' ') }));

const asNumber = { setValueAs: (value: unknown) => (value === '' || value === undefined ? undefined : Number(value)) };

/** The owner's shop-wide settings: name, upload limit, hold until paid, and log requests per engine family. */
export function ShopSettingsForm({ shop, canEdit }: { shop: Shop; canEdit: boolean }) {
  const form = useForm<ShopSettingsFormValues, unknown, ShopSettingsFormOutput>({ resolver: zodResolver(shopSettingsFormSchema, plainErrors), defaultValues: shopSettingsFormDefaults(shop) });
  const defaults = useFieldArray({ control: form.control, name: 'defaults' });
  const update = useUpdateShop();
  const { errors, isSubmitted, isDirty } = form.formState;
  const onSubmit = form.handleSubmit((patch) => update.mutate(patch, { onSuccess: (response) => form.reset(shopSettingsFormDefaults(response.data)) }));
  const items = [
    ...(isSubmitted ? flattenFieldErrors(errors).map((e) => ({ fieldId: fieldId('shop', e.path), message: e.message })) : []),
    ...(update.error ? [{ message: errorMessage(update.error) }] : []),
  ];

  return (
    <form noValidate onSubmit={onSubmit} className="flex flex-col gap-6">
      <FormErrorSummary items={items} />
      <fieldset disabled={!canEdit} className="flex flex-col gap-4">
        <div className="grid gap-4 sm:grid-cols-2">
          <Field id="shop-name" label="Shop name" error={errors.name?.message}>
            {(a11y) => <Input {...a11y} {...form.register('name')} />}
          </Field>
          <Field id="shop-uploadLimitMiB" label="Largest upload (MiB)" hint="For calibration files and datalogs; 16 MiB covers the control units we see." error={errors.uploadLimitMiB?.message}>
            {(a11y) => <Input {...a11y} type="number" inputMode="numeric" {...form.register('uploadLimitMiB', asNumber)} />}
          </Field>
          <Field id="shop-timeZone" label="Time zone" hint="Dates in the shop's e-mails are written in this time zone." error={errors.timeZone?.message}>
            {(a11y) => <Select {...a11y} options={TIME_ZONES} {...form.register('timeZone')} />}
          </Field>
        </div>
        <label className="flex items-start gap-2 text-sm text-ink-900">
          <input type="checkbox" className="mt-0.5 size-4 accent-accent-600" {...form.register('holdUntilPaid')} />
          <span>
            <span className="font-medium">Hold new jobs until paid</span>
            <span className="block text-ink-600">A direct customer's new job waits on hold until its package is paid; dealer jobs are paid from the dealer balance.</span>
          </span>
        </label>
      </fieldset>

      <section aria-labelledby="thresholds-title" className="flex flex-col gap-3">
        <div>
          <h3 id="thresholds-title" className="text-base font-semibold text-ink-900">
            Log checks
          </h3>
          <p className="text-sm text-ink-600">Leave a field empty to use Revloop's default, shown greyed in the field.</p>
        </div>
        <fieldset disabled={!canEdit} className="grid gap-4 sm:grid-cols-2">
          {THRESHOLDS.map(({ key, label, hint }) => (
            <Field key={key} id={`shop-analysis-${key}`} label={label} hint={hint} error={errors.analysis?.[key]?.message}>
              {(a11y) => (
                <Input {...a11y} type="number" inputMode="decimal" placeholder={String(DEFAULT_ANALYSIS_SETTINGS[key])} {...form.register(`analysis.${key}`, asNumber)} />
              )}
            </Field>
          ))}
        </fieldset>
      </section>

      <section aria-labelledby="defaults-title" className="flex flex-col gap-3">
        <div>
          <h3 id="defaults-title" className="text-base font-semibold text-ink-900">
            Default log requests per engine family
          </h3>
          <p className="text-sm text-ink-600">
            A new job whose engine family matches (ignoring case, spaces and punctuation) starts with this log request; others get the built-in one.
          </p>
        </div>
        {defaults.fields.length === 0 && <p className="text-sm text-ink-600">None yet: every job starts with the built-in request.</p>}
        {defaults.fields.map((entry, index) => (
          <fieldset key={entry.id} disabled={!canEdit} className="flex flex-col gap-3 rounded-lg border border-ink-200 p-4">
            <legend className="px-1 text-sm font-medium text-ink-800">Engine family {index + 1}</legend>
            <div className="grid gap-4 sm:grid-cols-3">
              <Field id={`shop-defaults-${index}-family`} label="Engine family" hint='e.g. "V8" or "2.0 turbo I4"' error={errors.defaults?.[index]?.family?.message}>
                {(a11y) => <Input {...a11y} {...form.register(`defaults.${index}.family`)} />}
              </Field>
              <Field id={`shop-defaults-${index}-warmupMinutes`} label="Warm-up (minutes)" error={errors.defaults?.[index]?.warmupMinutes?.message}>
                {(a11y) => <Input {...a11y} type="number" inputMode="numeric" {...form.register(`defaults.${index}.warmupMinutes`, asNumber)} />}
              </Field>
              <Field id={`shop-defaults-${index}-wotGears`} label="Full-throttle gears" error={errors.defaults?.[index]?.wotGears?.message}>
                {(a11y) => <Input {...a11y} type="number" inputMode="numeric" {...form.register(`defaults.${index}.wotGears`, asNumber)} />}
              </Field>
            </div>
            <div className="grid gap-x-4 gap-y-1.5 sm:grid-cols-3">
              {CANONICAL_CHANNELS.map((channel) => (
                <label key={channel} className="flex items-center gap-2 text-sm text-ink-800">
                  <input type="checkbox" value={channel} className="size-4 accent-accent-600" {...form.register(`defaults.${index}.channels`)} />
                  {CHANNEL_INFO[channel].label}
                </label>
              ))}
            </div>
            <Field id={`shop-defaults-${index}-notes`} label="Notes for the customer" error={errors.defaults?.[index]?.notes?.message}>
              {(a11y) => <textarea {...a11y} rows={2} className={cn(controlClasses, 'py-2')} {...form.register(`defaults.${index}.notes`)} />}
            </Field>
            {canEdit && (
              <div>
                <Button size="sm" variant="ghost" onClick={() => defaults.remove(index)}>
                  Remove this family
                </Button>
              </div>
            )}
          </fieldset>
        ))}
        {canEdit && (
          <div>
            <Button size="sm" variant="secondary" onClick={() => defaults.append({ family: '', ...defaultLogRequest() })}>
              Add an engine family
            </Button>
          </div>
        )}
      </section>

      {canEdit && (
        <div className="flex items-center justify-end gap-3">
          {update.isSuccess && !isDirty && (
            <p role="status" className="text-sm text-ok">
              Saved.
            </p>
          )}
          <Button type="submit" pending={update.isPending} disabled={!isDirty}>
            Save shop settings
          </Button>
        </div>
      )}
    </form>
  );
}
