import { useState } from 'react';
import type { UnitSystem, Vehicle } from '@revloop/contract';
import {
  ASPIRATION_LABELS,
  COMMON_MODIFICATIONS,
  TRANSMISSION_LABELS,
  VIN_REGION_LABELS,
  fuelLabel,
  vehicleFuelSpec,
} from '@revloop/domain/vehicles';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { RollingCircumferenceForm } from './rolling-circumference-form';
import { circumferenceDeviation, formatLength, formatMass, formatSpeed, speedUnit } from './vehicle-units';
import { ScrollRegion } from '../../../components/ui/scroll-region';

/** "gasoline" mid-sentence, but a blend keeps its capital: "E85". */
const fuelName = (label: string) => (/^E\d/.test(label) ? label : label.toLowerCase());

const MOD_LABELS = new Map<string, string>(COMMON_MODIFICATIONS.map((m) => [m.id, m.label]));

/** The vehicle as entered at intake. */
export function VehicleSpecCard({ vehicle, units }: { vehicle: Vehicle; units: UnitSystem }) {
  const { spec } = vehicle;
  const octane = spec.fuel.octane ? `${spec.fuel.octane.rating} ${spec.fuel.octane.scale}` : 'not given';
  return (
    <Card title="Vehicle">
      <dl className="grid gap-x-6 gap-y-2 text-sm sm:grid-cols-[auto_1fr]">
        <dt className="text-ink-600">VIN</dt>
        <dd className="font-mono text-ink-900">
          {vehicle.vin}
          {spec.vinCheckDigitOverride && <span className="ml-2 font-sans text-xs text-warn">check digit confirmed by hand</span>}
          {vehicle.vinRegion && vehicle.vinRegion !== 'north_america' && (
            <span className="block font-sans text-xs text-ink-600">From {VIN_REGION_LABELS[vehicle.vinRegion]}: no check digit or model-year code is read from it.</span>
          )}
        </dd>
        <dt className="text-ink-600">Model year</dt>
        <dd className="text-ink-900">{vehicle.modelYear}</dd>
        <dt className="text-ink-600">Owner</dt>
        <dd className="text-ink-900">{vehicle.owner.name}</dd>
        <dt className="text-ink-600">Engine</dt>
        <dd className="text-ink-900">
          {spec.engine.displacementL.toFixed(1)} L, {spec.engine.cylinders} cylinders, {ASPIRATION_LABELS[spec.engine.aspiration].toLowerCase()} ({spec.engine.family}); rev limit {spec.revLimitRpm} rpm
        </dd>
        <dt className="text-ink-600">Transmission</dt>
        <dd className="text-ink-900">
          {TRANSMISSION_LABELS[spec.transmission.type]}
          {spec.transmission.gearRatios.length > 0 && `, ${spec.transmission.gearRatios.length} gears (${spec.transmission.gearRatios.map((r) => r.toFixed(2)).join(' · ')})`}; final drive {spec.finalDrive.toFixed(2)}
        </dd>
        <dt className="text-ink-600">Tyres</dt>
        <dd className="text-ink-900">
          {spec.tyreSize}
          {spec.rollingCircumferenceMm != null && `; measured rolling circumference ${formatLength(spec.rollingCircumferenceMm, units)}`}
        </dd>
        <dt className="text-ink-600">Curb mass</dt>
        <dd className="text-ink-900">{formatMass(spec.curbMassKg, units)}</dd>
        <dt className="text-ink-600">Fuel</dt>
        <dd className="text-ink-900">
          {fuelLabel(vehicleFuelSpec(spec))}, pump octane {octane}
        </dd>
        <dt className="text-ink-600">Modifications</dt>
        <dd className="text-ink-900">
          {spec.modifications.parts.length === 0 ? 'None listed' : spec.modifications.parts.map((id) => MOD_LABELS.get(id) ?? id).join(', ')}
          {spec.modifications.notes && <span className="block text-ink-700">{spec.modifications.notes}</span>}
        </dd>
      </dl>
    </Card>
  );
}

