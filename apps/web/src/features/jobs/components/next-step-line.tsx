import type { Job } from '@revloop/contract';
import { Button } from '../../../components/ui/button';
import { errorMessage } from '../../../lib/form-errors';
import { useStartCheckout } from '../../billing/api/start-checkout';

/** The job's own Checkout, offered beside a next step that says to pay first. */
function PayButton({ job, label }: { job: Job; label: string }) {
  const checkout = useStartCheckout();
  return (
    <span className="flex flex-col gap-1">
      <Button size="sm" onClick={() => checkout.mutate({ purpose: 'job', jobId: job.id })} pending={checkout.isPending || checkout.isSuccess}>
        {label}
      </Button>
      {checkout.isError && (
        <span role="alert" className="text-xs text-bad">
          {errorMessage(checkout.error)}
        </span>
      )}
    </span>
  );
}

/**
 * The next step in plain words (the domain's `nextStep`, sent by the API) and the move the API offers beside it: the
 * job's checkout while the customer's sent revision waits, locked until paid.
 */
export function NextStepLine({ job, heading, payLabel }: { job: Job; heading: string; payLabel: string }) {
  return (
    <div className="flex flex-wrap items-center justify-between gap-2 rounded-lg bg-accent-50 px-3 py-2 text-sm text-accent-900">
      <p className="min-w-0">
        <span className="font-medium">{heading} </span>
        {job.nextStep}
      </p>
      {job.nextStepAction === 'pay' && <PayButton job={job} label={payLabel} />}
    </div>
  );
}
