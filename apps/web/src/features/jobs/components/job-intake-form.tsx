import { useEffect, useState } from 'react';
import { useForm, useWatch, type FieldPath } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { Job, Me } from '@revloop/contract';
import { formatMoney } from '@revloop/domain/billing';
import { jobIntakeSchema, type JobIntakeFormValues, type JobIntakeInput } from '@revloop/domain/jobs';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { Field } from '../../../components/ui/field';
import { FormErrorSummary } from '../../../components/ui/form-error-summary';
import { Input, controlClasses } from '../../../components/ui/input';
import { Select } from '../../../components/ui/select';
import { cn } from '../../../lib/cn';
import { errorMessage, fieldErrorsFrom } from '../../../lib/form-errors';
import { plainErrors } from '../../../lib/form-messages';
import { useCustomers } from '../../customers/api/get-customers';
import { usePackages } from '../../packages/api/get-packages';
import { useVehicles } from '../../vehicles/api/get-vehicles';
import { formatSpeed } from '../../vehicles/components/vehicle-units';
import { useCreateJob } from '../api/create-job';
import { CautionsList } from './cautions';
import { fieldId, flattenFieldErrors } from './intake-errors';
import { IntakeVehicleFields, NEW_VEHICLE, asNumber } from './intake-vehicle-fields';

type SpecialRequests = JobIntakeInput['specialRequests'];

/** Special requests the user left blank are not sent, so the job page lists only real ones. */
export function keepFilledRequests(requests: SpecialRequests): SpecialRequests {
  return Object.fromEntries(
    Object.entries(requests).filter(([, request]) => request && Object.entries(request).some(([, value]) => value !== undefined && value !== '')),
  ) as SpecialRequests;
}

const radioClasses = 'size-4 accent-accent-600';

/** Field names for the error summary, so "Fill in this field." says which field. */
const SUMMARY_LABELS: Record<string, string> = {
  'customer.customerUserId': 'Customer',
  'customer.name': 'Customer name',
  'customer.email': 'Customer e-mail',
  'vehicle.vehicleId': 'Vehicle on file',
  'vehicle.vehicle.vin': 'VIN',
  'vehicle.vehicle.modelYear': 'Model year',
  'vehicle.vehicle.description': 'Make, model and trim',
  'vehicle.vehicle.engine.displacementL': 'Displacement',
  'vehicle.vehicle.engine.cylinders': 'Cylinders',
  'vehicle.vehicle.engine.family': 'Engine family',
  'vehicle.vehicle.revLimitRpm': 'Current rev limit',
  'vehicle.vehicle.transmission.gearRatios': 'Gear ratios',
  'vehicle.vehicle.finalDrive': 'Final drive ratio',
  'vehicle.vehicle.tyreSize': 'Tyre size',
  'vehicle.vehicle.curbMassKg': 'Curb mass',
  'vehicle.vehicle.fuel.octane': 'Pump octane',
  'vehicle.vehicle.fuel.ethanolPct': 'Ethanol',
  packageId: 'Package',
  goals: 'Goals',
  cautionsAccepted: 'Cautions',
  'kitRequest.startDate': 'Kit from',
  'kitRequest.dueDate': 'Kit due back',
  'kitRequest.notes': 'Kit notes',
};

const summaryLine = (path: string, message: string) => {
  const label = SUMMARY_LABELS[path] ?? SUMMARY_LABELS[path.replace(/\.\d+$/, '')];
  return label ? `${label}: ${message}` : message;
};

export interface JobIntakeFormProps {
  me: Me;
  /** A customer preselected from the dealer's customer list. */
  customerUserId?: string;
  onDone: (job: Job) => void;
  onCancel: () => void;
}

