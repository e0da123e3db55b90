import { Link } from 'react-router-dom';
import { PageHeader } from '../../../../components/layout/page-header';
import { Banner } from '../../../../components/ui/banner';
import { buttonClasses } from '../../../../components/ui/button';
import { PageSpinner } from '../../../../components/ui/spinner';
import { paths } from '../../../../config/paths';
import { useCustomers } from '../../../../features/customers/api/get-customers';
import { CustomersTable } from '../../../../features/customers/components/customers-table';
import { errorMessage } from '../../../../lib/form-errors';
import { RequireScreen } from '../require-screen';

function CustomersScreen() {
  const customers = useCustomers();
  return (
    <>
      <PageHeader
        title="Customers"
        description="The people you sell the shop's tunes to. Open a job for one of them, or see where their jobs stand."
        actions={
          <Link to={paths.newJob.getHref()} className={buttonClasses()}>
            Open a job
          </Link>
        }
      />
      {customers.isPending ? (
        <PageSpinner label="Loading customers" />
      ) : customers.isError ? (
        <Banner tone="bad">{errorMessage(customers.error)}</Banner>
      ) : (
        <CustomersTable customers={customers.data.data} />
      )}
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
