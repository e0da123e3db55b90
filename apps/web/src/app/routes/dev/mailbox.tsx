import { PageHeader } from '../../../components/layout/page-header';
import { MailboxView } from '../../../features/mailbox/components/mailbox-view';

export function MailboxRoute() {
  return (
    <div className="w-full max-w-6xl">
      <PageHeader title="Development mailbox" description="Mails the app sent while running in development. Links open in this browser." />
      <MailboxView />
    </div>
  );
}
