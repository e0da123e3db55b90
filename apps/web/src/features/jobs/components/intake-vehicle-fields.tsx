import { useEffect, useState } from 'react';
import { Controller, useWatch, type UseFormReturn } from 'react-hook-form';
import type { UnitSystem } from '@revloop/contract';
import {
  ASPIRATIONS,
  ASPIRATION_LABELS,
  COMMON_MODIFICATIONS,
  FUEL_TYPES,
  OCTANE_SCALES,
  TRANSMISSION_LABELS,
  TRANSMISSION_TYPES,
  VIN_REGION_LABELS,
  checkVin,
  parseTyreSize,
  stoichAfr,
  vehicleFuelSpec,
  type TyreSize,
  type VehicleFormValues,
} from '@revloop/domain/vehicles';
import type { JobIntakeFormValues, JobIntakeInput } from '@revloop/domain/jobs';
import { isDomainError } from '@revloop/domain';
import { Field } from '../../../components/ui/field';
import { Input, controlClasses } from '../../../components/ui/input';
import { Select } from '../../../components/ui/select';
import { cn } from '../../../lib/cn';
import { MEASURE_HINT } from '../../vehicles/components/rolling-circumference-form';
import { circumferenceDeviation, formatLength, formatMass } from '../../vehicles/components/vehicle-units';
import { fieldId } from './intake-errors';

type IntakeForm = UseFormReturn<JobIntakeFormValues, unknown, JobIntakeInput>;

/** Number inputs: an empty box is "not given" (so the schema says "Fill in this field"), anything else a number. */
export const asNumber = { setValueAs: (value: unknown) => (value === '' || value === null || value === undefined ? undefined : Number(value)) };

const FUEL_LABELS: Record<(typeof FUEL_TYPES)[number], string> = { gasoline: 'Gasoline (petrol)', diesel: 'Diesel', methanol: 'Methanol' };

/** A fresh vehicle for the form: text empty, numbers unset, so every required field asks to be filled. */
export const NEW_VEHICLE = {
  vin: '',
  vinCheckDigitOverride: false,
  description: '',
  engine: { aspiration: 'naturally_aspirated', family: '' },
  transmission: { type: 'manual', gearRatios: [] },
  tyreSize: '',
  fuel: { type: 'gasoline', octane: null, ethanolPct: 0 },
  modifications: { parts: [], notes: '' },
} as unknown as VehicleFormValues;

const p = (path: string) => `vehicle.vehicle.${path}`;

/** Gear ratios typed as one line ("3.36 2.09 1.47 …"), parsed as the user types. */
function GearRatiosInput({ form }: { form: IntakeForm }) {
  const id = fieldId('intake', p('transmission.gearRatios'));
  return (
    <Controller
      control={form.control}
      name="vehicle.vehicle.transmission.gearRatios"
      render={({ field, fieldState }) => {
        const nested = fieldState.error as unknown as Record<string, { message?: string } | undefined> | undefined;
        const firstGearError = Object.entries(nested ?? {}).find(([key]) => /^\d+$/.test(key))?.[1]?.message;
        return (
          <GearText
            id={id}
            initial={(field.value ?? []).join(' ')}
            onChange={field.onChange}
            onBlur={field.onBlur}
            error={fieldState.error?.message ?? firstGearError}
          />
        );
      }}
    />
  );
}

function GearText({ id, initial, onChange, onBlur, error }: { id: string; initial: string; onChange: (ratios: number[]) => void; onBlur: () => void; error: string | undefined }) {
  const [text, setText] = useState(initial);
  return (
    <Field id={id} label="Gear ratios, first gear first" hint="Separate with spaces or commas, e.g. 3.36 2.09 1.47 1.10 0.87 0.71. Leave empty for a CVT." error={error}>
      {(a11y) => (
        <Input
          {...a11y}
          inputMode="decimal"
          value={text}
          onBlur={onBlur}
          onChange={(event) => {
            setText(event.target.value);
            onChange(event.target.value.split(/[\s,;]+/).filter(Boolean).map(Number));
          }}
        />
      )}
    </Field>
  );
}

