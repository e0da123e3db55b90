import { Link } from 'react-router-dom';
import { PageHeader } from '../../../../components/layout/page-header';
import { buttonClasses } from '../../../../components/ui/button';
import { paths } from '../../../../config/paths';
import { CustomersTable } from '../../../../features/customers/components/customers-table';
import { useSignedInMe } from '../../../../features/auth/api/get-me';
import { RequireScreen } from '../require-screen';

function CustomersScreen() {
  const me = useSignedInMe();
  return (
    <>
      <PageHeader
        title="Customers"
        description="The people you sell the shop's tunes to: find one by name, e-mail or VIN and open their page for vehicles, jobs, payments and messages."
        actions={
          <>
            {me.dealer && (
              <Link to={paths.dealers.detail.getHref(me.dealer.id)} className={buttonClasses('secondary')}>
                Balance and statement
              </Link>
            )}
            <Link to={paths.newJob.getHref()} className={buttonClasses()}>
              Open a job
            </Link>
          </>
        }
      />
      <CustomersTable />
    </>
  );
}

export function CustomersRoute() {
  return (
    <RequireScreen screen="customers">
      <CustomersScreen />
    </RequireScreen>
  );
}
