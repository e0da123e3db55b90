import type { Vehicle } from '@revloop/contract';
import { useState } from 'react';
import { Button } from '../../../components/ui/button';
import { Field } from '../../../components/ui/field';
import { Input } from '../../../components/ui/input';
import { errorMessage, fieldErrorsFrom } from '../../../lib/form-errors';
import { useUpdateVehicle } from '../api/update-vehicle';

/** How to measure, shown at intake and on the vehicle page. */
export const MEASURE_HINT =
  'Optional. Mark the tyre and the floor, roll the car straight for one full wheel turn (or several, then divide) at its usual load and tyre pressure, and measure the distance. Leave empty to use the tyre size.';

/** Sets or clears the measured rolling circumference; the rest of the vehicle is sent back as it is. */
export function RollingCircumferenceForm({ vehicle, onDone }: { vehicle: Vehicle; onDone: () => void }) {
  const measured = vehicle.spec.rollingCircumferenceMm ?? null;
  const [text, setText] = useState(measured === null ? '' : String(measured));
  const update = useUpdateVehicle();
  const error = update.error ? (fieldErrorsFrom(update.error).rollingCircumferenceMm ?? errorMessage(update.error)) : undefined;
  const save = (rollingCircumferenceMm: number | null) =>
    update.mutate({ vehicleId: vehicle.id, vehicle: { ...vehicle.spec, rollingCircumferenceMm } }, { onSuccess: onDone });
  return (
    <form
      noValidate
      className="flex flex-col gap-3 rounded-lg border border-ink-200 bg-ink-50 p-3"
      onSubmit={(event) => {
        event.preventDefault();
        save(text.trim() === '' ? null : Number(text));
      }}
    >
      <Field id="vehicle-rollingCircumferenceMm" label="Measured rolling circumference (mm)" hint={MEASURE_HINT} error={error}>
        {(a11y) => <Input {...a11y} type="number" inputMode="decimal" step="1" className="sm:max-w-48" value={text} onChange={(event) => setText(event.target.value)} />}
      </Field>
      <div className="flex flex-wrap gap-2">
        <Button type="submit" pending={update.isPending}>
          Save
        </Button>
        {measured !== null && (
          <Button variant="secondary" onClick={() => save(null)} disabled={update.isPending}>
            Use the tyre size
          </Button>
        )}
        <Button variant="ghost" onClick={onDone} disabled={update.isPending}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
