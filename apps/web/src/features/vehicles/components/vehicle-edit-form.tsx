import { useForm, type FieldPath } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import type { JobIntakeFormValues, JobIntakeInput } from '@revloop/domain/jobs';
import { vehicleInputSchema } from '@revloop/domain/vehicles';
import { Banner } from '../../../components/ui/banner';
import { Button } from '../../../components/ui/button';
import { FormErrorSummary } from '../../../components/ui/form-error-summary';
import { errorMessage, fieldErrorsFrom } from '../../../lib/form-errors';
import { plainErrors } from '../../../lib/form-messages';
import type { UnitSystem, Vehicle } from '@revloop/contract';
import { fieldId, flattenFieldErrors } from '../../jobs/components/intake-errors';
import { IntakeVehicleFields } from '../../jobs/components/intake-vehicle-fields';
import { useUpdateVehicle } from '../api/update-vehicle';

// The intake's vehicle fields and schema, so a vehicle is entered and edited the same way and checked by one rule.
const editSchema = z.object({ vehicle: z.object({ kind: z.literal('new'), vehicle: vehicleInputSchema }) });

/** The owner corrects a vehicle's details with the intake's own fields; saved with PUT /api/vehicles/:id. */
export function VehicleEditForm({ vehicle, units, onDone }: { vehicle: Vehicle; units: UnitSystem; onDone: () => void }) {
  const form = useForm<JobIntakeFormValues, unknown, JobIntakeInput>({
    resolver: zodResolver(editSchema, plainErrors) as never,
    shouldFocusError: false,
    defaultValues: { vehicle: { kind: 'new', vehicle: vehicle.spec } } as unknown as JobIntakeFormValues,
  });
  const update = useUpdateVehicle();
  const { errors, isSubmitted } = form.formState;
  const items = [
    ...(isSubmitted ? flattenFieldErrors(errors) : []).map((e) => ({ fieldId: fieldId('intake', e.path), message: e.message })),
    ...(update.error ? [{ message: errorMessage(update.error) }] : []),
  ];
  const onSubmit = form.handleSubmit((values) => {
    if (values.vehicle.kind !== 'new') return;
    update.mutate(
      { vehicleId: vehicle.id, vehicle: values.vehicle.vehicle },
      {
        onSuccess: onDone,
        onError: (error) => {
          for (const [path, message] of Object.entries(fieldErrorsFrom(error))) form.setError(`vehicle.vehicle.${path}` as FieldPath<JobIntakeFormValues>, { message });
        },
      },
    );
  });
  return (
    <form noValidate onSubmit={onSubmit} aria-label="Edit the vehicle" className="flex flex-col gap-5">
      {items.length > 0 && <FormErrorSummary items={items} />}
      <Banner>Changes apply to the vehicle's next analyses; reports already made keep the numbers they used.</Banner>
      <IntakeVehicleFields form={form} units={units} />
      <div className="flex flex-wrap gap-3">
        <Button type="submit" pending={update.isPending}>
          Save vehicle
        </Button>
        <Button variant="secondary" onClick={onDone}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
