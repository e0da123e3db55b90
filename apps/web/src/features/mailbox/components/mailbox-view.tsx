import { useMemo, useState } from 'react';
import { Button } from '../../../components/ui/button';
import { ConfirmDialog } from '../../../components/ui/dialog';
import { EmptyState } from '../../../components/ui/empty-state';
import { Banner } from '../../../components/ui/banner';
import { PageSpinner } from '../../../components/ui/spinner';
import { cn } from '../../../lib/cn';
import { formatDateTime } from '../../../lib/format';
import { errorMessage } from '../../../lib/form-errors';
import { useClearMailbox } from '../api/clear-mailbox';
import { useMailbox } from '../api/get-mailbox';
import { MailBody } from './mail-body';

/** Mails the app sent while developing: newest first, one open at a time. */
export function MailboxView() {
  const mailbox = useMailbox({ refetchInterval: 5000 });
  const clear = useClearMailbox();
  const [selectedId, setSelectedId] = useState<string | null>(null);
  const [confirming, setConfirming] = useState(false);
  const mails = useMemo(
    () => [...(mailbox.data?.data ?? [])].sort((a, b) => Date.parse(b.receivedAt) - Date.parse(a.receivedAt)),
    [mailbox.data],
  );
  const selected = mails.find((mail) => mail.id === selectedId) ?? null;

  if (mailbox.isPending) return <PageSpinner label="Loading mails" />;
  if (mailbox.isError) {
    return (
      <Banner tone="bad" title="The mailbox is not available">
        {errorMessage(mailbox.error)} It exists only while the server runs in development.
      </Banner>
    );
  }

  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <p className="text-sm text-ink-600" aria-live="polite">
          {mails.length === 1 ? '1 mail' : `${mails.length} mails`}
        </p>
        <div className="flex gap-2">
          <Button variant="secondary" size="sm" onClick={() => void mailbox.refetch()} pending={mailbox.isFetching && !mailbox.isPending}>
            Refresh
          </Button>
          <Button variant="secondary" size="sm" disabled={mails.length === 0} onClick={() => setConfirming(true)}>
            Clear mailbox
          </Button>
        </div>
      </div>
      {mails.length === 0 ? (
        <EmptyState title="No mails yet">Invitations and password-reset links sent by the app show up here.</EmptyState>
      ) : (
        <div className="grid gap-4 lg:grid-cols-[minmax(0,22rem)_minmax(0,1fr)]">
          <ul aria-label="Received mails" className="flex flex-col gap-1.5">
            {mails.map((mail) => (
              <li key={mail.id}>
                <button
                  type="button"
                  aria-pressed={mail.id === selected?.id}
                  onClick={() => setSelectedId(mail.id)}
                  className={cn(
                    'w-full rounded-lg border px-3 py-2.5 text-left',
                    mail.id === selected?.id ? 'border-accent-600 bg-accent-50' : 'border-ink-200 bg-white hover:bg-ink-50',
                  )}
                >
                  <span className="block truncate text-sm font-medium text-ink-900">{mail.subject || '(no subject)'}</span>
                  <span className="block truncate text-xs text-ink-600">To {mail.to.join(', ')}</span>
                  <span className="block text-xs text-ink-600">{formatDateTime(mail.receivedAt)}</span>
                </button>
              </li>
            ))}
          </ul>
          <article aria-label="Selected mail" className="min-h-40 rounded-lg border border-ink-200 bg-white p-5">
            {selected ? (
              <>
                <h2 className="text-lg font-semibold text-ink-900">{selected.subject || '(no subject)'}</h2>
                <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-3 gap-y-0.5 text-xs text-ink-600">
                  <dt>From</dt>
                  <dd className="break-all">{selected.from}</dd>
                  <dt>To</dt>
                  <dd className="break-all">{selected.to.join(', ')}</dd>
                  <dt>Received</dt>
                  <dd>{formatDateTime(selected.receivedAt)}</dd>
                </dl>
                <hr className="my-4 border-ink-100" />
                <MailBody text={selected.text} />
              </>
            ) : (
              <p className="text-sm text-ink-600">Select a mail to read it.</p>
            )}
          </article>
        </div>
      )}
      <ConfirmDialog
        open={confirming}
        title="Clear the mailbox?"
        confirmLabel="Clear mailbox"
        confirmVariant="danger"
        pending={clear.isPending}
        error={clear.error ? errorMessage(clear.error) : null}
        onCancel={() => setConfirming(false)}
        onConfirm={() =>
          clear.mutate(undefined, {
            onSuccess: () => {
              setConfirming(false);
              setSelectedId(null);
            },
          })
        }
      >
        Every caught mail is deleted. Links in them keep working until they expire.
      </ConfirmDialog>
    </div>
  );
}
