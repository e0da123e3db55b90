import { useState } from 'react';
import type { JobPayment, JobPayments } from '@revloop/contract';
import { formatMoney, minorToDecimalString, parseMoneyInput } from '@revloop/domain/billing';
import { Badge } from '../../../components/ui/badge';
import { Banner } from '../../../components/ui/banner';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { Dialog } from '../../../components/ui/dialog';
import { Field } from '../../../components/ui/field';
import { Input } from '../../../components/ui/input';
import { Spinner } from '../../../components/ui/spinner';
import { errorMessage } from '../../../lib/form-errors';
import { formatDate } from '../../../lib/format';
import { useJobPayments } from '../api/get-job-payments';
import { useRefundPayment } from '../api/refund-payment';
import { useStartCheckout } from '../api/start-checkout';
import { useWaivePaymentLock } from '../api/waive-payment-lock';

function RefundDialog({ jobId, payment, onClose }: { jobId: string; payment: JobPayment; onClose: () => void }) {
  const left = payment.amountMinor - payment.refundedMinor;
  const [amount, setAmount] = useState(minorToDecimalString(left, payment.currency));
  const [reason, setReason] = useState('');
  const [fieldError, setFieldError] = useState<string | undefined>();
  const [requestId] = useState(() => crypto.randomUUID());
  const refund = useRefundPayment(jobId);

  const submit = () => {
    let amountMinor: number;
    try {
      amountMinor = parseMoneyInput(amount, payment.currency);
    } catch (error) {
      setFieldError(errorMessage(error));
      return;
    }
    setFieldError(undefined);
    refund.mutate({ paymentId: payment.id, amountMinor, reason, requestId }, { onSuccess: onClose });
  };

  return (
    <Dialog
      open
      title="Refund this payment"
      onClose={onClose}
      footer={
        <>
          <Button variant="secondary" onClick={onClose} disabled={refund.isPending}>
            Cancel
          </Button>
          <Button variant="danger" onClick={submit} pending={refund.isPending}>
            Refund
          </Button>
        </>
      }
    >
      <div className="flex flex-col gap-4">
        <p>
          Up to {formatMoney(left, payment.currency)} can be refunded. The money goes back to the card that paid; the customer gets an
          e-mail.
        </p>
        <Field id="refund-amount" label={`Amount (${payment.currency})`} error={fieldError}>
          {(a11y) => <Input {...a11y} inputMode="decimal" value={amount} onChange={(e) => setAmount(e.target.value)} />}
        </Field>
        <Field id="refund-reason" label="Reason" hint="Shown on the job timeline and in the customer’s e-mail.">
          {(a11y) => <Input {...a11y} value={reason} onChange={(e) => setReason(e.target.value)} maxLength={500} />}
        </Field>
        {refund.isError && (
          <p role="alert" className="text-bad">
            {errorMessage(refund.error)}
          </p>
        )}
      </div>
    </Dialog>
  );
}

function PaymentLine({ payment, canRefund, onRefund }: { payment: JobPayment; canRefund: boolean; onRefund: () => void }) {
  const money = (minor: number) => formatMoney(minor, payment.currency);
  const fullyRefunded = payment.refundedMinor >= payment.amountMinor;
  return (
    <li className="flex flex-col gap-1 border-t border-ink-100 py-3 first:border-t-0 first:pt-0">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <span className="font-medium text-ink-900">
          {money(payment.amountMinor)} · {payment.payerName}
        </span>
        {payment.status === 'paid' ? (
          <Badge tone={fullyRefunded ? 'neutral' : 'ok'}>{fullyRefunded ? 'Refunded' : `Paid ${formatDate(payment.paidAt)}`}</Badge>
        ) : (
          <Badge tone={payment.status === 'open' ? 'warn' : 'neutral'}>{payment.status === 'open' ? 'Checkout started' : 'Checkout expired'}</Badge>
        )}
      </div>
      {payment.refunds.map((r) => (
        <p key={r.id} className="text-sm text-ink-600">
          Refunded {money(r.amountMinor)} on {formatDate(r.createdAt)}: {r.reason}
        </p>
      ))}
      {canRefund && payment.status === 'paid' && !fullyRefunded && (
        <div>
          <Button size="sm" variant="secondary" onClick={onRefund}>
            Refund…
          </Button>
        </div>
      )}
    </li>
  );
}