/** Pump octane: a scale and a rating, or nothing when the rating is left empty. */
function OctaneInput({ form }: { form: IntakeForm }) {
  return (
    <Controller
      control={form.control}
      name="vehicle.vehicle.fuel.octane"
      render={({ field, fieldState }) => <OctaneFields value={field.value ?? null} onChange={field.onChange} error={fieldState.error?.message ?? (fieldState.error as { rating?: { message?: string } } | undefined)?.rating?.message} />}
    />
  );
}

function OctaneFields({ value, onChange, error }: { value: { scale: 'RON' | 'AKI'; rating: number } | null; onChange: (value: { scale: 'RON' | 'AKI'; rating: number } | null) => void; error: string | undefined }) {
  const [scale, setScale] = useState<'RON' | 'AKI'>(value?.scale ?? 'RON');
  const [rating, setRating] = useState(value ? String(value.rating) : '');
  const emit = (nextScale: 'RON' | 'AKI', nextRating: string) => onChange(nextRating.trim() === '' ? null : { scale: nextScale, rating: Number(nextRating) });
  return (
    <div className="grid grid-cols-2 gap-3">
      <Field id={fieldId('intake', p('fuel.octane.rating'))} label="Pump octane" hint="As printed on the pump; leave empty if unknown." error={error}>
        {(a11y) => (
          <Input
            {...a11y}
            inputMode="decimal"
            value={rating}
            onChange={(event) => {
              setRating(event.target.value);
              emit(scale, event.target.value);
            }}
          />
        )}
      </Field>
      <Field id={fieldId('intake', p('fuel.octane.scale'))} label="Octane scale" hint="RON in most countries, AKI ((R+M)/2) in North America.">
        {(a11y) => (
          <Select
            {...a11y}
            value={scale}
            onChange={(event) => {
              const next = event.target.value as 'RON' | 'AKI';
              setScale(next);
              emit(next, rating);
            }}
            options={OCTANE_SCALES.map((s) => ({ value: s, label: s }))}
          />
        )}
      </Field>
    </div>
  );
}

/**
 * Live VIN feedback: a malformed VIN is an error; a North American VIN's wrong check digit a warning the user may
 * confirm; a VIN from elsewhere a note that its model year comes from the user.
 */
function VinFeedback({ form }: { form: IntakeForm }) {
  const vin = useWatch({ control: form.control, name: 'vehicle.vehicle.vin' }) ?? '';
  const check = vin.trim() ? checkVin(vin) : null;
  const modelYear = check?.modelYear ?? null;
  useEffect(() => {
    // The model year follows the VIN until the user types their own.
    if (modelYear && !form.getFieldState('vehicle.vehicle.modelYear').isDirty) form.setValue('vehicle.vehicle.modelYear', modelYear);
  }, [modelYear, form]);
  if (!check) return null;
  if (check.vin.length < 17 && check.errors.length === 1) {
    return <p className="text-xs text-ink-600">{check.vin.length} of 17 characters.</p>;
  }
  if (!check.wellFormed) {
    return (
      <ul className="list-disc pl-5 text-sm text-bad" aria-live="polite">
        {check.errors.map((message) => (
          <li key={message}>{message}</li>
        ))}
      </ul>
    );
  }
  if (!check.northAmerican) {
    return (
      <p className="rounded-lg border border-warn/30 bg-warn-soft p-3 text-sm text-warn" aria-live="polite">
        <span aria-hidden="true">⚠ </span>
        {check.region ? `A VIN from ${VIN_REGION_LABELS[check.region]}. ` : ''}
        {check.warnings.join(' ')}
      </p>
    );
  }
  if (!check.checkDigitOk) {
    return (
      <div className="rounded-lg border border-warn/30 bg-warn-soft p-3 text-sm text-warn" aria-live="polite">
        <p>
          <span aria-hidden="true">⚠ </span>
          {check.warnings.join(' ')}
        </p>
        <label className="mt-2 flex items-center gap-2 font-medium">
          <input type="checkbox" className="size-4 accent-accent-600" {...form.register('vehicle.vehicle.vinCheckDigitOverride')} />
          Keep this VIN as entered
        </label>
      </div>
    );
  }
  return (
    <p className="text-sm text-ok" aria-live="polite">
      <span aria-hidden="true">✓ </span>Check digit matches{check.modelYear ? ` · model year ${check.modelYear}` : ''}.
    </p>
  );
}

