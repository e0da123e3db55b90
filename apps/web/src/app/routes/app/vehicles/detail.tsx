import { useAbility } from '@casl/react';
import { useState } from 'react';
import { useParams } from 'react-router-dom';
import { asSubject, type AppAbility } from '@revloop/domain/auth';
import { PageHeader } from '../../../../components/layout/page-header';
import { Banner } from '../../../../components/ui/banner';
import { Button } from '../../../../components/ui/button';
import { Card } from '../../../../components/ui/card';
import { PageSpinner } from '../../../../components/ui/spinner';
import { useSignedInMe } from '../../../../features/auth/api/get-me';
import { useVehicle } from '../../../../features/vehicles/api/get-vehicle';
import { VehicleNumbersCard, VehicleSpecCard } from '../../../../features/vehicles/components/vehicle-details';
import { VehicleEditForm } from '../../../../features/vehicles/components/vehicle-edit-form';
import { VehicleHistory } from '../../../../features/vehicles/components/vehicle-history';
import { errorMessage } from '../../../../lib/form-errors';

export function VehicleRoute() {
  const { vehicleId = '' } = useParams();
  const me = useSignedInMe();
  const ability = useAbility<AppAbility>();
  const vehicle = useVehicle(vehicleId);
  const [editing, setEditing] = useState(false);
  if (vehicle.isPending) return <PageSpinner label="Loading the vehicle" />;
  if (vehicle.isError) return <Banner tone="bad" title="This vehicle could not be opened">{errorMessage(vehicle.error)}</Banner>;
  const data = vehicle.data.data;
  const units = me.user.unitSystem;
  const canEdit = ability.can('update', asSubject('Vehicle', { shopId: me.shop?.id ?? '', ownerUserId: data.owner.id, dealerId: data.dealerId }));
  return (
    <>
      <PageHeader
        title={data.description}
        description={`${data.owner.name} · VIN ${data.vin} · units: ${units === 'imperial' ? 'imperial (mph, in, lb)' : 'metric (km/h, mm, kg)'} — change them in your profile.`}
        actions={
          canEdit && !editing ? (
            <Button variant="secondary" onClick={() => setEditing(true)}>
              Edit vehicle
            </Button>
          ) : undefined
        }
      />
      {editing ? (
        <Card title="Edit the vehicle">
          <VehicleEditForm vehicle={data} units={units} onDone={() => setEditing(false)} />
        </Card>
      ) : (
        <div className="grid gap-6 xl:grid-cols-2">
          <VehicleNumbersCard vehicle={data} units={units} canEdit={canEdit} />
          <VehicleSpecCard vehicle={data} units={units} />
        </div>
      )}
      <div className="mt-6">
        <VehicleHistory vehicleId={data.id} />
      </div>
    </>
  );
}