/** Paid before download as the customer meets it: locked until paid, or waived by the owner; the owner's Waive button. */
function DownloadLockLine({ jobId, lock }: { jobId: string; lock: JobPayments['downloadLock'] }) {
  const waive = useWaivePaymentLock(jobId);
  const [confirming, setConfirming] = useState(false);
  if (lock.reason === 'waived') {
    return (
      <p className="text-ink-700">
        Payment before download waived{lock.waivedBy ? ` by ${lock.waivedBy.name}` : ''}
        {lock.waivedAt ? ` on ${formatDate(lock.waivedAt)}` : ''}: the customer downloads the revisions before paying.
      </p>
    );
  }
  if (!lock.locked && !lock.canWaive) return null;
  return (
    <div className="flex flex-col gap-2">
      {lock.locked && <p className="text-ink-700">Sent revisions stay locked for download until this job is paid.</p>}
      {lock.canWaive && (
        <div>
          <Button size="sm" variant="secondary" onClick={() => setConfirming(true)}>
            Waive payment before download…
          </Button>
        </div>
      )}
      {confirming && (
        <Dialog
          open
          title="Let the customer download before paying?"
          onClose={() => setConfirming(false)}
          footer={
            <>
              <Button variant="secondary" onClick={() => setConfirming(false)} disabled={waive.isPending}>
                Cancel
              </Button>
              <Button onClick={() => waive.mutate(undefined, { onSuccess: () => setConfirming(false) })} pending={waive.isPending}>
                Waive for this job
              </Button>
            </>
          }
        >
          <div className="flex flex-col gap-3">
            <p>The customer can download every revision of this job at once, paid or not. The waiver is recorded on the job’s timeline and cannot be undone.</p>
            {waive.isError && (
              <p role="alert" className="text-bad">
                {errorMessage(waive.error)}
              </p>
            )}
          </div>
        </Dialog>
      )}
    </div>
  );
}

/** The payment side of a job: what the package costs, what was paid or refunded, and the button to pay. */
export function JobPaymentPanel({ jobId, job }: { jobId: string; job?: { state?: string } }) {
  const payments = useJobPayments(jobId);
  const checkout = useStartCheckout();
  const [refunding, setRefunding] = useState<JobPayment | null>(null);

  if (payments.isPending) {
    return (
      <Card title="Payment">
        <Spinner label="Loading payments" />
      </Card>
    );
  }
  if (payments.isError) {
    return (
      <Card title="Payment">
        <Banner tone="bad" title="Payments could not be loaded">
          {errorMessage(payments.error)}
        </Banner>
      </Card>
    );
  }
  const p = payments.data.data;
  const money = (minor: number) => formatMoney(minor, p.currency);
  const settled = p.paidByDealer !== null || p.dueMinor === 0;
  const closed = job?.state === 'cancelled';

  return (
    <Card
      title="Payment"
      actions={settled ? <Badge tone="ok">Paid</Badge> : <Badge tone="warn">{money(p.dueMinor)} due</Badge>}
    >
      <div className="flex flex-col gap-4 text-sm">
        {p.paidByDealer ? (
          <p className="text-ink-700">
            {p.paidByDealer.amountMinor === null
              ? `Paid by ${p.paidByDealer.dealerName}.`
              : `Paid wholesale by ${p.paidByDealer.dealerName} from its balance (${money(p.paidByDealer.amountMinor)}).`}
          </p>
        ) : (
          <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1">
            <dt className="text-ink-600">Package price</dt>
            <dd className="text-ink-900">{money(p.priceMinor)}</dd>
            <dt className="text-ink-600">Paid</dt>
            <dd className="text-ink-900">{money(p.paidMinor)}</dd>
            {p.refundedMinor > 0 && (
              <>
                <dt className="text-ink-600">Refunded</dt>
                <dd className="text-ink-900">{money(p.refundedMinor)}</dd>
              </>
            )}
          </dl>
        )}
        {p.payments.length > 0 && (
          <ul aria-label="Payments">
            {p.payments.map((payment) => (
              <PaymentLine key={payment.id} payment={payment} canRefund={p.canRefund} onRefund={() => setRefunding(payment)} />
            ))}
          </ul>
        )}
        {!p.paidByDealer && <DownloadLockLine jobId={jobId} lock={p.downloadLock} />}
        {p.canPay && !settled && !closed && (
          <div className="flex flex-col gap-2">
            <Button onClick={() => checkout.mutate({ purpose: 'job', jobId })} pending={checkout.isPending || checkout.isSuccess}>
              Pay {money(p.dueMinor)}
            </Button>
            <p className="text-xs text-ink-600">You pay on a secure payment page and come back here; the receipt comes by e-mail.</p>
            {p.downloadLock.locked && <p className="text-xs text-ink-600">Your revisions unlock for download once the payment lands.</p>}
            {checkout.isError && (
              <p role="alert" className="text-bad">
                {errorMessage(checkout.error)}
              </p>
            )}
          </div>
        )}
      </div>
      {refunding && <RefundDialog jobId={jobId} payment={refunding} onClose={() => setRefunding(null)} />}
    </Card>
  );
}