/** The parsed tyre, or the reason it cannot be read yet. */
function readTyre(code: string): TyreSize | string {
  try {
    return parseTyreSize(code);
  } catch (error) {
    return isDomainError(error) ? error.message : 'Not a tyre size yet.';
  }
}

function readStoich(type: VehicleFormValues['fuel']['type'], ethanolPct: unknown): number | null {
  try {
    return stoichAfr(vehicleFuelSpec({ fuel: { type: type ?? 'gasoline', ethanolPct: Number(ethanolPct ?? 0), octane: null } }));
  } catch {
    return null;
  }
}

function TyreFeedback({ form, units }: { form: IntakeForm; units: UnitSystem }) {
  const code = useWatch({ control: form.control, name: 'vehicle.vehicle.tyreSize' }) ?? '';
  if (!code.trim()) return null;
  const tyre = readTyre(code);
  if (typeof tyre === 'string') return <p className="text-xs text-warn">{tyre}</p>;
  return (
    <p className="text-xs text-ink-700" aria-live="polite">
      {tyre.code}: diameter {formatLength(tyre.diameterMm, units)}, circumference {formatLength(tyre.circumferenceMm, units)}.
    </p>
  );
}

/** The measured rolling circumference against the tyre size, so a slip of the tape shows before submitting. */
function CircumferenceFeedback({ form, units }: { form: IntakeForm; units: UnitSystem }) {
  const measured = useWatch({ control: form.control, name: 'vehicle.vehicle.rollingCircumferenceMm' });
  const code = useWatch({ control: form.control, name: 'vehicle.vehicle.tyreSize' }) ?? '';
  if (typeof measured !== 'number' || !Number.isFinite(measured) || measured <= 0) return null;
  const tyre = readTyre(code);
  return (
    <p className="text-xs text-ink-700" aria-live="polite">
      {units === 'imperial' && `≈ ${formatLength(measured, 'imperial')}. `}
      {typeof tyre === 'string' ? 'Speeds will use this instead of the tyre size.' : `${circumferenceDeviation(measured, tyre.circumferenceMm)} the ${tyre.code}'s ${formatLength(tyre.circumferenceMm, 'metric')}; speeds will use it.`}
    </p>
  );
}

function StoichFeedback({ form }: { form: IntakeForm }) {
  const fuel = useWatch({ control: form.control, name: 'vehicle.vehicle.fuel' });
  const afr = readStoich(fuel?.type, fuel?.ethanolPct);
  if (afr === null) return null;
  return (
    <p className="text-sm text-ink-800" aria-live="polite">
      Stoichiometric air-fuel ratio: <strong>{afr.toFixed(2)} : 1</strong> (by mass; λ = 1 at this ratio).
    </p>
  );
}

function MassHint({ form, units }: { form: IntakeForm; units: UnitSystem }) {
  const kg = useWatch({ control: form.control, name: 'vehicle.vehicle.curbMassKg' });
  if (units !== 'imperial' || typeof kg !== 'number' || !Number.isFinite(kg)) return null;
  return <p className="text-xs text-ink-600">≈ {formatMass(kg, 'imperial')}</p>;
}