/** What the numbers mean: road speed in each gear, the rolling tyre, and the fuel's stoichiometric ratio. */
export function VehicleNumbersCard({ vehicle, units, canEdit }: { vehicle: Vehicle; units: UnitSystem; canEdit: boolean }) {
  const { derived, spec } = vehicle;
  const [editing, setEditing] = useState(false);
  if (!derived) return <Card title="What the numbers mean">The tyre size or gearing could not be read, so no speeds are shown.</Card>;
  const measured = derived.circumferenceSource === 'measured';
  return (
    <Card
      title="What the numbers mean"
      description={`From the gear ratios, final drive ${spec.finalDrive.toFixed(2)} and ${measured ? 'the measured rolling circumference' : `the ${spec.tyreSize} tyre`}.`}
      actions={
        canEdit && !editing ? (
          <Button size="sm" variant="secondary" onClick={() => setEditing(true)}>
            {measured ? 'Change measured circumference' : 'Enter measured circumference'}
          </Button>
        ) : undefined
      }
    >
      <div className="flex flex-col gap-4 text-sm">
        <dl className="grid gap-x-6 gap-y-2 sm:grid-cols-[auto_1fr]">
          <dt className="text-ink-600">Tyre diameter</dt>
          <dd className="text-ink-900">{formatLength(derived.tyreDiameterMm, units)}</dd>
          <dt className="text-ink-600">Tyre circumference</dt>
          <dd className="text-ink-900">{formatLength(derived.tyreCircumferenceMm, units)} — from the size, unloaded</dd>
          <dt className="text-ink-600">Used for speeds</dt>
          <dd className="text-ink-900">
            {measured ? (
              <>
                <strong>{formatLength(derived.rollingCircumferenceMm, units)}, measured</strong> — {circumferenceDeviation(derived.rollingCircumferenceMm, derived.tyreCircumferenceMm)} the size's
              </>
            ) : (
              <>
                <strong>{formatLength(derived.rollingCircumferenceMm, units)}, from the tyre size</strong> — a loaded tyre rolls about 3 % shorter, so a measured circumference gives truer speeds
              </>
            )}
          </dd>
          <dt className="text-ink-600">Stoichiometric AFR</dt>
          <dd className="text-ink-900">
            {derived.stoichAfr.toFixed(2)} : 1 for {fuelName(fuelLabel(vehicleFuelSpec(spec)))} — the air mass that burns one unit of fuel completely (λ = 1)
          </dd>
        </dl>
        {editing && <RollingCircumferenceForm vehicle={vehicle} onDone={() => setEditing(false)} />}
        {derived.speeds.length === 0 ? (
          <p className="text-ink-600">A CVT has no fixed gears, so there is no speed per gear.</p>
        ) : (
          <ScrollRegion label="Road speed per gear" className="rounded-lg border border-ink-200">
            <table className="w-full border-collapse text-left text-sm">
              <caption className="sr-only">Road speed per gear</caption>
              <thead className="bg-ink-50 text-xs tracking-wide text-ink-600 uppercase">
                <tr>
                  <th scope="col" className="px-3 py-2 font-medium">Gear</th>
                  <th scope="col" className="px-3 py-2 font-medium">Ratio</th>
                  <th scope="col" className="px-3 py-2 font-medium">{speedUnit(units)} per 1000 rpm</th>
                  <th scope="col" className="px-3 py-2 font-medium">At the rev limit ({spec.revLimitRpm} rpm)</th>
                </tr>
              </thead>
              <tbody>
                {derived.speeds.map((row) => (
                  <tr key={row.gear} className="border-t border-ink-100">
                    <th scope="row" className="px-3 py-2 font-medium text-ink-900">{row.gear}</th>
                    <td className="px-3 py-2 text-ink-800">{row.ratio.toFixed(2)}</td>
                    <td className="px-3 py-2 text-ink-800">{formatSpeed(row.kmhPer1000Rpm, units)}</td>
                    <td className="px-3 py-2 text-ink-800">{formatSpeed(row.kmhAtRevLimit, units, 0)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </ScrollRegion>
        )}
        <p className="text-xs text-ink-600">Speed = rpm × rolling circumference ÷ (gear ratio × final drive). The datalog analysis uses the same circumference to tell the gear. Tyre wear and slip change it by a few percent; at the rev limit in the top gears it is the gearing's limit, not a speed the car reaches.</p>
      </div>
    </Card>
  );
}