/** Opens a job: who it is for, which vehicle, which package, what they want, and the cautions accepted. */
export function JobIntakeForm({ me, customerUserId, onDone, onCancel }: JobIntakeFormProps) {
  const isCustomer = me.role === 'customer';
  const units = me.user.unitSystem;
  const form = useForm<JobIntakeFormValues, unknown, JobIntakeInput>({
    resolver: zodResolver(jobIntakeSchema, plainErrors),
    // The error summary at the top takes focus instead, so the list of problems is what the user sees first.
    shouldFocusError: false,
    defaultValues: {
      customer: { kind: 'existing', customerUserId: isCustomer ? me.user.id : (customerUserId ?? '') },
      vehicle: { kind: 'existing', vehicleId: '' },
      packageId: '',
      goals: '',
      specialRequests: {},
    },
  });
  const { register } = form;
  const vehicleKindField = register('vehicle.kind', {
    onChange: (event: { target: { value: string } }) =>
      form.setValue('vehicle', event.target.value === 'new' ? { kind: 'new', vehicle: NEW_VEHICLE } : { kind: 'existing', vehicleId: '' }),
  });
  const create = useCreateJob();
  // "I need a flashing kit": kept beside the form values and sent as kitRequest only when ticked.
  const [kit, setKit] = useState({ wanted: false, startDate: '', dueDate: '', notes: '' });
  const customerKind = useWatch({ control: form.control, name: 'customer.kind' });
  const chosenCustomer = useWatch({ control: form.control, name: 'customer.customerUserId' });
  const vehicleKind = useWatch({ control: form.control, name: 'vehicle.kind' });
  const customers = useCustomers({ enabled: !isCustomer });
  const packages = usePackages();
  const vehicleOwner = isCustomer ? undefined : customerKind === 'existing' ? chosenCustomer : undefined;
  const vehicles = useVehicles(vehicleOwner, { enabled: isCustomer || Boolean(vehicleOwner) });
  const ownVehicles = customerKind === 'existing' && (isCustomer || Boolean(chosenCustomer)) ? (vehicles.data?.data ?? []) : [];

  useEffect(() => {
    // A new customer has no vehicles yet; someone without vehicles enters one.
    if (vehicleKind === 'existing' && (customerKind === 'new' || (vehicles.isSuccess && ownVehicles.length === 0))) {
      form.setValue('vehicle', { kind: 'new', vehicle: NEW_VEHICLE });
    }
  }, [customerKind, vehicleKind, vehicles.isSuccess, ownVehicles.length, form]);

  const { errors, isSubmitted } = form.formState;
  // The shared schema speaks of the customer; on their own form the customer is addressed directly.
  const flat = (isSubmitted ? flattenFieldErrors(errors) : []).map((e) => (isCustomer && e.path === 'cautionsAccepted' ? { ...e, message: 'Accept the cautions before the job opens.' } : e));
  const items = [
    ...flat.map((e) => ({ fieldId: fieldId('intake', e.path), message: summaryLine(e.path, e.message) })),
    ...(create.error ? [{ message: errorMessage(create.error) }] : []),
  ];
  const err = (path: string) => flat.find((e) => e.path === path)?.message;
  const currency = packages.data?.meta.currency ?? me.shop?.currency ?? 'USD';
  const activePackages = (packages.data?.data ?? []).filter((pkg) => pkg.active);
  const priceOf = (pkg: (typeof activePackages)[number]) => formatMoney(me.role === 'dealer' && pkg.dealerPriceMinor !== null ? pkg.dealerPriceMinor : pkg.retailPriceMinor, currency);

  const onSubmit = form.handleSubmit((values) => {
    if (kit.wanted && (!kit.startDate || !kit.dueDate)) {
      if (!kit.startDate) form.setError('kitRequest.startDate', { message: 'Choose the day the kit is needed from.' });
      if (!kit.dueDate) form.setError('kitRequest.dueDate', { message: 'Choose the day the kit goes back.' });
      return;
    }
    const kitRequest = kit.wanted ? { startDate: kit.startDate, dueDate: kit.dueDate, notes: kit.notes } : undefined;
    create.mutate(
      { ...values, specialRequests: keepFilledRequests(values.specialRequests), kitRequest },
      {
        onSuccess: (response) => onDone(response.data),
        onError: (error) => {
          for (const [path, message] of Object.entries(fieldErrorsFrom(error))) form.setError(path as FieldPath<JobIntakeFormValues>, { message });
        },
      },
    );
  });

  const request = (name: 'shiftPoints' | 'revLimit' | 'launch' | 'idle', label: string) => (
    <div className="grid gap-3 sm:grid-cols-[10rem_1fr]">
      <Field id={fieldId('intake', `specialRequests.${name}.rpm`)} label={`${label} (rpm)`} error={err(`specialRequests.${name}.rpm`)}>
        {(a11y) => <Input {...a11y} type="number" inputMode="numeric" {...register(`specialRequests.${name}.rpm`, asNumber)} />}
      </Field>
      <Field id={fieldId('intake', `specialRequests.${name}.notes`)} label={`${label}: notes`} error={err(`specialRequests.${name}.notes`)}>
        {(a11y) => <Input {...a11y} {...register(`specialRequests.${name}.notes`)} />}
      </Field>
    </div>
  );

  return (
    <form noValidate onSubmit={onSubmit} className="flex flex-col gap-6">
      <FormErrorSummary items={items} focusKey={form.formState.submitCount} />

      {!isCustomer && (
        <Card title="Customer" description={me.role === 'dealer' ? 'One of your customers, or a new one.' : 'Someone already in the shop, or a new customer.'}>
          <div className="flex flex-col gap-4">
            <div role="radiogroup" aria-label="Customer" className="flex flex-wrap gap-4 text-sm">
              <label className="flex items-center gap-2">
                <input type="radio" value="existing" className={radioClasses} {...register('customer.kind')} />
                Existing customer
              </label>
              <label className="flex items-center gap-2">
                <input type="radio" value="new" className={radioClasses} {...register('customer.kind')} />
                New customer
              </label>
            </div>
            {customerKind === 'existing' ? (
              <Field id={fieldId('intake', 'customer.customerUserId')} label="Customer" error={err('customer.customerUserId')}>
                {(a11y) => (
                  <Select
                    {...a11y}
                    options={[{ value: '', label: customers.isPending ? 'Loading customers…' : 'Choose a customer' }, ...(customers.data?.data ?? []).map((c) => ({ value: c.id, label: `${c.name} — ${c.email}` }))]}
                    {...register('customer.customerUserId', { onChange: () => form.setValue('vehicle', { kind: 'existing', vehicleId: '' }) })}
                  />
                )}
              </Field>
            ) : (
              <div className="grid gap-4 sm:grid-cols-2">
                <Field id={fieldId('intake', 'customer.name')} label="Customer name" error={err('customer.name')}>
                  {(a11y) => <Input {...a11y} autoComplete="off" {...register('customer.name')} />}
                </Field>
                <Field id={fieldId('intake', 'customer.email')} label="Customer e-mail" hint="They get the job's updates here." error={err('customer.email')}>
                  {(a11y) => <Input {...a11y} type="email" autoComplete="off" {...register('customer.email')} />}
                </Field>
              </div>
            )}
          </div>
        </Card>
      )}

      <Card title="Vehicle">
        <div className="flex flex-col gap-4">
          {ownVehicles.length > 0 && (
            <div role="radiogroup" aria-label="Vehicle" className="flex flex-wrap gap-4 text-sm">
              {/* One registration for both radios: a second register() call with its own onChange would replace the first. */}
              <label className="flex items-center gap-2">
                <input type="radio" value="existing" className={radioClasses} {...vehicleKindField} />
                A vehicle on file
              </label>
              <label className="flex items-center gap-2">
                <input type="radio" value="new" className={radioClasses} {...vehicleKindField} />
                Another vehicle
              </label>
            </div>
          )}
          {vehicleKind === 'existing' ? (
            !isCustomer && customerKind === 'existing' && !chosenCustomer ? (
              <p className="text-sm text-ink-600">Choose the customer first.</p>
            ) : (
              <Field id={fieldId('intake', 'vehicle.vehicleId')} label="Vehicle on file" error={err('vehicle.vehicleId')}>
                {(a11y) => (
                  <Select
                    {...a11y}
                    options={[{ value: '', label: vehicles.isPending ? 'Loading vehicles…' : 'Choose a vehicle' }, ...ownVehicles.map((v) => ({ value: v.id, label: `${v.description} — ${v.vin}` }))]}
                    {...register('vehicle.vehicleId')}
                  />
                )}
              </Field>
            )
          ) : (
            <IntakeVehicleFields form={form} units={units} />
          )}
        </div>
      </Card>

      <Card title="Package and goals">
        <div className="flex flex-col gap-4">
          <Field id={fieldId('intake', 'packageId')} label="Package" error={err('packageId')}>
            {(a11y) => (
              <Select
                {...a11y}
                options={[{ value: '', label: packages.isPending ? 'Loading packages…' : 'Choose a package' }, ...activePackages.map((pkg) => ({ value: pkg.id, label: `${pkg.name} (${pkg.modules.join(' + ')}) — ${priceOf(pkg)}, ${pkg.roundsIncluded} rounds` }))]}
                {...register('packageId')}
              />
            )}
          </Field>
          <Field id={fieldId('intake', 'goals')} label="Goals" hint="What the calibration should achieve: power, response, economy, towing, parts to match…" error={err('goals')}>
            {(a11y) => <textarea {...a11y} rows={3} className={cn(controlClasses, 'py-2')} {...register('goals')} />}
          </Field>
        </div>
      </Card>

      <Card title="Special requests" description="Optional. Leave blank what you do not need.">
        <div className="flex flex-col gap-4">
          {request('shiftPoints', 'Shift points')}
          {request('revLimit', 'New rev limit')}
          <div className="grid gap-3 sm:grid-cols-[10rem_1fr]">
            <Field
              id={fieldId('intake', 'specialRequests.speedLimiter.kmh')}
              label="Speed limiter (km/h)"
              hint={units === 'imperial' ? `100 km/h = ${formatSpeed(100, 'imperial', 1)}` : undefined}
              error={err('specialRequests.speedLimiter.kmh')}
            >
              {(a11y) => <Input {...a11y} type="number" inputMode="numeric" {...register('specialRequests.speedLimiter.kmh', asNumber)} />}
            </Field>
            <Field id={fieldId('intake', 'specialRequests.speedLimiter.notes')} label="Speed limiter: notes" error={err('specialRequests.speedLimiter.notes')}>
              {(a11y) => <Input {...a11y} {...register('specialRequests.speedLimiter.notes')} />}
            </Field>
          </div>
          <div className="grid gap-3 sm:grid-cols-[10rem_10rem_1fr]">
            <Field id={fieldId('intake', 'specialRequests.tyreOrGearChange.tyreSize')} label="New tyre size" error={err('specialRequests.tyreOrGearChange.tyreSize')}>
              {(a11y) => <Input {...a11y} {...register('specialRequests.tyreOrGearChange.tyreSize', { setValueAs: (v: unknown) => (typeof v === 'string' && v.trim() ? v : undefined) })} />}
            </Field>
            <Field id={fieldId('intake', 'specialRequests.tyreOrGearChange.finalDrive')} label="New final drive" error={err('specialRequests.tyreOrGearChange.finalDrive')}>
              {(a11y) => <Input {...a11y} type="number" step="0.01" inputMode="decimal" {...register('specialRequests.tyreOrGearChange.finalDrive', asNumber)} />}
            </Field>
            <Field id={fieldId('intake', 'specialRequests.tyreOrGearChange.notes')} label="Tyre or gear change: notes" error={err('specialRequests.tyreOrGearChange.notes')}>
              {(a11y) => <Input {...a11y} {...register('specialRequests.tyreOrGearChange.notes')} />}
            </Field>
          </div>
          {request('launch', 'Launch')}
          {request('idle', 'Idle speed')}
        </div>
      </Card>

      <Card title="Flashing kit" description="No interface or laptop of your own? The shop can rent you a kit for the length of the tune.">
        <label className="flex items-start gap-2 text-sm font-medium text-ink-900">
          <input id={fieldId('intake', 'kitRequest')} type="checkbox" className="mt-0.5 size-4 accent-accent-600" checked={kit.wanted} onChange={(e) => setKit({ ...kit, wanted: e.target.checked })} />
          {isCustomer ? 'I need a flashing kit' : 'The customer needs a flashing kit'}
        </label>
        {kit.wanted && (
          <div className="mt-3 flex flex-col gap-3">
            <div className="grid gap-3 sm:grid-cols-2">
              <Field id={fieldId('intake', 'kitRequest.startDate')} label="Kit needed from" error={err('kitRequest.startDate')}>
                {(a11y) => <Input {...a11y} type="date" value={kit.startDate} onChange={(e) => setKit({ ...kit, startDate: e.target.value })} />}
              </Field>
              <Field id={fieldId('intake', 'kitRequest.dueDate')} label="Kit due back" error={err('kitRequest.dueDate')}>
                {(a11y) => <Input {...a11y} type="date" value={kit.dueDate} onChange={(e) => setKit({ ...kit, dueDate: e.target.value })} />}
              </Field>
            </div>
            <Field id={fieldId('intake', 'kitRequest.notes')} label="Kit notes (optional)" error={err('kitRequest.notes')}>
              {(a11y) => <Input {...a11y} value={kit.notes} onChange={(e) => setKit({ ...kit, notes: e.target.value })} />}
            </Field>
            <p className="text-sm text-ink-700">
              The shop picks the kit and confirms the dates (its shipping days come on top). Before the kit ships you see the price and the deposit, agree to the
              rental terms (late, damaged or lost kits), pay the fee and authorise the deposit hold on your card.
            </p>
          </div>
        )}
      </Card>

      <Card title="Cautions">
        <CautionsList />
        <label className="mt-4 flex items-start gap-2 text-sm font-medium text-ink-900">
          <input id={fieldId('intake', 'cautionsAccepted')} type="checkbox" className="mt-0.5 size-4 accent-accent-600" aria-invalid={err('cautionsAccepted') ? true : undefined} {...register('cautionsAccepted')} />
          {isCustomer ? 'I have read and accept these cautions.' : 'The customer has read and accepts these cautions.'}
        </label>
        {err('cautionsAccepted') && <p className="mt-1 text-sm text-bad">{err('cautionsAccepted')}</p>}
      </Card>

      <div className="flex justify-end gap-2">
        <Button variant="secondary" onClick={onCancel} disabled={create.isPending}>
          Cancel
        </Button>
        <Button type="submit" pending={create.isPending}>
          Open the job
        </Button>
      </div>
    </form>
  );
}