type Errors = Record<string, unknown> | undefined;
const messageAt = (errors: Errors, path: string): string | undefined => {
  let node: unknown = errors;
  for (const key of path.split('.')) node = (node as Record<string, unknown> | undefined)?.[key];
  const message = (node as { message?: unknown } | undefined)?.message;
  return typeof message === 'string' ? message : undefined;
};

/** The full vehicle form inside the intake: identity, engine, drivetrain, tyres, mass, fuel and parts. */
export function IntakeVehicleFields({ form, units }: { form: IntakeForm; units: UnitSystem }) {
  const errors = (form.formState.errors.vehicle as Errors)?.vehicle as Errors;
  const err = (path: string) => messageAt(errors, path);
  const id = (path: string) => fieldId('intake', p(path));
  const fuelType = useWatch({ control: form.control, name: 'vehicle.vehicle.fuel.type' });
  const { register } = form;

  return (
    <div className="flex flex-col gap-5">
      <div className="grid gap-4 sm:grid-cols-[2fr_1fr]">
        <div className="flex flex-col gap-1.5">
          <Field id={id('vin')} label="VIN" hint="17 characters. For North American VINs (first character 1–5) the check digit (position 9) and model year (position 10) are read as you type." error={err('vin')}>
            {(a11y) => <Input {...a11y} autoComplete="off" spellCheck={false} className="font-mono uppercase" {...register('vehicle.vehicle.vin')} />}
          </Field>
          <VinFeedback form={form} />
        </div>
        <Field id={id('modelYear')} label="Model year" hint="Filled in from a North American VIN; otherwise enter it." error={err('modelYear')}>
          {(a11y) => <Input {...a11y} type="number" inputMode="numeric" {...register('vehicle.vehicle.modelYear', asNumber)} />}
        </Field>
      </div>
      <Field id={id('description')} label="Make, model and trim" hint="In your own words, e.g. compact hatchback, 2.0 turbo, 6-speed manual." error={err('description')}>
        {(a11y) => <Input {...a11y} {...register('vehicle.vehicle.description')} />}
      </Field>

      <fieldset className="grid gap-4 sm:grid-cols-4">
        <legend className="mb-2 text-sm font-semibold text-ink-900">Engine</legend>
        <Field id={id('engine.displacementL')} label="Displacement (L)" error={err('engine.displacementL')}>
          {(a11y) => <Input {...a11y} type="number" step="0.1" inputMode="decimal" {...register('vehicle.vehicle.engine.displacementL', asNumber)} />}
        </Field>
        <Field id={id('engine.cylinders')} label="Cylinders" error={err('engine.cylinders')}>
          {(a11y) => <Input {...a11y} type="number" inputMode="numeric" {...register('vehicle.vehicle.engine.cylinders', asNumber)} />}
        </Field>
        <Field id={id('engine.aspiration')} label="Aspiration" error={err('engine.aspiration')}>
          {(a11y) => <Select {...a11y} options={ASPIRATIONS.map((a) => ({ value: a, label: ASPIRATION_LABELS[a] }))} {...register('vehicle.vehicle.engine.aspiration')} />}
        </Field>
        <Field id={id('engine.family')} label="Engine family" hint='e.g. "2.0 turbo I4" or "V8"' error={err('engine.family')}>
          {(a11y) => <Input {...a11y} {...register('vehicle.vehicle.engine.family')} />}
        </Field>
        <Field id={id('revLimitRpm')} label="Current rev limit (rpm)" error={err('revLimitRpm')}>
          {(a11y) => <Input {...a11y} type="number" inputMode="numeric" {...register('vehicle.vehicle.revLimitRpm', asNumber)} />}
        </Field>
      </fieldset>

      <fieldset className="grid gap-4 sm:grid-cols-[1fr_2fr_1fr]">
        <legend className="mb-2 text-sm font-semibold text-ink-900">Drivetrain and tyres</legend>
        <Field id={id('transmission.type')} label="Transmission" error={err('transmission.type')}>
          {(a11y) => <Select {...a11y} options={TRANSMISSION_TYPES.map((t) => ({ value: t, label: TRANSMISSION_LABELS[t] }))} {...register('vehicle.vehicle.transmission.type')} />}
        </Field>
        <GearRatiosInput form={form} />
        <Field id={id('finalDrive')} label="Final drive ratio" error={err('finalDrive')}>
          {(a11y) => <Input {...a11y} type="number" step="0.01" inputMode="decimal" {...register('vehicle.vehicle.finalDrive', asNumber)} />}
        </Field>
        <div className="flex flex-col gap-1.5">
          <Field id={id('tyreSize')} label="Tyre size" hint="Metric code as on the sidewall, e.g. 245/40R20, 225/45R17 94W or 215/65R16C." error={err('tyreSize')}>
            {(a11y) => <Input {...a11y} autoComplete="off" {...register('vehicle.vehicle.tyreSize')} />}
          </Field>
          <TyreFeedback form={form} units={units} />
        </div>
        <div className="flex flex-col gap-1.5">
          <Field id={id('rollingCircumferenceMm')} label="Measured rolling circumference (mm)" hint={MEASURE_HINT} error={err('rollingCircumferenceMm')}>
            {(a11y) => <Input {...a11y} type="number" inputMode="decimal" {...register('vehicle.vehicle.rollingCircumferenceMm', asNumber)} />}
          </Field>
          <CircumferenceFeedback form={form} units={units} />
        </div>
        <div className="flex flex-col gap-1.5">
          <Field id={id('curbMassKg')} label="Curb mass (kg)" error={err('curbMassKg')}>
            {(a11y) => <Input {...a11y} type="number" inputMode="numeric" {...register('vehicle.vehicle.curbMassKg', asNumber)} />}
          </Field>
          <MassHint form={form} units={units} />
        </div>
      </fieldset>

      <fieldset className="grid gap-4 sm:grid-cols-[1fr_2fr_1fr]">
        <legend className="mb-2 text-sm font-semibold text-ink-900">Fuel</legend>
        <Field id={id('fuel.type')} label="Fuel" error={err('fuel.type')}>
          {(a11y) => <Select {...a11y} options={FUEL_TYPES.map((f) => ({ value: f, label: FUEL_LABELS[f] }))} {...register('vehicle.vehicle.fuel.type')} />}
        </Field>
        <OctaneInput form={form} />
        <Field id={id('fuel.ethanolPct')} label="Ethanol (% by volume)" hint="E10 → 10, E85 → 85." error={err('fuel.ethanolPct')}>
          {(a11y) => <Input {...a11y} type="number" inputMode="decimal" disabled={fuelType !== 'gasoline'} {...register('vehicle.vehicle.fuel.ethanolPct', asNumber)} />}
        </Field>
        <div className="sm:col-span-3">
          <StoichFeedback form={form} />
        </div>
      </fieldset>

      <fieldset>
        <legend className="mb-2 text-sm font-semibold text-ink-900">Modifications</legend>
        <div className="grid gap-x-4 gap-y-2 sm:grid-cols-3">
          {COMMON_MODIFICATIONS.map((mod) => (
            <label key={mod.id} className="flex items-center gap-2 text-sm text-ink-800">
              <input type="checkbox" value={mod.id} className="size-4 accent-accent-600" {...register('vehicle.vehicle.modifications.parts')} />
              {mod.label}
            </label>
          ))}
        </div>
        <div className="mt-3">
          <Field id={id('modifications.notes')} label="Other parts and notes" error={err('modifications.notes')}>
            {(a11y) => <textarea {...a11y} rows={2} className={cn(controlClasses, 'py-2')} {...register('vehicle.vehicle.modifications.notes')} />}
          </Field>
        </div>
      </fieldset>
    </div>
  );
}
