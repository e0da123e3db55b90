import { useAbility } from '@casl/react';
import { useParams } from 'react-router-dom';
import { asSubject, type AppAbility } from '@revloop/domain/auth';
import { PageHeader } from '../../../../components/layout/page-header';
import { Banner } from '../../../../components/ui/banner';
import { PageSpinner } from '../../../../components/ui/spinner';
import { useSignedInMe } from '../../../../features/auth/api/get-me';
import { useVehicle } from '../../../../features/vehicles/api/get-vehicle';
import { VehicleNumbersCard, VehicleSpecCard } from '../../../../features/vehicles/components/vehicle-details';
import { errorMessage } from '../../../../lib/form-errors';

export function VehicleRoute() {
  const { vehicleId = '' } = useParams();
  const me = useSignedInMe();
  const ability = useAbility<AppAbility>();
  const vehicle = useVehicle(vehicleId);
  if (vehicle.isPending) return <PageSpinner label="Loading the vehicle" />;
  if (vehicle.isError) return <Banner tone="bad" title="This vehicle could not be opened">{errorMessage(vehicle.error)}</Banner>;
  const data = vehicle.data.data;
  const units = me.user.unitSystem;
  const canEdit = ability.can('update', asSubject('Vehicle', { shopId: me.shop?.id ?? '', ownerUserId: data.owner.id, dealerId: data.dealerId }));
  return (
    <>
      <PageHeader
        title={data.description}
        description={`Units: ${units === 'imperial' ? 'imperial (mph, in, lb)' : 'metric (km/h, mm, kg)'} — change them in your profile.`}
      />
      <div className="grid gap-6 xl:grid-cols-2">
        <VehicleNumbersCard vehicle={data} units={units} canEdit={canEdit} />
        <VehicleSpecCard vehicle={data} units={units} />
      </div>
    </>
  );
}
