import { useParams } from 'react-router-dom';
import { PageHeader } from '../../../../components/layout/page-header';
import { Banner } from '../../../../components/ui/banner';
import { PageSpinner } from '../../../../components/ui/spinner';
import { TextLink } from '../../../../components/ui/text-link';
import { paths } from '../../../../config/paths';
import { useCustomer } from '../../../../features/customers/api/get-customer';
import {
  CustomerContactCard,
  CustomerJobsCard,
  CustomerMessagesCard,
  CustomerPaymentsCard,
  CustomerVehiclesCard,
} from '../../../../features/customers/components/customer-detail';
import { isApiError } from '../../../../lib/api-client';
import { errorMessage } from '../../../../lib/form-errors';
import { RequireScreen } from '../require-screen';

function CustomerScreen({ customerId }: { customerId: string }) {
  const customer = useCustomer(customerId);
  const back = <TextLink to={paths.customers.getHref()}>← All customers</TextLink>;
  if (customer.isPending) return <PageSpinner label="Loading the customer" />;
  if (customer.isError) {
    const missing = isApiError(customer.error) && customer.error.status === 404;
    return (
      <div className="flex flex-col gap-4">
        {back}
        <Banner tone={missing ? 'warn' : 'bad'} title={missing ? 'Customer not found' : 'The customer could not be loaded'}>
          {missing ? 'There is no customer with this address that you can see.' : errorMessage(customer.error)}
        </Banner>
      </div>
    );
  }
  const data = customer.data.data;
  return (
    <>
      <div className="mb-3 text-sm">{back}</div>
      <PageHeader title={data.name} description={data.status === 'active' ? 'Customer' : 'Customer (deactivated)'} />
      <div className="grid gap-6 lg:grid-cols-[minmax(0,20rem)_minmax(0,1fr)]">
        <div className="flex flex-col gap-6">
          <CustomerContactCard customer={data} />
          <CustomerVehiclesCard customer={data} />
        </div>
        <div className="flex min-w-0 flex-col gap-6">
          <CustomerJobsCard customer={data} />
          <CustomerPaymentsCard customer={data} />
          <CustomerMessagesCard customer={data} />
        </div>
      </div>
    </>
  );
}

export function CustomerRoute() {
  const { customerId = '' } = useParams();
  return (
    <RequireScreen screen="customers">
      <CustomerScreen customerId={customerId} />
    </RequireScreen>
  );
}
