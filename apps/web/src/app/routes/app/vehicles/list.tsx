import { Link } from 'react-router-dom';
import { PageHeader } from '../../../../components/layout/page-header';
import { Banner } from '../../../../components/ui/banner';
import { EmptyState } from '../../../../components/ui/empty-state';
import { PageSpinner } from '../../../../components/ui/spinner';
import { textLinkClasses } from '../../../../components/ui/text-link';
import { paths } from '../../../../config/paths';
import { useVehicles } from '../../../../features/vehicles/api/get-vehicles';
import { errorMessage } from '../../../../lib/form-errors';
import { RequireScreen } from '../require-screen';

function VehiclesScreen() {
  const vehicles = useVehicles();
  return (
    <>
      <PageHeader title="Vehicles" description="The vehicles you have with the shop, and what their numbers mean." />
      {vehicles.isPending ? (
        <PageSpinner label="Loading vehicles" />
      ) : vehicles.isError ? (
        <Banner tone="bad">{errorMessage(vehicles.error)}</Banner>
      ) : vehicles.data.data.length === 0 ? (
        <EmptyState title="No vehicles yet">A vehicle is added when you open a job for it.</EmptyState>
      ) : (
        <ul className="grid gap-4 sm:grid-cols-2">
          {vehicles.data.data.map((vehicle) => (
            <li key={vehicle.id} className="rounded-card border border-ink-200 bg-white p-4 shadow-xs">
              <Link to={paths.vehicle.getHref(vehicle.id)} className={textLinkClasses}>
                {vehicle.description}
              </Link>
              <p className="mt-1 font-mono text-xs text-ink-600">
                {vehicle.vin} · {vehicle.modelYear}
              </p>
              <p className="mt-1 text-sm text-ink-700">
                {vehicle.spec.engine.family}, {vehicle.spec.tyreSize}
              </p>
            </li>
          ))}
        </ul>
      )}
    </>
  );
}

export function VehiclesRoute() {
  return (
    <RequireScreen screen="vehicles">
      <VehiclesScreen />
    </RequireScreen>
  );
}
